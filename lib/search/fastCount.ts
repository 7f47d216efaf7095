import { selectRows } from "@/lib/db";

/** Counted exactly up to this many rows; beyond it the planner's estimate is given as "about". */
export const EXACT_COUNT_LIMIT = 10_000;

export type FastCount = { value: number; exact: boolean };

/**
 * The number of rows of `SELECT 1 FROM … WHERE …` (the `fromWhere` text), read exactly up to
 * EXACT_COUNT_LIMIT and estimated beyond it from the planner's statistics (EXPLAIN's row
 * estimate), so a count costs at most EXACT_COUNT_LIMIT index entries however large the table.
 */
export async function fastCount(fromWhere: string, params: Record<string, unknown>): Promise<FastCount> {
  const [row] = await selectRows<{ n: string }>(
    `SELECT count(*) AS n FROM (SELECT 1 ${fromWhere} LIMIT ${EXACT_COUNT_LIMIT + 1}) capped`, params,
  );
  const n = Number(row?.n ?? 0);
  if (n <= EXACT_COUNT_LIMIT) return { value: n, exact: true };
  const [plan] = await selectRows<{ "QUERY PLAN": [{ Plan: { "Plan Rows": number } }] }>(`EXPLAIN (FORMAT JSON) SELECT 1 ${fromWhere}`, params);
  const estimate = Math.round(plan?.["QUERY PLAN"]?.[0]?.Plan?.["Plan Rows"] ?? n);
  return { value: Math.max(estimate, EXACT_COUNT_LIMIT + 1), exact: false };
}

/** "137" or "about 120,000". */
export function countText(count: FastCount): string {
  const shown = count.exact ? count.value : roundForAbout(count.value);
  return `${count.exact ? "" : "about "}${shown.toLocaleString("en-GB")}`;
}

const roundForAbout = (n: number) => {
  const step = 10 ** Math.max(0, Math.floor(Math.log10(n)) - 1);
  return Math.round(n / step) * step;
};
