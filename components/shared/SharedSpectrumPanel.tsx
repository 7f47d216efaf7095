"use client";

import { useMemo, useState } from "react";
import useSWR from "swr";
import { SpectrumChart } from "@/components/spectrum/SpectrumChart";
import type { Marker } from "@/components/spectrum/types";
import { formatFlagMagnitude } from "@/lib/format/quantity";
import { FLAG_COLOURS, kindLabel } from "@/lib/registry/flagKinds";
import { BAND_ROLE_LABELS, TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { AXIS_LABELS, DISPLAY_AXES, energyToAxis, type DisplayAxis } from "@/lib/spectrum-view/axis";
import { decodeColumns } from "@/lib/spectrum-view/columnsFormat";
import { payloadFromColumns, type SpectrumDataPayload } from "@/lib/spectrum-view/payload";
import type { SharedSpectrumView } from "@/lib/stewardship/sharedSpectra";

async function fetchCurves(url: string): Promise<SpectrumDataPayload> {
  const res = await fetch(url);
  if (!res.ok) {
    const body = await res.json().catch(() => null);
    throw new Error(body?.error?.message ?? `the curves could not be loaded (${res.status})`);
  }
  return payloadFromColumns(decodeColumns(await res.arrayBuffer()));
}

const fixed = (v: number | null, digits: number) => (v === null || !Number.isFinite(v) ? "—" : v.toFixed(digits));
const position = (energyEv: number | null, axis: DisplayAxis) => {
  if (energyEv === null || !(energyEv > 0)) return "—";
  const v = energyToAxis(energyEv, axis);
  return axis === "ev" ? `${v.toFixed(3)} eV` : axis === "nm" ? `${v.toFixed(1)} nm` : `${v.toFixed(0)} cm⁻¹`;
};

/**
 * One shared spectrum, read-only: the signed-in viewer's chart component with the fitted peaks and
 * the flagged changes as markers, their tables (numbers only: no review state), and the processed
 * downloads, all through the share link's own routes.
 */
export function SharedSpectrumPanel({ token, view }: { token: string; view: SharedSpectrumView }) {
  const spec = TECHNIQUE_SPECS[view.technique];
  const [axis, setAxis] = useState<DisplayAxis>(spec.defaultAxis);
  const [active, setActive] = useState<string | null>(null);
  const base = `/shared/${encodeURIComponent(token)}/curves/${view.id}`;
  const { data, error, isLoading } = useSWR(view.runId ? `${base}?format=binary&axis=${axis}` : null, fetchCurves, {
    revalidateOnFocus: false,
    shouldRetryOnError: false,
  });
  const bandWord = BAND_ROLE_LABELS[spec.bandRole];
  const markers = useMemo<Marker[]>(
    () => [
      ...view.flags
        .filter((f) => f.energyEv !== null && f.energyEv > 0)
        .map((f) => ({
          id: f.id,
          group: "flag" as const,
          kind: f.kind,
          energyEv: f.energyEv!,
          label: `${kindLabel(f.kind, view.technique)} at ${position(f.energyEv, axis)}, ${formatFlagMagnitude(f)}`,
        })),
      ...view.peaks.map((p) => ({
        id: p.id,
        group: "peak" as const,
        kind: p.isFirstExciton ? ("first-exciton" as const) : ("peak" as const),
        energyEv: p.energyEv,
        label: `${p.isFirstExciton ? "First exciton" : bandWord} at ${position(p.energyEv, axis)}`,
      })),
    ],
    [view, axis, bandWord],
  );

  return (
    <div className="space-y-4" data-testid="shared-spectrum">
      <section className="rounded-lg border border-stone-200 bg-white p-4" aria-label={`Chart of ${view.fileName}`}>
        <div className="mb-3 flex flex-wrap items-center gap-3">
          <h2 className="min-w-0 truncate text-base font-semibold" title={view.fileName}>
            {view.fileName}
          </h2>
          <div role="group" aria-label="Axis" className="inline-flex overflow-hidden rounded-md border border-stone-300 text-sm">
            {DISPLAY_AXES.map((a) => (
              <button
                key={a}
                type="button"
                aria-pressed={axis === a}
                onClick={() => setAxis(a)}
                className={`px-3 py-1 ${axis === a ? "bg-dusk text-white" : "bg-white hover:bg-stone-50"}`}
              >
                {AXIS_LABELS[a].short}
              </button>
            ))}
          </div>
          <nav aria-label="Downloads" className="ml-auto flex flex-wrap gap-2 text-sm">
            <a
              className="rounded-md border border-stone-300 bg-white px-3 py-1 hover:bg-stone-50"
              href={`/shared/${encodeURIComponent(token)}/raw/${view.id}`}
              rel="noreferrer"
              download
            >
              Raw file
            </a>
            {view.runId && (
              <a
                className="rounded-md border border-stone-300 bg-white px-3 py-1 hover:bg-stone-50"
                href={`${base}?format=csv&axis=${axis}`}
                rel="noreferrer"
                download
                data-testid="shared-csv"
              >
                Processed curves, CSV ({AXIS_LABELS[axis].short})
              </a>
            )}
            {view.runId && (
              <a
                className="rounded-md border border-stone-300 bg-white px-3 py-1 hover:bg-stone-50"
                href={`${base}?format=jcamp&axis=${axis}&series=smoothed`}
                rel="noreferrer"
                download
                data-testid="shared-jcamp"
              >
                Smoothed curve, JCAMP-DX ({AXIS_LABELS[axis].short})
              </a>
            )}
          </nav>
        </div>
        {!view.runId ? (
          <p className="rounded-md bg-stone-50 px-4 py-10 text-center text-sm text-ink-soft">
            {view.status === "failed"
              ? "This file could not be read, so there is nothing to plot."
              : "This spectrum has not been analysed yet."}
          </p>
        ) : error ? (
          <p role="alert" className="rounded-md bg-red-50 px-4 py-10 text-center text-sm text-red-800">
            {error.message}
          </p>
        ) : isLoading || !data ? (
          <div className="h-[380px] animate-pulse rounded bg-stone-100" aria-label="Loading the curves" />
        ) : (
          <SpectrumChart
            data={data}
            axis={axis}
            descending={axis === spec.defaultAxis && spec.defaultDirection === "descending"}
            markers={markers}
            active={active}
            onHover={setActive}
            onPick={(id) => setActive((a) => (a === id ? null : id))}
          />
        )}
      </section>

      <div className="grid gap-4 lg:grid-cols-2">
        <section className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <h3 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold">Flagged changes against the parent</h3>
          {view.flags.length === 0 ? (
            <p className="px-4 py-3 text-sm text-ink-soft">
              {view.runId
                ? view.hasReference
                  ? "Nothing differs from the parent beyond the noise."
                  : "No parent reference was set, so nothing was compared."
                : "No finished analysis."}
            </p>
          ) : (
            <table className="w-full text-sm" data-testid="shared-flags">
              <thead className="text-left text-xs text-ink-soft">
                <tr>
                  <th className="px-4 py-2">Change</th>
                  <th className="px-4 py-2">Position</th>
                  <th className="px-4 py-2">Magnitude</th>
                  <th className="px-4 py-2">Significance</th>
                </tr>
              </thead>
              <tbody className="tabular">
                {view.flags.map((f) => (
                  <tr
                    key={f.id}
                    className={`border-t border-stone-100 ${active === f.id ? "bg-glow-soft" : ""}`}
                    onMouseEnter={() => setActive(f.id)}
                    onMouseLeave={() => setActive(null)}
                  >
                    <td className="px-4 py-1.5 font-medium">
                      <span
                        className="mr-1.5 inline-block h-2.5 w-2.5 rounded-sm align-middle"
                        style={{ background: FLAG_COLOURS[f.kind] }}
                        aria-hidden
                      />
                      {kindLabel(f.kind, view.technique)}
                    </td>
                    <td className="px-4 py-1.5">{position(f.energyEv, axis)}</td>
                    <td className="px-4 py-1.5">{formatFlagMagnitude(f, { withUncertainty: true })}</td>
                    <td className="px-4 py-1.5">{fixed(f.significance, 1)}σ</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        <section className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <h3 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold">Fitted peaks ({bandWord.toLowerCase()}s)</h3>
          {view.peaks.length === 0 ? (
            <p className="px-4 py-3 text-sm text-ink-soft">No peaks found.</p>
          ) : (
            <table className="w-full text-sm" data-testid="shared-peaks">
              <thead className="text-left text-xs text-ink-soft">
                <tr>
                  <th className="px-4 py-2">Position</th>
                  <th className="px-4 py-2">Energy</th>
                  <th className="px-4 py-2">FWHM</th>
                  <th className="px-4 py-2"></th>
                </tr>
              </thead>
              <tbody className="tabular">
                {view.peaks.map((p) => (
                  <tr
                    key={p.id}
                    className={`border-t border-stone-100 ${active === p.id ? "bg-glow-soft" : ""}`}
                    onMouseEnter={() => setActive(p.id)}
                    onMouseLeave={() => setActive(null)}
                  >
                    <td className="px-4 py-1.5">{position(p.energyEv, axis === "ev" ? spec.defaultAxis : axis)}</td>
                    <td className="px-4 py-1.5">{fixed(p.energyEv, 3)} eV</td>
                    <td className="px-4 py-1.5">{p.fwhmMeV === null ? "—" : `${p.fwhmMeV.toFixed(0)} meV`}</td>
                    <td className="px-4 py-1.5 text-xs text-glow-deep">{p.isFirstExciton ? "first exciton" : ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
      </div>
    </div>
  );
}
