import { z } from "zod";
import { SIGNATURE_KINDS, REVIEW_STATES } from "@/models/Signature";
import { decodeSortedCursor } from "@/lib/search/keysetCursor";

export const DECISIONS = ["confirmed", "dismissed"] as const;
export type Decision = (typeof DECISIONS)[number];

const uuid = (field: string) => z.string().trim().uuid(`${field} must be an id (UUID)`);

/** One decision on one or more signatures, as a form or a JSON body sends it. */
export const decisionSchema = z.object({
  decision: z.enum(DECISIONS, { error: "decision must be confirmed or dismissed" }),
  comment: z.string({ error: "comment must be text" }).trim().max(2000, "comment must be at most 2000 characters").default(""),
});

export const batchDecisionSchema = decisionSchema.extend({
  signatureIds: z
    .union([z.string(), z.array(z.string())], { error: "choose at least one signature" })
    .transform((v) => (Array.isArray(v) ? v : [v]).filter(Boolean))
    .pipe(z.array(uuid("signatureIds")).min(1, "choose at least one signature").max(200, "at most 200 signatures at once")),
});

/** Decisions to take back, by the ids of their history rows. */
export const undoSchema = z.object({
  reviewIds: z
    .union([z.string(), z.array(z.string())], { error: "name at least one decision to undo" })
    .transform((v) =>
      (Array.isArray(v) ? v : [v])
        .flatMap((s) => s.split(","))
        .map((s) => s.trim())
        .filter(Boolean),
    )
    .pipe(z.array(uuid("reviewIds")).min(1, "name at least one decision to undo").max(200, "at most 200 decisions at once")),
});

export const QUEUE_SORTS = ["significance", "date", "kind", "project", "sample"] as const;
export type QueueSort = (typeof QUEUE_SORTS)[number];

const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

/** Filters, sort and page of the review queue: the page's URL and GET /api/v1/review/queue share them. */
export const queueQuerySchema = z.object({
  project: z.preprocess(blank, uuid("project").optional()),
  sample: z.preprocess(blank, uuid("sample").optional()),
  kind: z.preprocess(blank, z.enum(SIGNATURE_KINDS, { error: `kind must be one of ${SIGNATURE_KINDS.join(", ")}` }).optional()),
  state: z.preprocess(
    blank,
    z.enum([...REVIEW_STATES, "all"], { error: "state must be awaiting, confirmed, dismissed or all" }).default("awaiting"),
  ),
  minSignificance: z.preprocess(
    blank,
    z.coerce.number({ error: "minSignificance must be a number" }).min(0, "minSignificance must be ≥ 0").optional(),
  ),
  from: z.preprocess(blank, z.iso.date({ error: "from must be a date, YYYY-MM-DD" }).optional()),
  to: z.preprocess(blank, z.iso.date({ error: "to must be a date, YYYY-MM-DD" }).optional()),
  sort: z.preprocess(blank, z.enum(QUEUE_SORTS, { error: `sort must be one of ${QUEUE_SORTS.join(", ")}` }).default("significance")),
  dir: z.preprocess(blank, z.enum(["asc", "desc"], { error: "dir must be asc or desc" }).default("desc")),
  after: z.preprocess(
    blank,
    z
      .string()
      .max(800)
      .refine((c) => decodeSortedCursor(c) !== null, "after must be a cursor from an earlier page")
      .optional(),
  ),
  pageSize: z.preprocess(
    blank,
    z.coerce
      .number({ error: "pageSize must be a number" })
      .int("pageSize must be a whole number")
      .min(1, "pageSize must be at least 1")
      .max(200, "pageSize must be at most 200")
      .default(25),
  ),
});
export type QueueQuery = z.output<typeof queueQuerySchema>;

/** Reads the first value of each query parameter (URLSearchParams or Next's searchParams object). */
export function queryObject(params: URLSearchParams | Record<string, string | string[] | undefined>): Record<string, string> {
  const out: Record<string, string> = {};
  if (params instanceof URLSearchParams) {
    for (const [k, v] of params) if (!(k in out)) out[k] = v;
  } else {
    for (const [k, v] of Object.entries(params)) if (v !== undefined) out[k] = Array.isArray(v) ? (v[0] ?? "") : v;
  }
  return out;
}
