import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { DATA_CLASS_LABELS, listCleanupDue, type CleanupItem } from "@/lib/stewardship/queries";
import { ActionForm } from "@/components/forms/ActionForm";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatDay } from "@/lib/format/dates";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { decideFlag } from "./actions";

export const metadata: Metadata = { title: "Clean-up due" };

function BelongsTo({ item }: { item: CleanupItem }) {
  return (
    <p className="text-xs text-ink-soft">
      {item.projectName}
      {item.sample && (
        <>
          {" · sample "}
          <Link prefetch={false} href={`/samples/${item.sample.id}`} className="underline decoration-stone-300 hover:text-ink">
            {item.sample.name}
          </Link>
        </>
      )}
      {item.series && (
        <>
          {" · series "}
          <Link prefetch={false} href={`/series/${item.series.id}`} className="underline decoration-stone-300 hover:text-ink">
            {item.series.name}
          </Link>
        </>
      )}
    </p>
  );
}

function CleanupCard({ item }: { item: CleanupItem }) {
  return (
    <li
      className="flex flex-col gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:flex-row sm:items-start sm:justify-between"
      data-testid="cleanup-item"
    >
      <div className="min-w-0">
        <p className="font-medium">
          {item.spectrumId ? (
            <Link prefetch={false} href={`/spectra/${item.spectrumId}`} className="hover:underline">
              {item.label}
            </Link>
          ) : (
            item.label
          )}
          <span className="ml-2 text-xs font-normal text-ink-soft">{DATA_CLASS_LABELS[item.dataClass]}</span>
        </p>
        <BelongsTo item={item} />
        <p className="mt-1 text-xs text-ink-soft">
          {item.rule
            ? `Due under the rule “keep ${DATA_CLASS_LABELS[item.rule.dataClass].toLowerCase()} ${item.rule.keepDays} days, then ask”`
            : "The rule that flagged it has since been removed"}
          {item.storedAt ? ` · stored ${formatDay(item.storedAt)}` : ""} · due since {formatDay(item.flaggedAt)}
        </p>
      </div>
      <div className="flex shrink-0 gap-2">
        <ActionForm action={decideFlag} submit="Keep it" danger={false} className="flex flex-wrap items-center gap-2">
          <input type="hidden" name="id" value={item.id} />
          <input type="hidden" name="decision" value="keep" />
        </ActionForm>
        <ActionForm action={decideFlag} submit="Delete" danger className="flex flex-wrap items-center gap-2">
          <input type="hidden" name="id" value={item.id} />
          <input type="hidden" name="decision" value="delete" />
        </ActionForm>
      </div>
    </li>
  );
}

export default async function CleanupDuePage() {
  const actor = await requireActor("/stewardship");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="Data care" />;
  const items = await listCleanupDue(actor);
  return (
    <>
      <PageHeader
        title="Clean-up due"
        subtitle="Data whose keep period has ended under a rule that asks you first. Each item shows its sample, series and the rule; nothing is deleted until you choose."
      />
      {items.length === 0 ? (
        <EmptyState title="No clean-up due">
          When a keep rule set to “ask me” reaches its end for some data, the data appears here with its sample and series.
        </EmptyState>
      ) : (
        <ul className="space-y-2" data-testid="cleanup-list">
          {items.map((item) => (
            <CleanupCard key={item.id} item={item} />
          ))}
        </ul>
      )}
    </>
  );
}
