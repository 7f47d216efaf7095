import Link from "next/link";
import { SIGNATURE_KINDS } from "@/models/Signature";
import { KIND_LABELS } from "@/lib/registry/flagKinds";
import { ISO_DAY_PATTERN } from "@/lib/format/dates";

const select = "rounded-md border border-stone-300 bg-white px-2 py-1.5 text-sm";

/** The queue's filters as a plain GET form: the state lives in the URL and works without JavaScript. */
export function QueueFilters({
  values,
  projects,
  samples,
  error,
}: {
  values: Record<string, string>;
  projects: { id: string; name: string }[];
  samples: { id: string; name: string }[];
  error: { field: string; message: string } | null;
}) {
  const invalid = (f: string) => (error?.field === f ? { "aria-invalid": true, "aria-describedby": "queue-filter-error" } : {});
  return (
    <form
      method="get"
      action="/review"
      className="mb-4 flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-3"
      aria-label="Filter the review queue"
    >
      <label className="text-xs text-ink-soft">
        Project
        <br />
        <select name="project" defaultValue={values.project ?? ""} className={select} {...invalid("project")}>
          <option value="">All projects</option>
          {projects.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </select>
      </label>
      <label className="text-xs text-ink-soft">
        Change
        <br />
        <select name="kind" defaultValue={values.kind ?? ""} className={select} {...invalid("kind")}>
          <option value="">All changes</option>
          {SIGNATURE_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABELS[k]}
            </option>
          ))}
        </select>
      </label>
      <label className="text-xs text-ink-soft">
        Sample
        <br />
        <select name="sample" defaultValue={values.sample ?? ""} className={select} {...invalid("sample")}>
          <option value="">All samples</option>
          {samples.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </label>
      <label className="text-xs text-ink-soft">
        State
        <br />
        <select name="state" defaultValue={values.state ?? "awaiting"} className={select} {...invalid("state")}>
          <option value="awaiting">Awaiting review</option>
          <option value="confirmed">Confirmed</option>
          <option value="dismissed">Dismissed</option>
          <option value="all">All states</option>
        </select>
      </label>
      <label className="text-xs text-ink-soft">
        Significance at least (σ)
        <br />
        <input
          name="minSignificance"
          type="number"
          min={0}
          step="any"
          defaultValue={values.minSignificance ?? ""}
          className={`${select} w-28`}
          {...invalid("minSignificance")}
        />
      </label>
      <label className="text-xs text-ink-soft">
        Flagged from
        <br />
        <input
          name="from"
          type="text"
          inputMode="numeric"
          placeholder="YYYY-MM-DD"
          pattern={ISO_DAY_PATTERN}
          title="A date as YYYY-MM-DD"
          defaultValue={values.from ?? ""}
          className={select}
          {...invalid("from")}
        />
      </label>
      <label className="text-xs text-ink-soft">
        to
        <br />
        <input
          name="to"
          type="text"
          inputMode="numeric"
          placeholder="YYYY-MM-DD"
          pattern={ISO_DAY_PATTERN}
          title="A date as YYYY-MM-DD"
          defaultValue={values.to ?? ""}
          className={select}
          {...invalid("to")}
        />
      </label>
      {values.sort && <input type="hidden" name="sort" value={values.sort} />}
      {values.dir && <input type="hidden" name="dir" value={values.dir} />}
      {values.pageSize && <input type="hidden" name="pageSize" value={values.pageSize} />}
      <button className="rounded-md bg-glow px-3 py-1.5 text-sm font-medium text-white hover:bg-glow-deep">Apply</button>
      <Link href="/review" className="py-1.5 text-sm text-ink-soft hover:underline">
        Clear
      </Link>
      {error && (
        <p id="queue-filter-error" role="alert" className="w-full text-sm text-red-700">
          {error.message}
        </p>
      )}
    </form>
  );
}
