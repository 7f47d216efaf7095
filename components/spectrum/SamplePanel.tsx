import Link from "next/link";
import type { SpectrumDetail } from "@/lib/queries/spectrum-detail";
import { SidePanel } from "./SidePanel";

/** The spectrum's sample, its parent samples, its parent reference spectrum and, for a supernatant, the series point it belongs to. */
export function SamplePanel({ s }: { s: Pick<SpectrumDetail, "sample" | "reference" | "supernatantOf"> }) {
  return (
    <SidePanel title="Sample and parents" testId="sample-panel">
      {s.sample ? (
        <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
          <dt className="text-ink-soft">Sample</dt>
          <dd>
            <Link className="text-glow-deep hover:underline" href={`/samples/${s.sample.id}`}>
              {s.sample.name}
            </Link>
          </dd>
          <dt className="text-ink-soft">Material</dt>
          <dd>
            {s.sample.material}
            {s.sample.coreShell ? ` (${s.sample.coreShell})` : ""}
          </dd>
          {s.sample.ligand && (
            <>
              <dt className="text-ink-soft">Ligand</dt>
              <dd>{s.sample.ligand}</dd>
            </>
          )}
          {s.sample.solvent && (
            <>
              <dt className="text-ink-soft">Solvent</dt>
              <dd>{s.sample.solvent}</dd>
            </>
          )}
          <dt className="text-ink-soft">Parent samples</dt>
          <dd>
            {s.sample.parents.length === 0 ? (
              "none (as-made)"
            ) : (
              <ul>
                {s.sample.parents.map((pa) => (
                  <li key={pa.id}>
                    <Link className="text-glow-deep hover:underline" href={`/samples/${pa.id}`}>
                      {pa.name}
                    </Link>{" "}
                    <span className="text-ink-faint">{pa.material}</span>
                  </li>
                ))}
              </ul>
            )}
          </dd>
        </dl>
      ) : (
        <p className="text-ink-soft">No sample registered for this spectrum.</p>
      )}
      <p className="mt-2">
        Parent reference spectrum:{" "}
        {s.reference ? (
          <Link className="text-glow-deep hover:underline" href={`/spectra/${s.reference.id}`}>
            {s.reference.fileName}
          </Link>
        ) : (
          <span className="text-ink-soft">none set</span>
        )}
      </p>
      {s.supernatantOf && (
        <p className="mt-2" data-testid="supernatant-of">
          Supernatant of{" "}
          <Link className="text-glow-deep hover:underline" href={`/spectra/${s.supernatantOf.spectrumId}`}>
            {s.supernatantOf.fileName}
          </Link>
          , a point of the series{" "}
          <Link className="text-glow-deep hover:underline" href={`/series/${s.supernatantOf.seriesId}`}>
            {s.supernatantOf.seriesName}
          </Link>{" "}
          (read for its depletion composition)
        </p>
      )}
    </SidePanel>
  );
}
