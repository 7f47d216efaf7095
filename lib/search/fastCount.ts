import { QueryTypes } from "sequelize";
import { selectRows, sequelize } from "@/lib/db";

/** Counted exactly up to this many rows; beyond it the planner's estimate is given as "about". */
export const EXACT_COUNT_LIMIT = 10_000;
/** An exact count that takes longer than this gives way to the estimate (a filter that must probe every row). */
export const EXACT_COUNT_BUDGET_MS = 150;

export type FastCount = { value: number; exact: boolean };

/**
 * Two forms of the rows to count: `rowsSql` is read (it may be shaped for the indexes, e.g. one
 * index range per project, and should stop by itself after :countLimit rows); `estimateSql` is
 * the plain SELECT whose EXPLAIN row estimate stands in when the rows are too many or too slow.
 */
export type CountSql = { rowsSql: string; estimateSql: string };

/** Replacements a CountSql expects besides its own. */
export const countParams = { countLimit: EXACT_COUNT_LIMIT + 1 };

/** SQL that counts the rows of `rowsSql`, stopping after the cap. */
export const cappedCountSql = (rowsSql: string) => `SELECT count(*) AS n FROM (${rowsSql} LIMIT ${EXACT_COUNT_LIMIT + 1}) capped`;

/**
 * The number of rows, read exactly up to EXACT_COUNT_LIMIT within EXACT_COUNT_BUDGET_MS, and
 * otherwise estimated from the planner's statistics (EXPLAIN's row estimate), so a count costs a
 * bounded time however large the table.
 */
export async function fastCount(sql: CountSql, params: Record<string, unknown>): Promise<FastCount> {
  const exact = await cappedCount(sql.rowsSql, { ...countParams, ...params });
  if (exact !== null && exact <= EXACT_COUNT_LIMIT) return { value: exact, exact: true };
  const [plan] = await selectRows<{ "QUERY PLAN": [{ Plan: { "Plan Rows": number } }] }>(
    `EXPLAIN (FORMAT JSON) ${sql.estimateSql}`,
    params,
  );
  const estimate = Math.round(plan?.["QUERY PLAN"]?.[0]?.Plan?.["Plan Rows"] ?? 0);
  // beyond the cap the estimate is at least the cap; a count cut short by the budget says only "about"
  return { value: exact === null ? estimate : Math.max(estimate, EXACT_COUNT_LIMIT + 1), exact: false };
}

/** count(*) up to the cap, or null when it ran out of time (statement_timeout, SQLSTATE 57014). */
async function cappedCount(rowsSql: string, params: Record<string, unknown>): Promise<number | null> {
  try {
    return await sequelize().transaction(async (transaction) => {
      await sequelize().query(`SET LOCAL statement_timeout = ${EXACT_COUNT_BUDGET_MS}`, { transaction });
      const rows = await sequelize().query<{ n: string }>(cappedCountSql(rowsSql), {
        replacements: params,
        type: QueryTypes.SELECT,
        transaction,
      });
      return Number(rows[0]?.n ?? 0);
    });
  } catch (error) {
    const code = (error as { parent?: { code?: string } }).parent?.code;
    if (code === "57014") return null;
    throw error;
  }
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
