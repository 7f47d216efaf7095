import { z } from "zod";
import { SPECTRUM_STATUSES, TECHNIQUES } from "@/models/Spectrum";
import { REVIEW_STATES, SIGNATURE_KINDS } from "@/models/Signature";
import { BAND_UNITS } from "./bandRangeEv";
import { decodeCursor } from "./keysetCursor";

/** Which band a band search looks at (docs/search.md). */
export const BAND_KINDS = ["first-exciton", "emission", "band"] as const;
export type BandKind = (typeof BAND_KINDS)[number];

export const SEARCH_PAGE_SIZE = 50;

const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const uuid = (field: string) => z.preprocess(blank, z.string().trim().uuid(`${field} must be an id (UUID)`).optional());
const oneOf = <T extends readonly [string, ...string[]]>(field: string, values: T) =>
  z.preprocess(blank, z.enum(values, { error: `${field} must be one of ${values.join(", ")}` }).optional());
const number = (field: string, min: number, minText: string) =>
  z.preprocess(
    blank,
    z.coerce
      .number({ error: `${field} must be a number` })
      .refine(Number.isFinite, `${field} must be a number`)
      .min(min, `${field} must be ${minText}`)
      .optional(),
  );
const date = (field: string) => z.preprocess(blank, z.iso.date({ error: `${field} must be a date, YYYY-MM-DD` }).optional());

/**
 * One search over the spectra: the page's URL, GET /api/v1/spectra and saved searches share it.
 * Every field is optional; the fields given are combined with AND.
 */
export const spectrumSearchSchema = z
  .object({
    q: z.preprocess(blank, z.string().trim().max(100, "q must be at most 100 characters").optional()),
    project: uuid("project"),
    sample: uuid("sample"),
    material: z.preprocess(blank, z.string().trim().max(60, "material must be at most 60 characters").optional()),
    technique: oneOf("technique", TECHNIQUES),
    uploader: uuid("uploader"),
    from: date("from"),
    to: date("to"),
    status: oneOf("status", SPECTRUM_STATUSES),
    flag: oneOf("flag", SIGNATURE_KINDS),
    flagMin: number("flagMin", 0, "≥ 0"),
    flagSig: number("flagSig", 0, "≥ 0"),
    review: oneOf("review", REVIEW_STATES),
    band: oneOf("band", BAND_KINDS),
    bandMin: number("bandMin", Number.MIN_VALUE, "a positive number"),
    bandMax: number("bandMax", Number.MIN_VALUE, "a positive number"),
    bandUnit: z.preprocess(blank, z.enum(BAND_UNITS, { error: `bandUnit must be one of ${BAND_UNITS.join(", ")}` }).default("nm")),
    sizeMin: number("sizeMin", 0, "≥ 0"),
    sizeMax: number("sizeMax", 0, "≥ 0"),
    after: z.preprocess(
      blank,
      z
        .string()
        .max(200)
        .refine((c) => decodeCursor(c) !== null, "after must be a cursor from an earlier page")
        .optional(),
    ),
    limit: z.preprocess(
      blank,
      z.coerce
        .number({ error: "limit must be a number" })
        .int("limit must be a whole number")
        .min(1, "limit must be at least 1")
        .max(200, "limit must be at most 200")
        .default(SEARCH_PAGE_SIZE),
    ),
  })
  .superRefine((s, ctx) => {
    if ((s.bandMin !== undefined || s.bandMax !== undefined) && !s.band) {
      ctx.addIssue({
        code: "custom",
        path: ["band"],
        message: "band must say which band (first-exciton, emission or band) when a band range is given",
      });
    }
    if (s.band && (s.bandMin === undefined || s.bandMax === undefined)) {
      ctx.addIssue({ code: "custom", path: ["bandMin"], message: "a band search needs both bandMin and bandMax" });
    }
    if ((s.flagMin !== undefined || s.flagSig !== undefined) && !s.flag) {
      ctx.addIssue({ code: "custom", path: ["flag"], message: "flag must name the flag kind when flagMin or flagSig is given" });
    }
    if (s.sizeMin !== undefined && s.sizeMax !== undefined && s.sizeMin > s.sizeMax) {
      ctx.addIssue({ code: "custom", path: ["sizeMin"], message: "sizeMin must not be above sizeMax" });
    }
    if (s.from && s.to && s.from > s.to) ctx.addIssue({ code: "custom", path: ["from"], message: "from must not be after to" });
  });
export type SpectrumSearch = z.output<typeof spectrumSearchSchema>;

/** The fields that narrow the rows (everything but the page position and size). */
export const FILTER_KEYS = [
  "q",
  "project",
  "sample",
  "material",
  "technique",
  "uploader",
  "from",
  "to",
  "status",
  "flag",
  "flagMin",
  "flagSig",
  "review",
  "band",
  "bandMin",
  "bandMax",
  "bandUnit",
  "sizeMin",
  "sizeMax",
] as const satisfies readonly (keyof SpectrumSearch)[];

export function hasFilters(s: SpectrumSearch): boolean {
  return FILTER_KEYS.some((k) => k !== "bandUnit" && s[k] !== undefined);
}

/**
 * The canonical query string of a search's filters (fixed key order, defaults left out), so
 * the same search is the same URL and a saved search compares equal to the page's.
 */
export function searchQueryString(s: SpectrumSearch, extra: { after?: string } = {}): string {
  const params = new URLSearchParams();
  for (const key of FILTER_KEYS) {
    const v = s[key];
    if (v === undefined) continue;
    if (key === "bandUnit" && (!s.band || v === "nm")) continue;
    params.set(key, String(v));
  }
  if (extra.after) params.set("after", extra.after);
  return params.toString();
}
