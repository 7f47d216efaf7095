"use client";

import Link from "next/link";
import { useState } from "react";
import { depletionComposition, type DepletionComposition } from "@/lib/fits/depletionComposition";
import { dotExtinction, type DotExtinction } from "@/lib/fits/dotExtinction";
import type { DepletionSetupView } from "@/lib/queries/series-depletion";
import {
  formatTypedRows,
  overlapFromPure,
  parseTypedRows,
  rowsFromReadings,
  type AddedFrom,
  type RowsOutcome,
} from "@/lib/series/depletionRows";
import { CompositionTable } from "./depletion/CompositionTable";
import { DotFields, type DotState } from "./depletion/DotFields";
import { ReadingsTable } from "./depletion/ReadingsTable";
import { SupernatantLinks } from "./depletion/SupernatantLinks";
import { useSupernatantReadings } from "./depletion/useSupernatantReadings";

const input = "rounded-md border border-stone-300 px-2 py-1 text-sm aria-[invalid=true]:border-red-500";

type Props = {
  seriesId: string;
  projectName: string;
  variableName: string;
  variableUnit: string;
  mayWrite: boolean;
  setup: DepletionSetupView;
};

function initialDot(setup: DepletionSetupView, pure: string | null, fallback: DotState["material"]): DotState {
  const c = setup.pureCandidates.find((p) => p.spectrumId === pure);
  return { material: c?.material ?? fallback, nm: c?.firstExcitonNm ? c.firstExcitonNm.toFixed(1) : "", pure: c ? c.spectrumId : "" };
}

function extinctionOf(dot: DotState, label: "A" | "X"): { value: DotExtinction | null; error: string | null; missing: boolean } {
  const nm = Number(dot.nm);
  if (dot.nm.trim() === "") return { value: null, error: null, missing: true };
  if (!(nm >= 200 && nm <= 3000))
    return { value: null, error: `Dot ${label}, first exciton: give a wavelength between 200 and 3000 nm.`, missing: false };
  try {
    return { value: dotExtinction(dot.material, nm), error: null, missing: false };
  } catch (error) {
    return { value: null, error: `Dot ${label}: ${error instanceof Error ? error.message : String(error)}.`, missing: false };
  }
}

const nm1 = (v: number) => `${Number(v.toFixed(1))} nm`;

/**
 * Supernatant depletion on the series page of a titration: what is bound of each dot at each
 * point (added − left, left by Beer–Lambert with each dot's size-dependent ε) and whether the
 * bound ratio stays constant. Supernatant absorbances come from the spectra linked to the points
 * (measured values, read on the server) or are typed in; spectra of the pure dots, when chosen,
 * take each dot's share out of the other's wavelength.
 */
export function DepletionPanel({ seriesId, projectName, variableName, variableUnit, mayWrite, setup }: Props) {
  const linkedCount = setup.links.filter((l) => l.supernatant).length;
  const [a, setA] = useState<DotState>(() => initialDot(setup, setup.defaults.pureA, "CdSe"));
  const [x, setX] = useState<DotState>(() => initialDot(setup, setup.defaults.pureX, "PbS"));
  const [path, setPath] = useState("1");
  const [source, setSource] = useState<"linked" | "typed">("linked");
  const [addedFrom, setAddedFrom] = useState<AddedFrom>(/^(µ|u)M$/i.test(variableUnit.trim()) ? "added-x" : "feed-ratio");
  const [addedA, setAddedA] = useState("");
  const [typed, setTyped] = useState("");

  const eA = extinctionOf(a, "A");
  const eX = extinctionOf(x, "X");
  const wantsReadings = linkedCount > 0 || Boolean(a.pure) || Boolean(x.pure);
  const readings = useSupernatantReadings(
    seriesId,
    wantsReadings ? (eA.value?.readingNm ?? null) : null,
    wantsReadings ? (eX.value?.readingNm ?? null) : null,
    a.pure,
    x.pure,
    setup.links.map((l) => l.supernatant?.spectrumId ?? "").join(","),
  );
  const data = readings.current ? readings.data : undefined;

  const overlapPending = Boolean(a.pure || x.pure) && !data && !readings.error;
  const computed = (() => {
    const errors: string[] = [];
    const notes: string[] = [];
    const prompts: string[] = [];
    if (eA.error) errors.push(eA.error);
    if (eX.error) errors.push(eX.error);
    const missingDots = [eA.missing && "A", eX.missing && "X"].filter(Boolean);
    if (missingDots.length)
      prompts.push(
        `Give the first exciton of dot ${missingDots.join(" and dot ")} (nm), or choose a spectrum of the pure dot whose analysis found it.`,
      );
    const l = Number(path);
    if (!(l > 0)) errors.push("Path length: give a positive number of cm.");
    const overlap = data ? overlapFromPure(data.pureA, data.pureX) : { ratios: {}, errors: [] };
    errors.push(...overlap.errors);
    let rows: RowsOutcome = { rows: [], notes: [], errors: [] };
    if (source === "typed") {
      if (readings.error && (a.pure || x.pure)) errors.push(`Spectra of the pure dots: ${readings.error.message}`);
      rows = parseTypedRows(typed);
      if (rows.rows.length === 0 && rows.errors.length === 0)
        prompts.push("Type one line per point (format above) to compute what is bound.");
    } else if (data) {
      const added = Number(addedA);
      if (addedA.trim() === "") prompts.push("Give the added concentration of dot A in each mixture (µM) to compute what is bound.");
      else if (!(added > 0)) errors.push("Added A: give the concentration of dot A in each mixture as a positive number of µM.");
      else rows = rowsFromReadings(data, addedFrom, added, variableName);
    }
    errors.push(...rows.errors);
    notes.push(...rows.notes);
    let composition: DepletionComposition | null = null;
    if (errors.length === 0 && prompts.length === 0 && eA.value && eX.value && !overlapPending && (source === "typed" || data)) {
      try {
        composition = depletionComposition(rows.rows, {
          dotA: { material: a.material, firstExcitonNm: Number(a.nm) },
          dotX: { material: x.material, firstExcitonNm: Number(x.nm) },
          pathLengthCm: l,
          overlap: overlap.ratios,
        });
      } catch (error) {
        errors.push(`${error instanceof Error ? error.message : String(error)}.`);
      }
    }
    return { errors, notes, prompts, rows: rows.rows, overlap: overlap.ratios, composition };
  })();

  // A dot absorbs at every wavelength bluer than its first exciton: warn where that share is not taken out.
  const cautions: string[] = [];
  if (eA.value && eX.value) {
    const [nmA, nmX] = [Number(a.nm), Number(x.nm)];
    if (eX.value.readingNm < nmA + 10 && computed.overlap.aAtXPerAtA === undefined) {
      cautions.push(
        `Dot A also absorbs at ${nm1(eX.value.readingNm)}, where X is read: choose a spectrum of pure A, or what is left of X is overestimated.`,
      );
    }
    if (eA.value.readingNm < nmX + 10 && computed.overlap.xAtAPerAtX === undefined) {
      cautions.push(
        `Dot X also absorbs at ${nm1(eA.value.readingNm)}, where A is read: choose a spectrum of pure X, or what is left of A is overestimated.`,
      );
    }
  }
  const variable = `${variableName || "the series variable"}${variableUnit ? ` (${variableUnit})` : ""}`;
  const pureName = (id: string) => setup.pureCandidates.find((c) => c.spectrumId === id)?.fileName ?? "the chosen spectrum";

  return (
    <section className="rounded-lg border border-stone-200 bg-white p-4" aria-labelledby="depletion-title" data-testid="depletion-panel">
      <h2 id="depletion-title" className="mb-1 text-sm font-semibold text-ink-soft">
        Composition from supernatant depletion
      </h2>
      <p className="mb-3 text-xs text-ink-soft">
        Bound = added − left in the supernatant; left by Beer–Lambert, c = A/(ε·l), with ε from each dot&apos;s sizing curve, read where
        that ε is defined.
      </p>
      <div className="mb-2 flex flex-wrap items-end gap-3 text-xs text-ink-soft">
        <DotFields label="A" value={a} onChange={setA} candidates={setup.pureCandidates} invalidNm={Boolean(eA.error)} />
        <DotFields label="X" value={x} onChange={setX} candidates={setup.pureCandidates} invalidNm={Boolean(eX.error)} />
        <label htmlFor="depletion-path">
          path length (cm), where a spectrum states none
          <br />
          <input
            id="depletion-path"
            className={`${input} w-20`}
            inputMode="decimal"
            value={path}
            onChange={(e) => setPath(e.target.value)}
            aria-invalid={!(Number(path) > 0) || undefined}
          />
        </label>
      </div>
      {eA.value && eX.value && (
        <p className="text-xs text-ink-soft" data-testid="depletion-extinction">
          ε(A) = {eA.value.epsilonPerMPerCm.toExponential(3)} M⁻¹cm⁻¹ at its {eA.value.readingLabel}, read at {nm1(eA.value.readingNm)} (D ≈{" "}
          {eA.value.diameterNm.toFixed(2)} nm; {eA.value.source}); ε(X) = {eX.value.epsilonPerMPerCm.toExponential(3)} M⁻¹cm⁻¹ at{" "}
          {eX.value.readingLabel === "400 nm" ? "400 nm" : `its ${eX.value.readingLabel}`}, read at {nm1(eX.value.readingNm)} (D ≈{" "}
          {eX.value.diameterNm.toFixed(2)} nm; {eX.value.source}).
        </p>
      )}
      {data && eA.value && eX.value && (computed.overlap.aAtXPerAtA !== undefined || computed.overlap.xAtAPerAtX !== undefined) && (
        <p className="text-xs text-ink-soft" data-testid="depletion-overlap">
          Overlap taken out:{" "}
          {computed.overlap.aAtXPerAtA !== undefined && (
            <>
              A at {nm1(eX.value.readingNm)} per A at {nm1(eA.value.readingNm)} = {computed.overlap.aAtXPerAtA.toFixed(3)} (from{" "}
              {pureName(a.pure)});{" "}
            </>
          )}
          {computed.overlap.xAtAPerAtX !== undefined && (
            <>
              X at {nm1(eA.value.readingNm)} per X at {nm1(eX.value.readingNm)} = {computed.overlap.xAtAPerAtX.toFixed(3)} (from{" "}
              {pureName(x.pure)}).
            </>
          )}
        </p>
      )}
      {cautions.map((c) => (
        <p key={c} className="text-xs text-caution">
          {c}
        </p>
      ))}

      <fieldset className="mt-3 flex flex-wrap gap-4 text-sm">
        <legend className="sr-only">Where the supernatant absorbances come from</legend>
        <label>
          <input type="radio" name="depletion-source" checked={source === "linked"} onChange={() => setSource("linked")} /> from linked
          supernatant spectra ({linkedCount} linked)
        </label>
        <label>
          <input type="radio" name="depletion-source" checked={source === "typed"} onChange={() => setSource("typed")} /> typed in
        </label>
      </fieldset>

      {source === "linked" ? (
        <div className="mt-2">
          {linkedCount === 0 ? (
            <div className="rounded-md border border-dashed border-stone-300 px-3 py-3 text-sm" data-testid="depletion-empty">
              <p className="font-medium">No supernatant spectra linked yet.</p>
              <p className="mt-1 text-xs text-ink-soft">
                How to link one:{" "}
                <Link className="text-glow-deep hover:underline" href="/upload">
                  upload
                </Link>{" "}
                the absorption spectrum of each point&apos;s supernatant to {projectName || "this series' project"} without choosing a
                series, then choose it below beside its point
                {mayWrite ? "" : " (a spectroscopist or lead of the group does this)"}. Until then,{" "}
                <button type="button" className="text-glow-deep hover:underline" onClick={() => setSource("typed")}>
                  type the absorbances in
                </button>
                .
              </p>
            </div>
          ) : (
            <>
              <div className="flex flex-wrap items-end gap-3 text-xs text-ink-soft">
                <label htmlFor="depletion-added-from">
                  {variable} is
                  <br />
                  <select
                    id="depletion-added-from"
                    className={input}
                    value={addedFrom}
                    onChange={(e) => setAddedFrom(e.target.value as AddedFrom)}
                  >
                    <option value="feed-ratio">the feed ratio X:A (added X = value × added A)</option>
                    <option value="added-x">the added concentration of X in µM</option>
                  </select>
                </label>
                <label htmlFor="depletion-added-a">
                  added A in each mixture (µM)
                  <br />
                  <input
                    id="depletion-added-a"
                    className={`${input} w-24`}
                    inputMode="decimal"
                    value={addedA}
                    onChange={(e) => setAddedA(e.target.value)}
                    aria-invalid={(addedA.trim() !== "" && !(Number(addedA) > 0)) || undefined}
                  />
                </label>
              </div>
              {readings.error ? (
                <div role="alert" className="mt-2 rounded-md border border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800">
                  The linked supernatant spectra could not be read: {readings.error.message}{" "}
                  <button type="button" className="underline" onClick={readings.retry}>
                    Try again
                  </button>
                </div>
              ) : !data ? (
                <p className="mt-2 text-sm text-ink-soft" aria-busy={Boolean(eA.value && eX.value)} data-testid="depletion-loading">
                  {eA.value && eX.value
                    ? `Reading ${linkedCount} linked supernatant spectr${linkedCount === 1 ? "um" : "a"} at ${nm1(eA.value.readingNm)} and ${nm1(eX.value.readingNm)}…`
                    : "The linked spectra are read once both first excitons are given."}
                </p>
              ) : (
                <ReadingsTable readings={data} variableLabel={variable} />
              )}
            </>
          )}
          <SupernatantLinks seriesId={seriesId} setup={setup} mayWrite={mayWrite} />
        </div>
      ) : (
        <label className="mt-2 block text-xs text-ink-soft" htmlFor="depletion-rows">
          Points, one per line: added A (µM), added X (µM), supernatant absorbance at A&apos;s wavelength, at X&apos;s, and optionally the
          path length (cm)
          <textarea
            id="depletion-rows"
            rows={5}
            className={`${input} mt-1 block w-full font-mono text-ink`}
            value={typed}
            placeholder={"0.5, 0.25, 0.0656, 0.0000\n0.5, 0.5, 0.0328, 0.0000"}
            onChange={(e) => setTyped(e.target.value)}
          />
        </label>
      )}

      {computed.notes.map((n) => (
        <p key={n} className="mt-1 text-xs text-ink-soft">
          {n}
        </p>
      ))}
      {source === "linked" && linkedCount === 0 ? null : computed.errors.length > 0 && (source === "typed" || data) ? (
        <ul role="alert" className="mt-2 space-y-0.5 text-sm text-red-700" data-testid="depletion-errors">
          {computed.errors.map((e) => (
            <li key={e}>{e}</li>
          ))}
        </ul>
      ) : computed.prompts.length > 0 ? (
        computed.prompts.map((p) => (
          <p key={p} className="mt-2 text-sm text-ink-soft" data-testid="depletion-prompt">
            {p}
          </p>
        ))
      ) : overlapPending && source === "typed" ? (
        <p className="mt-2 text-sm text-ink-soft" aria-busy="true">
          Reading the spectra of the pure dots…
        </p>
      ) : computed.composition ? (
        <>
          <CompositionTable rows={computed.rows} composition={computed.composition} />
          {source === "linked" && (
            <button
              type="button"
              className="mt-2 text-xs text-glow-deep hover:underline"
              onClick={() => {
                setTyped(formatTypedRows(computed.rows));
                setSource("typed");
              }}
            >
              Copy these values into the typed table to correct them by hand
            </button>
          )}
        </>
      ) : null}
    </section>
  );
}
