import type { ReactNode } from "react";

export type CardTableHeader = string | { label: string; right?: boolean };

/**
 * A table in a white card: a header row of column names, the rows the caller gives. The card
 * scrolls sideways on a narrow screen rather than widening the page.
 */
export function CardTable({
  headers,
  testId,
  className = "",
  children,
}: {
  headers: readonly CardTableHeader[];
  testId?: string;
  className?: string;
  children: ReactNode;
}) {
  return (
    <div className={`overflow-x-auto rounded-lg border border-stone-200 bg-white ${className}`.trim()}>
      <table className="w-full text-sm" data-testid={testId}>
        <thead className="bg-stone-100 text-left text-xs text-ink-soft">
          <tr>
            {headers.map((h, i) => {
              const { label, right } = typeof h === "string" ? { label: h, right: false } : h;
              return label ? (
                <th key={i} className={right ? "px-3 py-2 text-right" : "px-3 py-2"}>
                  {label}
                </th>
              ) : (
                <th key={i} />
              );
            })}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
