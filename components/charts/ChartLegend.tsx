"use client";

import type { CurveStyle } from "./theme";

export type LegendEntry = { key: string; label: string; style: CurveStyle };

/** Swatch of a curve: a line (dashed when the curve is) or a dot for measured points. */
export function Swatch({ style }: { style: CurveStyle }) {
  if (style.points) return <span className="inline-block h-2 w-2 rounded-full" style={{ background: style.stroke }} aria-hidden />;
  return (
    <span
      className="inline-block w-5"
      style={{ borderTop: `${Math.max(1.5, style.width)}px ${style.dash ? "dashed" : "solid"} ${style.stroke}` }}
      aria-hidden
    />
  );
}

/**
 * Our legend: one swatch and name per curve; with `hidden`/`onToggle` each entry is a checkbox that
 * shows or hides its curve. `extra` sits at the right end (zoom buttons).
 */
export function ChartLegend({
  entries,
  hidden,
  onToggle,
  extra,
  testId,
}: {
  entries: LegendEntry[];
  hidden?: ReadonlySet<string>;
  onToggle?: (key: string) => void;
  extra?: React.ReactNode;
  testId?: string;
}) {
  return (
    <div className="mb-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-xs" data-testid={testId}>
      {entries.map((e) =>
        onToggle ? (
          <label key={e.key} className="inline-flex cursor-pointer items-center gap-1.5">
            <input type="checkbox" className="accent-glow" checked={!hidden?.has(e.key)} onChange={() => onToggle(e.key)} />
            <Swatch style={e.style} />
            {e.label}
          </label>
        ) : (
          <span key={e.key} className="inline-flex items-center gap-1.5">
            <Swatch style={e.style} />
            {e.label}
          </span>
        ),
      )}
      {extra && <span className="ml-auto flex gap-1">{extra}</span>}
    </div>
  );
}
