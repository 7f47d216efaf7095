import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { listReviewQueue } from "@/lib/queries/review";
import { leadGroupIds } from "@/lib/auth/access";
import { queueHref } from "@/lib/review/queueHref";
import { countText } from "@/lib/search/fastCount";
import { queryObject, queueQuerySchema, type QueueQuery } from "@/lib/review/schemas";
import { QueueFilters } from "@/components/review/QueueFilters";
import { ReviewQueueTable, type SortHeader } from "@/components/review/ReviewQueueTable";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Review" };

const COLUMNS: { key: string; label: string; sort?: QueueQuery["sort"] }[] = [
  { key: "kind", label: "Change", sort: "kind" },
  { key: "significance", label: "Significance", sort: "significance" },
  { key: "magnitude", label: "Magnitude" },
  { key: "spectrum", label: "Spectrum" },
  { key: "sample", label: "Sample", sort: "sample" },
  { key: "project", label: "Project", sort: "project" },
  { key: "date", label: "Flagged (UTC)", sort: "date" },
  { key: "state", label: "State" },
];

export default async function ReviewPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requireActor("/review");
  if (leadGroupIds(actor).length === 0) {
    return (
      <EmptyState title="Review is for group leads">
        Signatures are confirmed or dismissed by a lead of the group that owns the spectrum.
      </EmptyState>
    );
  }
  const raw = queryObject(await searchParams);
  const parsed = queueQuerySchema.safeParse(raw);
  const issue = parsed.success ? null : parsed.error.issues[0]!;
  const error = issue
    ? { field: String(issue.path[0] ?? "form"), message: `${issue.message}. Showing the queue without that filter.` }
    : null;
  const query = parsed.success
    ? parsed.data
    : queueQuerySchema.parse(Object.fromEntries(Object.entries(raw).filter(([k]) => k !== error?.field)));
  const queue = await listReviewQueue(actor, query);
  const current = Object.fromEntries(Object.entries(raw).filter(([k]) => k !== error?.field));
  const headers: SortHeader[] = COLUMNS.map((c) => ({
    key: c.key,
    label: c.label,
    href: c.sort
      ? queueHref(current, { sort: c.sort, dir: query.sort === c.sort && query.dir === "desc" ? "asc" : "desc", after: undefined })
      : "",
    active: c.sort && query.sort === c.sort ? query.dir : null,
  }));
  return (
    <>
      <PageHeader
        title="Review"
        subtitle="Band changes flagged by the analysis in the groups you lead. Open one to see the spectra around it; confirm or dismiss one at a time or a selection at once."
      />
      <QueueFilters values={current} projects={queue.projects} samples={queue.samples} error={error} />
      {queue.items.length === 0 ? (
        <EmptyState title={query.state === "awaiting" ? "Nothing waits for review" : "No signature matches these filters"}>
          {query.state === "awaiting"
            ? "New flags appear here as soon as the analysis of an upload finishes."
            : "Loosen a filter or clear them all."}
        </EmptyState>
      ) : (
        <>
          <ReviewQueueTable items={queue.items} headers={headers} />
          <nav aria-label="Pages of the queue" className="mt-2 flex items-center gap-3 text-sm text-ink-soft">
            <span>
              {queue.items.length} shown of {countText({ value: queue.total, exact: queue.totalExact })}
            </span>
            {query.after && (
              <Link className="text-glow-deep hover:underline" href={queueHref(current, { after: undefined })}>
                ← First page
              </Link>
            )}
            {queue.next && (
              <Link className="text-glow-deep hover:underline" href={queueHref(current, { after: queue.next })}>
                Next →
              </Link>
            )}
          </nav>
        </>
      )}
    </>
  );
}
