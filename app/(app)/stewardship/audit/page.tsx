import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { auditCategoryOptions, auditFilterSchema, auditPeople, listAuditPage } from "@/lib/queries/audit";
import { countText } from "@/lib/search/fastCount";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { AuditLines } from "@/components/audit/AuditLines";
import { inputClass } from "@/components/forms/Field";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { ISO_DAY_PATTERN } from "@/lib/format/dates";

export const metadata: Metadata = { title: "Audit trail · Data care" };

const FIELDS = ["category", "person", "action", "from", "to"] as const;

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requireActor("/stewardship/audit");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="The audit trail" />;
  const raw = await searchParams;
  const one = (k: string) => {
    const v = raw[k];
    return (Array.isArray(v) ? v[0] : v) ?? "";
  };
  const picked = Object.fromEntries(FIELDS.map((k) => [k, one(k)])) as Record<(typeof FIELDS)[number], string>;
  const parsed = auditFilterSchema.safeParse({ ...picked, after: one("after") });
  const errors = parsed.success ? [] : parsed.error.issues.map((i) => i.message);
  const [page, people] = await Promise.all([parsed.success ? listAuditPage(actor, parsed.data) : null, auditPeople(actor)]);
  const query = new URLSearchParams(Object.entries(picked).filter(([, v]) => v)).toString();
  const withQuery = (extra: Record<string, string>) =>
    new URLSearchParams({ ...Object.fromEntries(new URLSearchParams(query)), ...extra }).toString();
  return (
    <>
      <PageHeader
        title="Audit trail"
        subtitle={
          <>
            Who did what, and when, in your groups. It cannot be edited or deleted.
            {page && (
              <>
                {" "}
                <span data-testid="audit-count">
                  {countText(page.count)} {page.count.exact && page.count.value === 1 ? "event" : "events"}
                </span>
                .
              </>
            )}
          </>
        }
        actions={
          parsed.success ? (
            <a
              href={`/api/v1/audit?${withQuery({ format: "csv" })}`}
              className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm font-medium hover:bg-stone-50"
              data-testid="audit-csv"
            >
              Export CSV (raw codes and details)
            </a>
          ) : null
        }
      />
      <form className="mb-4 flex flex-wrap items-end gap-2" role="search" aria-label="Filter the audit trail">
        <label className="text-sm font-medium">
          What
          <select name="category" defaultValue={picked.category} className={`${inputClass} mt-1 w-52`}>
            <option value="">Everything</option>
            {auditCategoryOptions.map((c) => (
              <option key={c.value} value={c.value}>
                {c.label}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm font-medium">
          Who
          <select name="person" defaultValue={picked.person} className={`${inputClass} mt-1 w-52`}>
            <option value="">Anyone</option>
            {people.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        {picked.action && <input type="hidden" name="action" value={picked.action} />}
        <label className="text-sm font-medium">
          From
          <input
            name="from"
            type="text"
            inputMode="numeric"
            placeholder="YYYY-MM-DD"
            pattern={ISO_DAY_PATTERN}
            title="A date as YYYY-MM-DD"
            defaultValue={picked.from}
            className={`${inputClass} mt-1 w-32`}
          />
        </label>
        <label className="text-sm font-medium">
          To
          <input
            name="to"
            type="text"
            inputMode="numeric"
            placeholder="YYYY-MM-DD"
            pattern={ISO_DAY_PATTERN}
            title="A date as YYYY-MM-DD"
            defaultValue={picked.to}
            className={`${inputClass} mt-1 w-32`}
          />
        </label>
        <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm">Apply</button>
        {query && (
          <Link href="/stewardship/audit" className="px-2 py-1.5 text-sm text-glow-deep hover:underline">
            Clear
          </Link>
        )}
      </form>
      {errors.length > 0 && (
        <p role="alert" className="mb-3 text-sm text-red-700">
          {errors.join(" ")}
        </p>
      )}
      {!page || page.lines.length === 0 ? (
        <EmptyState title="No events match">
          Sign-ins, uploads, analyses, decisions, shares, holds, keep rules and deletions are recorded here as they happen.
        </EmptyState>
      ) : (
        <AuditLines lines={page.lines} />
      )}
      {page && parsed.success && (parsed.data.after || page.next) && (
        <nav aria-label="Pages" className="mt-3 flex items-center gap-4 text-sm">
          {parsed.data.after && (
            <Link href={`/stewardship/audit${query ? `?${query}` : ""}`} className="text-glow-deep hover:underline">
              ← Newest
            </Link>
          )}
          {page.next && (
            <Link
              prefetch={false}
              href={`/stewardship/audit?${withQuery({ after: page.next })}`}
              className="text-glow-deep hover:underline"
              data-testid="audit-older"
            >
              Older →
            </Link>
          )}
        </nav>
      )}
    </>
  );
}
