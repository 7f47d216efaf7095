import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { holdTargetOptions, listHolds } from "@/lib/stewardship/queries";
import { ActionForm, RowActionButton } from "@/components/forms/ActionForm";
import { HoldTargetPicker } from "@/components/stewardship/HoldTargetPicker";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatDay } from "@/lib/format/dates";
import { inputClass } from "@/components/forms/Field";
import { PageHeader } from "@/components/ui/PageHeader";
import { liftHold, placeHold } from "../actions";
import { CardTable } from "@/components/ui/CardTable";

export const metadata: Metadata = { title: "Holds · Data care" };

export default async function HoldsPage() {
  const actor = await requireActor("/stewardship/holds");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="Legal holds" />;
  const [holds, options] = await Promise.all([listHolds(actor), holdTargetOptions(actor)]);
  const active = holds.filter((h) => !h.liftedAt);
  const lifted = holds.filter((h) => h.liftedAt);
  return (
    <>
      <PageHeader
        title="Holds"
        subtitle="A hold (for a legal matter, a dispute or a publication under review) keeps a project, series, sample or spectrum, and everything within it, from being deleted by anyone or by any policy until you lift it."
      />
      <section className="mb-6 rounded-lg border border-stone-200 bg-white p-4">
        <h2 className="text-base font-semibold">Place a hold</h2>
        <ActionForm
          action={placeHold}
          submit="Place hold"
          pendingLabel="Placing…"
          className="mt-3 flex flex-wrap items-end gap-3"
          label="Place hold"
        >
          <HoldTargetPicker options={options} />
          <label className="min-w-72 flex-1 text-sm font-medium">
            Reason
            <input
              name="reason"
              required
              maxLength={1000}
              placeholder="e.g. patent filing, keep until the examiner decides"
              className={`${inputClass} mt-1`}
            />
          </label>
        </ActionForm>
      </section>
      <h2 className="mb-2 text-base font-semibold">Holds in force ({active.length})</h2>
      {active.length === 0 ? (
        <p className="mb-6 text-sm text-ink-soft">No holds in force.</p>
      ) : (
        <CardTable headers={["On", "Reason", "Placed", ""]} testId="holds-table" className="mb-6">
          {active.map((h) => (
            <tr key={h.id} className="border-t border-stone-100 align-top">
              <td className="px-3 py-1.5">
                <span className="text-xs text-ink-soft">{h.targetType}</span> <span className="font-medium">{h.targetLabel}</span>
              </td>
              <td className="px-3 py-1.5">{h.reason}</td>
              <td className="whitespace-nowrap px-3 py-1.5 text-ink-soft">
                {formatDay(h.placedAt)} · {h.placedBy}
              </td>
              <td className="px-3 py-1.5 text-right">
                <RowActionButton action={liftHold} id={h.id} submit="Lift" />
              </td>
            </tr>
          ))}
        </CardTable>
      )}
      {lifted.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer text-ink-soft">Lifted holds ({lifted.length})</summary>
          <ul className="mt-2 space-y-1">
            {lifted.map((h) => (
              <li key={h.id}>
                <span className="text-xs text-ink-soft">{h.targetType}</span> {h.targetLabel}: {h.reason} — lifted {formatDay(h.liftedAt)}{" "}
                by {h.liftedBy}
              </li>
            ))}
          </ul>
        </details>
      )}
    </>
  );
}
