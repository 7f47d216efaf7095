import Link from "next/link";
import type { SupernatantReadings } from "@/lib/series/supernatantSchemas";

const abs = (v: number | null) => (v === null ? "—" : v.toFixed(4));

/** The absorbances read from each linked supernatant, as measured, with the file they come from. */
export function ReadingsTable({ readings, variableLabel }: { readings: SupernatantReadings; variableLabel: string }) {
  const { a, x } = readings.wavelengthsNm;
  const rows = readings.points.filter((p) => p.supernatant);
  return (
    <div className="mt-2">
      <table className="w-full tabular text-sm" data-testid="depletion-readings">
        <thead className="text-left text-xs text-ink-soft">
          <tr>
            <th>{variableLabel}</th>
            <th>supernatant spectrum</th>
            <th>A at {a} nm</th>
            <th>A at {x} nm</th>
            <th>path (cm)</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((p) => {
            const s = p.supernatant!;
            return (
              <tr key={p.spectrumId} className="border-t border-stone-100">
                <td>{p.seriesValue ?? "—"}</td>
                <td>
                  <Link className="text-glow-deep hover:underline" href={`/spectra/${s.spectrumId}`}>
                    {s.fileName}
                  </Link>
                  {s.error && <span className="block text-xs text-red-700">{s.error}</span>}
                </td>
                <td>{abs(s.atA)}</td>
                <td>{abs(s.atX)}</td>
                <td>{s.pathLengthCm ?? "—"}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-ink-faint">Values: {readings.reading}.</p>
    </div>
  );
}
