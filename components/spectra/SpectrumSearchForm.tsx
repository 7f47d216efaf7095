import Link from "next/link";
import { SPECTRUM_STATUSES } from "@/models/Spectrum";
import { TECHNIQUES, TECHNIQUE_SHORT_LABELS } from "@/lib/registry/techniques";
import { REVIEW_STATES, SIGNATURE_KINDS } from "@/models/Signature";
import { KIND_LABELS } from "@/lib/registry/flagKinds";
import { ISO_DAY_PATTERN } from "@/lib/format/dates";
import { BAND_UNITS, type BandUnit } from "@/lib/search/bandRangeEv";
import { BAND_KINDS, type BandKind } from "@/lib/search/spectrumSearchQuery";
import type { SearchChoices } from "@/lib/search/searchChoices";

const BAND_LABELS: Record<BandKind, string> = {
  "first-exciton": "First exciton",
  emission: "Emission maximum",
  band: "Any band (e.g. IR)",
};
const UNIT_LABELS: Record<BandUnit, string> = { nm: "nm", eV: "eV", "cm-1": "cm⁻¹" };
const STATUS_LABELS: Record<(typeof SPECTRUM_STATUSES)[number], string> = {
  received: "Received",
  queued: "Waiting",
  analysing: "Analysing",
  analysed: "Analysed",
  failed: "Could not read",
};
const REVIEW_LABELS: Record<(typeof REVIEW_STATES)[number], string> = {
  awaiting: "Awaiting review",
  confirmed: "Confirmed",
  dismissed: "Dismissed",
};

const control = "rounded-md border border-stone-300 bg-white px-2 py-1.5 text-sm";
const label = "text-xs text-ink-soft";

/**
 * The spectra search as a plain GET form: every filter lives in the URL, so a search is a link
 * to share and works without JavaScript.
 */
export function SpectrumSearchForm({
  values,
  choices,
  error,
}: {
  values: Record<string, string>;
  choices: SearchChoices;
  error: { field: string; message: string } | null;
}) {
  const invalid = (f: string) => (error?.field === f ? { "aria-invalid": true, "aria-describedby": "search-error" } : {});
  const v = (k: string) => values[k] ?? "";
  return (
    <form
      method="get"
      action="/spectra"
      role="search"
      aria-label="Search spectra"
      className="mb-4 space-y-3 rounded-lg border border-stone-200 bg-white p-3"
    >
      <div className="flex flex-wrap items-end gap-3">
        <label className={label}>
          Text
          <br />
          <input
            name="q"
            defaultValue={v("q")}
            placeholder="File, sample, notes, metadata"
            aria-label="Search text"
            className={`${control} w-64`}
            {...invalid("q")}
          />
        </label>
        <label className={label}>
          Project
          <br />
          <select name="project" defaultValue={v("project")} className={control} {...invalid("project")}>
            <option value="">All projects</option>
            {choices.projects.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        <label className={label}>
          Technique
          <br />
          <select name="technique" defaultValue={v("technique")} className={control} {...invalid("technique")}>
            <option value="">Any</option>
            {TECHNIQUES.map((t) => (
              <option key={t} value={t}>
                {TECHNIQUE_SHORT_LABELS[t]}
              </option>
            ))}
          </select>
        </label>
        <label className={label}>
          Material
          <br />
          <input
            name="material"
            defaultValue={v("material")}
            placeholder="e.g. CdSe"
            className={`${control} w-24`}
            {...invalid("material")}
          />
        </label>
        <label className={label}>
          Uploaded by
          <br />
          <select name="uploader" defaultValue={v("uploader")} className={control} {...invalid("uploader")}>
            <option value="">Anyone</option>
            {choices.uploaders.map((u) => (
              <option key={u.id} value={u.id}>
                {u.name}
              </option>
            ))}
          </select>
        </label>
        <label className={label}>
          Stored from
          <br />
          <input
            name="from"
            type="text"
            inputMode="numeric"
            placeholder="YYYY-MM-DD"
            pattern={ISO_DAY_PATTERN}
            title="A date as YYYY-MM-DD"
            defaultValue={v("from")}
            className={`${control} w-32`}
            {...invalid("from")}
          />
        </label>
        <label className={label}>
          to
          <br />
          <input
            name="to"
            type="text"
            inputMode="numeric"
            placeholder="YYYY-MM-DD"
            pattern={ISO_DAY_PATTERN}
            title="A date as YYYY-MM-DD"
            defaultValue={v("to")}
            className={`${control} w-32`}
            {...invalid("to")}
          />
        </label>
        <label className={label}>
          State
          <br />
          <select name="status" defaultValue={v("status")} aria-label="Status" className={control} {...invalid("status")}>
            <option value="">Any state</option>
            {SPECTRUM_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        {values.sample && (
          <span className="text-sm">
            <input type="hidden" name="sample" value={values.sample} />
            Sample: <strong>{choices.sampleName ?? "unknown"}</strong>
          </span>
        )}
      </div>
      <fieldset className="flex flex-wrap items-end gap-3">
        <legend className="mb-1 text-xs font-semibold text-ink-soft">Band</legend>
        <label className={label}>
          Which band
          <br />
          <select name="band" defaultValue={v("band")} className={control} {...invalid("band")}>
            <option value="">—</option>
            {BAND_KINDS.map((b) => (
              <option key={b} value={b}>
                {BAND_LABELS[b]}
              </option>
            ))}
          </select>
        </label>
        <label className={label}>
          from
          <br />
          <input
            name="bandMin"
            type="number"
            step="any"
            min={0}
            defaultValue={v("bandMin")}
            aria-label="Band from"
            className={`${control} w-24`}
            {...invalid("bandMin")}
          />
        </label>
        <label className={label}>
          to
          <br />
          <input
            name="bandMax"
            type="number"
            step="any"
            min={0}
            defaultValue={v("bandMax")}
            aria-label="Band to"
            className={`${control} w-24`}
            {...invalid("bandMax")}
          />
        </label>
        <label className={label}>
          unit
          <br />
          <select name="bandUnit" defaultValue={v("bandUnit") || "nm"} aria-label="Band unit" className={control} {...invalid("bandUnit")}>
            {BAND_UNITS.map((u) => (
              <option key={u} value={u}>
                {UNIT_LABELS[u]}
              </option>
            ))}
          </select>
        </label>
        <label className={label}>
          Size from (nm)
          <br />
          <input
            name="sizeMin"
            type="number"
            step="any"
            min={0}
            defaultValue={v("sizeMin")}
            aria-label="Size from"
            className={`${control} w-20`}
            {...invalid("sizeMin")}
          />
        </label>
        <label className={label}>
          to (nm)
          <br />
          <input
            name="sizeMax"
            type="number"
            step="any"
            min={0}
            defaultValue={v("sizeMax")}
            aria-label="Size to"
            className={`${control} w-20`}
            {...invalid("sizeMax")}
          />
        </label>
      </fieldset>
      <fieldset className="flex flex-wrap items-end gap-3">
        <legend className="mb-1 text-xs font-semibold text-ink-soft">Flagged change</legend>
        <label className={label}>
          Kind
          <br />
          <select name="flag" defaultValue={v("flag")} aria-label="Flag kind" className={control} {...invalid("flag")}>
            <option value="">—</option>
            {SIGNATURE_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_LABELS[k]}
              </option>
            ))}
          </select>
        </label>
        <label
          className={label}
          title="In the flag's own unit: a fraction for a bleach or quench (0.2 = 20 %), meV for a shift or broadening"
        >
          Size at least
          <br />
          <input
            name="flagMin"
            type="number"
            step="any"
            min={0}
            defaultValue={v("flagMin")}
            aria-label="Flag size at least"
            className={`${control} w-24`}
            {...invalid("flagMin")}
          />
        </label>
        <label className={label}>
          Significance at least (σ)
          <br />
          <input
            name="flagSig"
            type="number"
            step="any"
            min={0}
            defaultValue={v("flagSig")}
            aria-label="Flag significance at least"
            className={`${control} w-24`}
            {...invalid("flagSig")}
          />
        </label>
        <label className={label}>
          Review
          <br />
          <select name="review" defaultValue={v("review")} aria-label="Review state" className={control} {...invalid("review")}>
            <option value="">Any</option>
            {REVIEW_STATES.map((r) => (
              <option key={r} value={r}>
                {REVIEW_LABELS[r]}
              </option>
            ))}
          </select>
        </label>
        <button className="rounded-md bg-glow px-3 py-1.5 text-sm font-medium text-white hover:bg-glow-deep">Search</button>
        <Link href="/spectra" className="py-1.5 text-sm text-ink-soft hover:underline">
          Clear
        </Link>
      </fieldset>
      <p className="text-xs text-ink-soft">
        A flag&apos;s size is in its own unit: a fraction for a bleach or a quench (0.2 = 20 %), meV for a shift or a broadening.
      </p>
      {error && (
        <p id="search-error" role="alert" className="text-sm text-red-700">
          {error.message}
        </p>
      )}
    </form>
  );
}
