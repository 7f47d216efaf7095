"use client";

import { readingText, type CurveStyle } from "./theme";

export type Reading = { x: number; values: { key: string; label: string; style: CurveStyle; value: number | null }[] } | null;

/**
 * The line above a chart that reads every curve at the cursor: the position with its unit, then
 * each curve's value beside its colour; a hint while the pointer is elsewhere.
 */
export function ChartReadout({ reading, xUnit, xDigits = 6, hint }: { reading: Reading; xUnit: string; xDigits?: number; hint: string }) {
  return (
    <div
      className="tabular mb-1 h-5 overflow-hidden text-ellipsis whitespace-nowrap text-xs text-ink-soft"
      data-testid="readout"
      aria-live="off"
    >
      {reading ? (
        <>
          <span className="font-medium text-ink">
            {readingText(reading.x, xDigits)}
            {xUnit ? ` ${xUnit}` : ""}
          </span>
          {reading.values.map((v) => (
            <span key={v.key} className="ml-3">
              <span style={{ color: v.style.stroke }}>■</span> {v.label} {readingText(v.value)}
            </span>
          ))}
        </>
      ) : (
        <span className="text-ink-faint">{hint}</span>
      )}
    </div>
  );
}
