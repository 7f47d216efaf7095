import type { Metadata } from "next";
import Link from "next/link";
import { Fragment } from "react";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getSample } from "@/lib/queries/samples";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { formatDay } from "@/lib/format/dates";
import { isUuid } from "@/lib/ids";

export const metadata: Metadata = { title: "Sample" };

function sourcesOf(spectra: { derived: { sizingSource: string | null } | null }[]): string {
  const sources = [...new Set(spectra.map((s) => s.derived?.sizingSource).filter((v): v is string => Boolean(v)))];
  return sources.length ? ` (${sources.join("; ")})` : "";
}

export default async function SamplePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requireActor(`/samples/${id}`);
  const sample = isUuid(id) ? await getSample(actor, id) : null;
  if (!sample) notFound();
  const facts: [string, string][] = [
    ["Material", sample.material],
    ["Core/shell", sample.coreShell || "—"],
    ["Ligand", sample.ligand || "—"],
    ["Solvent", sample.solvent || "—"],
    ["Group", sample.groupName],
    ["Project", sample.projectName ?? "—"],
  ];
  return (
    <>
      <PageHeader title={sample.name} subtitle={`Registered ${formatDay(sample.createdAt)}`} />
      <div className="mb-6">
        <HazardNotice flags={sample.hazards} />
      </div>
      <div className="grid gap-6 lg:grid-cols-2">
        <section className="rounded-lg border border-stone-200 bg-white p-4">
          <h2 className="mb-2 text-sm font-semibold text-ink-soft">Batch</h2>
          <dl className="grid grid-cols-[8rem_1fr] gap-y-1 text-sm">
            {facts.map(([k, v]) => (
              <Fragment key={k}>
                <dt className="text-ink-soft">{k}</dt>
                <dd>{v}</dd>
              </Fragment>
            ))}
          </dl>
          {sample.notes && <p className="mt-3 whitespace-pre-wrap text-sm">{sample.notes}</p>}
        </section>
        <section className="rounded-lg border border-stone-200 bg-white p-4">
          <h2 className="mb-2 text-sm font-semibold text-ink-soft">Lineage</h2>
          <p className="text-sm text-ink-soft">Made from</p>
          <ul className="mb-3 text-sm">
            {sample.parents.length ? (
              sample.parents.map((p) => (
                <li key={p.id}>
                  <Link prefetch={false} className="text-glow-deep hover:underline" href={`/samples/${p.id}`}>
                    {p.name}
                  </Link>
                </li>
              ))
            ) : (
              <li>— (an as-made batch)</li>
            )}
          </ul>
          <p className="text-sm text-ink-soft">Used in</p>
          <ul className="text-sm">
            {sample.children.length ? (
              sample.children.map((c) => (
                <li key={c.id}>
                  <Link prefetch={false} className="text-glow-deep hover:underline" href={`/samples/${c.id}`}>
                    {c.name}
                  </Link>
                </li>
              ))
            ) : (
              <li>—</li>
            )}
          </ul>
        </section>
      </div>
      <section className="mt-6 rounded-lg border border-stone-200 bg-white p-4">
        <h2 className="mb-2 text-sm font-semibold text-ink-soft">Spectra and derived size</h2>
        {sample.spectra.length === 0 ? (
          <p className="text-sm text-ink-soft">
            No spectra yet.{" "}
            <Link className="text-glow-deep hover:underline" href="/upload">
              Upload exports
            </Link>{" "}
            and choose this sample.
          </p>
        ) : (
          <>
            <table className="w-full text-sm" data-testid="sample-spectra">
              <thead className="text-left text-xs text-ink-soft">
                <tr>
                  <th className="py-1.5 pr-3">Spectrum</th>
                  <th className="pr-3">Technique</th>
                  <th className="pr-3">Diameter</th>
                  <th className="pr-3">Concentration</th>
                  <th className="pr-3">ε</th>
                  <th>State</th>
                </tr>
              </thead>
              <tbody className="tabular">
                {sample.spectra.map((s) => (
                  <tr key={s.id} className="border-t border-stone-100">
                    <td className="max-w-xs truncate py-1.5 pr-3">
                      <Link prefetch={false} className="text-glow-deep hover:underline" href={`/spectra/${s.id}`}>
                        {s.fileName}
                      </Link>
                    </td>
                    <td className="pr-3 text-ink-soft">{s.technique}</td>
                    <td className="pr-3">{s.derived?.diameterNm != null ? `${s.derived.diameterNm.toFixed(2)} nm` : "—"}</td>
                    <td className="pr-3">
                      {s.derived?.concentrationMolPerL != null ? `${(s.derived.concentrationMolPerL * 1e6).toFixed(3)} µM` : "—"}
                    </td>
                    <td className="pr-3">
                      {s.derived?.extinctionPerMPerCm != null ? `${s.derived.extinctionPerMPerCm.toExponential(2)} M⁻¹cm⁻¹` : "—"}
                    </td>
                    <td>
                      <StatusBadge status={s.status} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="mt-2 text-xs text-ink-soft">
              From each spectrum&apos;s latest analysis: diameter from the first exciton by the material&apos;s sizing curve
              {sourcesOf(sample.spectra)}, concentration by Beer–Lambert (absorption with a path length only). Stated uncertainties of such
              curves: size ±5–10 %, ε ±10–15 %. A PL peak lies below the absorption edge, so sizes from PL spectra read large.
            </p>
          </>
        )}
      </section>
    </>
  );
}
