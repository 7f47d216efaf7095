import Link from "next/link";
import { AUDIT_CATEGORY_LABELS } from "@/lib/auditTrail/eventKinds";
import type { AuditLine } from "@/lib/queries/audit";
import { formatWhen } from "@/lib/format/dates";

/** The trail as a list of sentences, newest first; named records link to their pages when the reader may open them. */
export function AuditLines({ lines }: { lines: AuditLine[] }) {
  return (
    <ol className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm" data-testid="audit-lines">
      {lines.map((line) => (
        <li
          key={line.id}
          className="flex flex-col gap-0.5 px-3 py-2 sm:flex-row sm:items-baseline sm:gap-4"
          data-testid="audit-line"
          data-action={line.kind === "event" ? line.action : "sign-in"}
        >
          <time dateTime={line.at} className="tabular shrink-0 text-xs text-ink-soft sm:w-44">
            {formatWhen(line.at)}
          </time>
          <p className="min-w-0 flex-1 break-words">
            {line.kind === "sign-ins"
              ? line.text
              : line.parts.map((part, i) =>
                  part.href ? (
                    <Link key={i} prefetch={false} href={part.href} className="font-medium text-glow-deep hover:underline">
                      {part.text}
                    </Link>
                  ) : (
                    <span key={i}>{part.text}</span>
                  ),
                )}
          </p>
          <span className="shrink-0 text-xs text-ink-soft">
            {line.kind === "sign-ins"
              ? AUDIT_CATEGORY_LABELS["sign-in"]
              : line.category
                ? AUDIT_CATEGORY_LABELS[line.category]
                : line.action}
          </span>
        </li>
      ))}
    </ol>
  );
}
