import type { Metadata } from "next";
import { TECHNIQUE_SHORT_LABELS } from "@/lib/registry/techniques";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { listSpectra, type SpectrumPage } from "@/lib/queries/spectra";
import { queryObject } from "@/lib/review/schemas";
import { countText } from "@/lib/search/fastCount";
import { searchChoices } from "@/lib/search/searchChoices";
import { hasFilters, searchQueryString, spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { SaveSearchForm } from "@/components/spectra/SaveSearchForm";
import { SpectrumSearchForm } from "@/components/spectra/SpectrumSearchForm";
import { formatWhen } from "@/lib/format/dates";
import { getDeletionNotice } from "@/lib/queries/deletions";
import { DeletedBanner } from "@/components/stewardship/DeletedBanner";
import { CardTable } from "@/components/ui/CardTable";

export const metadata: Metadata = { title: "Spectra" };

const NOTHING: SpectrumPage = { rows: [], next: null, count: { value: 0, exact: true } };

export default async function SpectraPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requireActor("/spectra");
  const values = queryObject(await searchParams);
  const parsed = spectrumSearchSchema.safeParse(values);
  const error = parsed.success
    ? null
    : {
        field: String(parsed.error.issues[0]?.path[0] ?? "q"),
        message: `${String(parsed.error.issues[0]?.path[0] ?? "search")}: ${parsed.error.issues[0]?.message ?? "not valid"}`,
      };
  const search = parsed.success ? parsed.data : null;
  const deletedId = typeof values.deleted === "string" ? values.deleted : null;
  const [page, choices, deleted] = await Promise.all([
    search ? listSpectra(actor, search).then((p) => p ?? NOTHING) : Promise.resolve(NOTHING),
    searchChoices(actor, search?.sample),
    deletedId ? getDeletionNotice(actor, deletedId) : Promise.resolve(null),
  ]);
  const filtered = search ? hasFilters(search) : true;
  const query = search ? searchQueryString(search) : "";
  return (
    <>
      <PageHeader title="Spectra" subtitle={`${countText(page.count)} ${filtered ? "found" : "stored"}`} />
      {deleted && <DeletedBanner notice={deleted} />}
      <SpectrumSearchForm values={values} choices={choices} error={error} />
      {search && filtered && <SaveSearchForm query={query} />}
      {page.rows.length === 0 ? (
        <EmptyState
          title={filtered ? "No spectrum matches" : "No spectra yet"}
          action={filtered ? undefined : { href: "/upload", label: "Upload exports" }}
        >
          {filtered ? "Loosen the search." : "Upload UV-Vis-NIR absorption, PL or mid-IR exports (CSV, text or JCAMP-DX)."}
        </EmptyState>
      ) : (
        <CardTable
          headers={[
            "File",
            "Technique",
            "Sample",
            "Project",
            { label: "1st exciton", right: true },
            { label: "Size", right: true },
            "State",
            "Stored",
          ]}
        >
          {page.rows.map((s) => (
            <tr key={s.id} className="border-t border-stone-100 hover:bg-stone-50">
              <td className="max-w-xs truncate px-3 py-2">
                <Link prefetch={false} className="font-medium text-glow-deep hover:underline" href={`/spectra/${s.id}`}>
                  {s.fileName}
                </Link>
                {s.errorMessage && (
                  <div className="truncate text-xs text-red-700" title={s.errorMessage}>
                    {s.errorMessage}
                  </div>
                )}
              </td>
              <td className="px-3 py-2">{TECHNIQUE_SHORT_LABELS[s.technique]}</td>
              <td className="px-3 py-2">{s.sampleName ?? "—"}</td>
              <td className="px-3 py-2 text-ink-soft">{s.projectName}</td>
              <td className="tabular px-3 py-2 text-right">{s.firstExcitonNm === null ? "—" : `${s.firstExcitonNm.toFixed(0)} nm`}</td>
              <td className="tabular px-3 py-2 text-right">{s.diameterNm === null ? "—" : `${s.diameterNm.toFixed(1)} nm`}</td>
              <td className="px-3 py-2">
                <StatusBadge status={s.status} />
              </td>
              <td className="tabular px-3 py-2 text-ink-soft">{formatWhen(s.createdAt)}</td>
            </tr>
          ))}
        </CardTable>
      )}
      {search && (search.after || page.next) && (
        <nav aria-label="Pages" className="mt-3 flex items-center gap-4 text-sm">
          {search.after && (
            <Link href={`/spectra${query ? `?${query}` : ""}`} className="text-glow-deep hover:underline">
              ← Newest
            </Link>
          )}
          {page.next && (
            <Link
              prefetch={false}
              href={`/spectra?${search ? searchQueryString(search, { after: page.next }) : ""}`}
              className="text-glow-deep hover:underline"
            >
              Older →
            </Link>
          )}
        </nav>
      )}
    </>
  );
}
