import { formatBytes } from "@/lib/format/bytes";
import { formatWhen } from "@/lib/format/dates";
import type { DeletionNotice } from "@/lib/queries/deletions";

/** The confirmation shown after a deletion: what was deleted, from where, and that only its tombstone remains. */
export function DeletedBanner({ notice }: { notice: DeletionNotice }) {
  return (
    <div role="status" className="mb-4 rounded-md border border-emerald-300 bg-emerald-50 px-3 py-2 text-sm" data-testid="deleted-banner">
      <p>
        <strong>Deleted {notice.label}</strong>
        {notice.projectName && <> from {notice.projectName}</>} ({formatBytes(notice.sizeBytes)}) at {formatWhen(notice.deletedAt)}.
      </p>
      <p className="mt-0.5 text-ink-soft">
        The raw file, the spectrum and its analyses are gone and cannot be restored. A tombstone with its name, time and sha256
        {notice.sha256 && (
          <>
            {" "}
            (<span className="font-mono text-xs">{notice.sha256.slice(0, 12)}…</span>)
          </>
        )}{" "}
        stays, and the audit trail records who deleted it.
      </p>
    </div>
  );
}
