import type { Metadata } from "next";
import { z } from "zod";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { listProjectChoices } from "@/lib/queries/projects";
import { DATA_CLASS_LABELS, listPolicies, previewPolicy, type PolicyPreview } from "@/lib/stewardship/queries";
import { ActionForm, RowActionButton } from "@/components/forms/ActionForm";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatBytes } from "@/lib/format/bytes";
import { formatDay } from "@/lib/format/dates";
import { inputClass } from "@/components/forms/Field";
import { PageHeader } from "@/components/ui/PageHeader";
import { deletePolicy, savePolicy } from "../actions";
import { CardTable } from "@/components/ui/CardTable";

export const metadata: Metadata = { title: "Keep rules · Data care" };

const draftSchema = z.object({
  projectId: z.string().uuid("project: choose a project."),
  dataClass: z.enum(["raw", "processed", "drafts"], { error: "data class: choose one." }),
  keepDays: z.coerce
    .number({ error: "keep for: a whole number of days." })
    .int("keep for: a whole number of days.")
    .min(1, "keep for: at least 1 day.")
    .max(36500, "keep for: at most 36500 days."),
  onExpiry: z.enum(["delete", "flag"], { error: "at the end: choose delete or flag." }),
});

type Search = Record<string, string | undefined>;

function PreviewList({ title, rows, empty, testId }: { title: string; rows: PolicyPreview["toDelete"]; empty: string; testId: string }) {
  return (
    <section className="mt-3" data-testid={testId}>
      <h3 className="text-sm font-semibold">
        {title} ({rows.length})
      </h3>
      {rows.length === 0 ? (
        <p className="text-sm text-ink-soft">{empty}</p>
      ) : (
        <ul className="mt-1 max-h-72 divide-y divide-stone-100 overflow-auto rounded-md border border-stone-200 bg-white text-sm">
          {rows.map((r) => (
            <li key={r.id} className="flex flex-wrap justify-between gap-2 px-3 py-1.5">
              <span className="font-medium">{r.label}</span>
              <span className="text-xs text-ink-soft">
                stored {formatDay(r.createdAt)} · expired {formatDay(r.expiredAt)} · {formatBytes(r.sizeBytes)}
                {r.why ? ` · ${r.why}` : ""}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

export default async function PoliciesPage({ searchParams }: { searchParams: Promise<Search> }) {
  const actor = await requireActor("/stewardship/policies");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="Retention" />;
  const search = await searchParams;
  const [projects, policies] = await Promise.all([listProjectChoices(actor, "steward"), listPolicies(actor)]);
  const asked = search.preview === "1";
  const draft = asked ? draftSchema.safeParse(search) : null;
  const draftErrors = draft && !draft.success ? draft.error.issues.map((i) => i.message) : [];
  const ownProject = draft?.success && projects.some((p) => p.id === draft.data.projectId);
  if (draft?.success && !ownProject) draftErrors.push("project: not a project you steward.");
  const preview = draft?.success && ownProject ? await previewPolicy(draft.data) : null;
  const value = (k: string, fallback = "") => search[k] ?? fallback;
  return (
    <>
      <PageHeader
        title="Keep rules"
        subtitle="How long each project keeps each class of data, and what happens at the end: delete, or ask you first under Clean-up due. Holds and reference spectra that kept spectra depend on are never deleted."
      />
      {search.saved === "1" && (
        <p role="status" className="mb-4 rounded-md border border-leaf/40 bg-leaf-soft px-3 py-2 text-sm">
          Policy saved. The next sweep applies it.
        </p>
      )}
      <section className="mb-6 rounded-lg border border-stone-200 bg-white p-4">
        <h2 className="text-base font-semibold">Set a policy</h2>
        <p className="text-sm text-ink-soft">
          Preview first: the dry run lists exactly what the policy would delete today. Nothing is saved until you confirm.
        </p>
        <form method="get" className="mt-3 grid grid-cols-1 gap-3 sm:grid-cols-5 sm:items-end" aria-label="Policy draft">
          <input type="hidden" name="preview" value="1" />
          <label className="text-sm font-medium sm:col-span-2">
            Project
            <select name="projectId" defaultValue={value("projectId")} className={`${inputClass} mt-1`} required>
              <option value="">Choose…</option>
              {projects.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} ({p.groupName})
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm font-medium">
            Data class
            <select name="dataClass" defaultValue={value("dataClass", "raw")} className={`${inputClass} mt-1`}>
              {(["raw", "processed", "drafts"] as const).map((c) => (
                <option key={c} value={c}>
                  {DATA_CLASS_LABELS[c]}
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm font-medium">
            Keep for (days)
            <input
              name="keepDays"
              type="number"
              min={1}
              max={36500}
              step={1}
              defaultValue={value("keepDays", "365")}
              className={`${inputClass} mt-1`}
              required
            />
          </label>
          <label className="text-sm font-medium">
            At the end
            <select name="onExpiry" defaultValue={value("onExpiry", "flag")} className={`${inputClass} mt-1`}>
              <option value="flag">Ask me first (Clean-up due)</option>
              <option value="delete">Delete</option>
            </select>
          </label>
          <div className="sm:col-span-5">
            <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm font-medium hover:bg-stone-50">
              Preview (dry run)
            </button>
          </div>
        </form>
        {draftErrors.length > 0 && (
          <p role="alert" className="mt-2 text-sm text-red-700">
            {draftErrors.join(" ")}
          </p>
        )}
        {preview && draft?.success && (
          <div className="mt-4 rounded-md border border-stone-200 bg-stone-50 p-3" data-testid="dry-run">
            <p className="text-sm">
              <span className="font-semibold">Dry run, as of now:</span>{" "}
              {draft.data.onExpiry === "delete" ? (
                <>
                  this policy would delete <strong data-testid="dry-run-count">{preview.toDelete.length}</strong> item(s),{" "}
                  {formatBytes(preview.bytes)}
                  {draft.data.dataClass !== "processed" ? ", with their analyses" : ""}.
                </>
              ) : (
                <>
                  this rule would put <strong data-testid="dry-run-count">{preview.toFlag.length}</strong> item(s) under Clean-up due for
                  you to decide, and delete nothing.
                </>
              )}
            </p>
            {draft.data.onExpiry === "delete" ? (
              <PreviewList
                title="Would be deleted"
                rows={preview.toDelete}
                empty="Nothing has expired under this policy yet."
                testId="would-delete"
              />
            ) : (
              <PreviewList
                title="Would be flagged"
                rows={preview.toFlag}
                empty="Nothing has expired under this policy yet."
                testId="would-flag"
              />
            )}
            <PreviewList title="Expired but kept" rows={preview.protectedItems} empty="None." testId="would-keep" />
            <ActionForm
              action={savePolicy}
              submit="Save this policy"
              pendingLabel="Saving…"
              className="mt-3 flex flex-wrap items-center gap-2"
              label="Save policy"
            >
              {(["projectId", "dataClass", "keepDays", "onExpiry"] as const).map((k) => (
                <input key={k} type="hidden" name={k} value={String(draft.data[k])} />
              ))}
            </ActionForm>
          </div>
        )}
      </section>
      <section>
        <h2 className="mb-2 text-base font-semibold">Policies in force</h2>
        {policies.length === 0 ? (
          <p className="text-sm text-ink-soft">No policies yet: everything is kept.</p>
        ) : (
          <CardTable headers={["Project", "Class", "Keep", "At the end", "Changed", ""]} testId="policies-table">
            {policies.map((p) => (
              <tr key={p.id} className="border-t border-stone-100">
                <td className="px-3 py-1.5 font-medium">{p.projectName}</td>
                <td className="px-3 py-1.5">{DATA_CLASS_LABELS[p.dataClass]}</td>
                <td className="tabular px-3 py-1.5">{p.keepDays} days</td>
                <td className="px-3 py-1.5">{p.onExpiry === "delete" ? "Delete" : "Ask first"}</td>
                <td className="px-3 py-1.5 text-ink-soft">{formatDay(p.updatedAt)}</td>
                <td className="px-3 py-1.5 text-right">
                  <RowActionButton action={deletePolicy} id={p.id} submit="Remove" />
                </td>
              </tr>
            ))}
          </CardTable>
        )}
      </section>
    </>
  );
}
