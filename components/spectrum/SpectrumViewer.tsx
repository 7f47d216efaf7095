"use client";

import { useCallback, useMemo, useState } from "react";
import useSWR from "swr";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { countOf, formatFlagMagnitude, formatQuantity } from "@/lib/format/quantity";
import { FLAG_COLOURS, kindLabel } from "@/lib/registry/flagKinds";
import { BAND_ROLE_LABELS, BAND_ROLE_PLURALS, TECHNIQUE_SPECS, type Technique, type TechniqueSpec } from "@/lib/registry/techniques";
import { CM1_PER_EV } from "@/lib/engine/constants";
import { AXIS_LABELS, DISPLAY_AXES, formatPosition, type DisplayAxis } from "@/lib/spectrum-view/axis";
import { decodeColumns } from "@/lib/spectrum-view/columnsFormat";
import { payloadFromColumns, type SpectrumDataPayload } from "@/lib/spectrum-view/payload";
import { SpectrumChart } from "./SpectrumChart";
import type { FlagRow, Marker, PeakRow } from "./types";

/** Reads the curves in the binary columns format (about half the bytes of JSON, nothing to parse). */
async function fetchData(url: string): Promise<SpectrumDataPayload> {
  const res = await fetch(url);
  if (!res.ok) {
    const body = await res.json().catch(() => null);
    throw new Error(body?.error?.message ?? `the curves could not be loaded (${res.status})`);
  }
  return payloadFromColumns(decodeColumns(await res.arrayBuffer()));
}

const num = (v: number | null | undefined, digits: number) =>
  v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(digits);
/** A band's height to 4 significant digits: absorbance 0.1732, emission counts 3,126,000. */
const heightText = (v: number | null) =>
  v === null || !Number.isFinite(v) ? "—" : Number(v.toPrecision(4)).toLocaleString("en-GB", { maximumSignificantDigits: 4 });
const bare = (text: string) => text.replace(/ (eV|nm|meV|cm⁻¹)$/, "");

const magnitude = (f: FlagRow): string => formatFlagMagnitude(f);
const position = formatPosition;

/** A width in meV written in the unit its technique lists bands in: cm⁻¹ for mid-IR, meV otherwise. */
const widthText = (meV: number | null, spec: TechniqueSpec) =>
  meV === null || !Number.isFinite(meV)
    ? "—"
    : spec.defaultAxis === "cm-1"
      ? bare(formatQuantity((meV / 1000) * CM1_PER_EV, "cm-1"))
      : bare(formatQuantity(meV, "meV"));

const capitalise = (t: string) => t.charAt(0).toUpperCase() + t.slice(1);

/** Direction of the x axis kept in the URL (?dir=), the technique's default otherwise. */
export type AxisDirection = "ascending" | "descending";

/**
 * The chart with its axis switch and downloads, and the tables of flags and peaks, linked both
 * ways: hovering or clicking a row lights its marker, hovering or clicking a marker lights its row.
 */
export function SpectrumViewer({
  spectrumId,
  technique,
  runId,
  initialAxis,
  initialDirection,
  peaks,
  flags,
  hasReference,
  analysisNote,
}: {
  spectrumId: string;
  technique: Technique;
  initialDirection: AxisDirection;
  runId: string | null;
  initialAxis: DisplayAxis;
  peaks: PeakRow[];
  flags: FlagRow[];
  hasReference: boolean;
  /** Shown instead of the chart when there is no finished analysis. */
  analysisNote: string | null;
}) {
  const [axis, setAxisState] = useState<DisplayAxis>(initialAxis);
  const [direction, setDirectionState] = useState<AxisDirection>(initialDirection);
  const spec: TechniqueSpec = TECHNIQUE_SPECS[technique];
  const wavenumberList = spec.defaultAxis === "cm-1";
  const intraband = flags.filter((f) => f.bandRole === "intraband-candidate" && f.energyEv !== null);
  const [hover, setHover] = useState<string | null>(null);
  const [pinned, setPinned] = useState<string | null>(null);
  const active = hover ?? pinned;
  // Review state is the owning group's business: collaborators get null and no column.
  const showReview = flags.some((f) => f.reviewState !== null);
  const key = runId ? `/api/v1/spectra/${spectrumId}/data?axis=${axis}&run=${runId}&format=binary` : null;
  const { data, error, isLoading } = useSWR(key, fetchData, { revalidateOnFocus: false, shouldRetryOnError: false });

  const setParam = (name: string, value: string) => {
    const url = new URL(window.location.href);
    url.searchParams.set(name, value);
    window.history.replaceState(null, "", url);
  };
  const setAxis = (a: DisplayAxis) => {
    setAxisState(a);
    setParam("axis", a);
  };
  const flipDirection = () => {
    const next: AxisDirection = direction === "descending" ? "ascending" : "descending";
    setDirectionState(next);
    setParam("dir", next === "descending" ? "desc" : "asc");
  };

  const markers = useMemo<Marker[]>(
    () => [
      ...flags
        .filter((f) => f.energyEv !== null && f.energyEv > 0)
        .map((f) => ({
          id: f.id,
          group: "flag" as const,
          kind: f.kind,
          energyEv: f.energyEv!,
          label: `${kindLabel(f.kind, technique)} at ${position(f.energyEv, axis)}, ${magnitude(f)}, ${num(f.significance, 1)}σ`,
        })),
      ...peaks.map((p) => ({
        id: p.id,
        group: "peak" as const,
        kind: p.isFirstExciton ? ("first-exciton" as const) : ("peak" as const),
        energyEv: p.energyEv,
        label: `${p.isFirstExciton ? capitalise(spec.firstBandLabel) : BAND_ROLE_LABELS[p.bandRole]} at ${position(p.energyEv, axis)}`,
      })),
    ],
    [flags, peaks, axis, spec],
  );

  const pick = useCallback((id: string) => {
    setPinned((p) => (p === id ? null : id));
    document.querySelector(`[data-row-id="${id}"]`)?.scrollIntoView({ block: "nearest", behavior: "smooth" });
  }, []);

  const rowClass = (id: string) => `cursor-pointer border-t border-stone-100 ${active === id ? "bg-glow-soft" : "hover:bg-stone-50"}`;
  const exportHref = (q: string) => `/api/v1/spectra/${spectrumId}/export?${q}${runId ? `&run=${runId}` : ""}`;

  return (
    <div className="space-y-4">
      <section className="rounded-lg border border-stone-200 bg-white p-4" aria-label="Spectrum chart">
        <div className="mb-3 flex flex-wrap items-center gap-3">
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
          <button
            type="button"
            onClick={flipDirection}
            aria-pressed={direction === "descending"}
            title="Which way the horizontal axis runs"
            className="rounded-md border border-stone-300 bg-white px-3 py-1 text-sm hover:bg-stone-50"
            data-testid="axis-direction"
          >
            {direction === "descending" ? "High → low" : "Low → high"}
          </button>
          {data?.emission && axis !== "nm" && (
            <span className="text-xs text-ink-soft" title="I(E) = I(λ)·λ²/hc (Mooney & Kambhampati 2013)">
              emission converted per {AXIS_LABELS[axis].unit} (Jacobian)
            </span>
          )}
          {runId && (
            <details className="relative ml-auto text-sm">
              <summary className="cursor-pointer list-none rounded-md border border-stone-300 bg-white px-3 py-1 hover:bg-stone-50">
                Downloads ▾
              </summary>
              <ul className="absolute right-0 z-20 mt-1 w-72 rounded-md border border-stone-200 bg-white py-1 shadow-lg">
                <li>
                  <a className="block px-3 py-1.5 hover:bg-stone-50" href={`/api/v1/spectra/${spectrumId}/raw`}>
                    Raw file, as uploaded
                  </a>
                </li>
                <li>
                  <a className="block px-3 py-1.5 hover:bg-stone-50" href={exportHref(`format=csv&axis=${axis}`)}>
                    Processed curves, CSV ({AXIS_LABELS[axis].short})
                  </a>
                </li>
                <li>
                  <a className="block px-3 py-1.5 hover:bg-stone-50" href={exportHref(`format=jcamp&axis=${axis}&series=smoothed`)}>
                    Smoothed curve, JCAMP-DX ({AXIS_LABELS[axis].short})
                  </a>
                </li>
                {hasReference && (
                  <li>
                    <a className="block px-3 py-1.5 hover:bg-stone-50" href={exportHref(`format=jcamp&axis=${axis}&series=difference`)}>
                      Difference, JCAMP-DX ({AXIS_LABELS[axis].short})
                    </a>
                  </li>
                )}
                <li>
                  <a className="block px-3 py-1.5 hover:bg-stone-50" href={exportHref("format=json")}>
                    Analysis report, JSON
                  </a>
                </li>
              </ul>
            </details>
          )}
        </div>
        {analysisNote ? (
          <p className="rounded-md bg-stone-50 px-4 py-10 text-center text-sm text-ink-soft" data-testid="chart-empty">
            {analysisNote}
          </p>
        ) : error ? (
          <p role="alert" className="rounded-md bg-red-50 px-4 py-10 text-center text-sm text-red-800">
            {error.message}
          </p>
        ) : isLoading || !data ? (
          <div className="animate-pulse space-y-2" data-testid="chart-skeleton" aria-label="Loading the curves">
            <div className="h-4 w-1/3 rounded bg-stone-200" />
            <div className="h-[380px] rounded bg-stone-100" />
          </div>
        ) : (
          <>
            <SpectrumChart
              data={data}
              axis={axis}
              descending={direction === "descending"}
              markers={markers}
              active={active}
              onHover={setHover}
              onPick={pick}
            />
            {!hasReference && (
              <p className="mt-2 text-xs text-ink-soft">No parent reference was set, so there is no reference curve or difference.</p>
            )}
            <p className="mt-1 text-xs text-ink-faint">
              {countOf(data.points, "point")} on the analysis grid; the difference is smoothed sample − smoothed reference.
            </p>
          </>
        )}
      </section>

      <section className="rounded-lg border border-stone-200 bg-white">
        <h2 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold text-ink-soft">Flagged changes against the parent</h2>
        {flags.length === 0 ? (
          <p className="px-4 py-3 text-sm text-ink-soft">
            {runId
              ? hasReference
                ? "Nothing differs from the parent beyond the noise."
                : "No parent reference was set, so nothing was compared."
              : "The analysis has not finished."}
          </p>
        ) : (
          <table className="w-full text-sm" data-testid="flags-table">
            <thead className="text-left text-xs text-ink-soft">
              <tr>
                <th className="px-4 py-2">Change</th>
                <th className="px-4 py-2">Position</th>
                <th className="px-4 py-2">Magnitude</th>
                <th className="px-4 py-2">Significance</th>
                {showReview && <th className="px-4 py-2">Review</th>}
              </tr>
            </thead>
            <tbody className="tabular">
              {flags.map((f) => (
                <tr
                  key={f.id}
                  data-row-id={f.id}
                  className={rowClass(f.id)}
                  aria-selected={active === f.id}
                  onMouseEnter={() => setHover(f.id)}
                  onMouseLeave={() => setHover(null)}
                  onClick={() => setPinned((p) => (p === f.id ? null : f.id))}
                  title={f.message ?? undefined}
                >
                  <td className="px-4 py-1.5 font-medium">
                    <span
                      className="mr-1.5 inline-block h-2.5 w-2.5 rounded-sm align-middle"
                      style={{ background: FLAG_COLOURS[f.kind] }}
                      aria-hidden
                    />
                    {kindLabel(f.kind, technique)}
                    {f.intraband ? " (intraband)" : ""}
                  </td>
                  <td className="px-4 py-1.5">{position(f.energyEv, axis)}</td>
                  <td className="px-4 py-1.5">{formatFlagMagnitude(f, { withUncertainty: true })}</td>
                  <td className="px-4 py-1.5">{num(f.significance, 1)}σ</td>
                  {showReview && <td className="px-4 py-1.5">{f.reviewState && <StatusBadge status={f.reviewState} />}</td>}
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className="rounded-lg border border-stone-200 bg-white" data-testid="bands-section">
        <h2 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold text-ink-soft">{BAND_ROLE_PLURALS[spec.bandRole]}</h2>
        {peaks.length === 0 ? (
          <p className="px-4 py-3 text-sm text-ink-soft">
            No {BAND_ROLE_PLURALS[spec.bandRole].toLowerCase()} found{runId ? "" : " yet"}.
          </p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="peaks-table">
              <thead className="text-left text-xs text-ink-soft">
                {wavenumberList ? (
                  <tr>
                    <th className="px-4 py-2">Wavenumber (cm⁻¹)</th>
                    <th className="px-4 py-2">Height</th>
                    <th className="px-4 py-2">FWHM (cm⁻¹)</th>
                    <th className="px-4 py-2"></th>
                  </tr>
                ) : (
                  <tr>
                    <th className="px-4 py-2">Energy (eV)</th>
                    <th className="px-4 py-2">Wavelength (nm)</th>
                    <th className="px-4 py-2">Height</th>
                    <th className="px-4 py-2">FWHM (meV)</th>
                    <th className="px-4 py-2"></th>
                  </tr>
                )}
              </thead>
              <tbody className="tabular">
                {peaks.map((p) => (
                  <tr
                    key={p.id}
                    data-row-id={p.id}
                    className={rowClass(p.id)}
                    aria-selected={active === p.id}
                    onMouseEnter={() => setHover(p.id)}
                    onMouseLeave={() => setHover(null)}
                    onClick={() => setPinned((q) => (q === p.id ? null : p.id))}
                  >
                    {wavenumberList ? (
                      <td className="px-4 py-1.5">{bare(position(p.energyEv, "cm-1"))}</td>
                    ) : (
                      <>
                        <td className="px-4 py-1.5">{bare(position(p.energyEv, "ev"))}</td>
                        <td className="px-4 py-1.5">{bare(position(p.energyEv, "nm"))}</td>
                      </>
                    )}
                    <td className="px-4 py-1.5">{heightText(p.height)}</td>
                    <td className="px-4 py-1.5">{widthText(p.fwhmMeV, spec)}</td>
                    <td className="px-4 py-1.5 text-xs text-glow-deep">{p.isFirstExciton ? spec.firstBandLabel : ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>

      {wavenumberList && (
        <section className="rounded-lg border border-stone-200 bg-white" data-testid="intraband-section">
          <h2 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold text-ink-soft">
            {BAND_ROLE_PLURALS["intraband-candidate"]}
          </h2>
          {intraband.length === 0 ? (
            <p className="px-4 py-3 text-sm text-ink-soft">
              {hasReference
                ? "No broad new band in the mid-IR that could be an intraband transition."
                : "Found by comparison with a parent reference; none was set."}
            </p>
          ) : (
            <div className="overflow-x-auto">
              <table className="w-full text-sm" data-testid="intraband-table">
                <thead className="text-left text-xs text-ink-soft">
                  <tr>
                    <th className="px-4 py-2">Wavenumber (cm⁻¹)</th>
                    <th className="px-4 py-2">Energy (eV)</th>
                    <th className="px-4 py-2">FWHM (cm⁻¹)</th>
                    <th className="px-4 py-2">Height</th>
                  </tr>
                </thead>
                <tbody className="tabular">
                  {intraband.map((f) => (
                    <tr
                      key={f.id}
                      className={rowClass(f.id)}
                      onMouseEnter={() => setHover(f.id)}
                      onMouseLeave={() => setHover(null)}
                      onClick={() => setPinned((q) => (q === f.id ? null : f.id))}
                    >
                      <td className="px-4 py-1.5">{bare(position(f.energyEv, "cm-1"))}</td>
                      <td className="px-4 py-1.5">{bare(position(f.energyEv, "ev"))}</td>
                      <td className="px-4 py-1.5">{widthText(f.widthMeV, spec)}</td>
                      <td className="px-4 py-1.5">{magnitude(f)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      )}
    </div>
  );
}
