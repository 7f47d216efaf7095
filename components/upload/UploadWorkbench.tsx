"use client";

import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { PREVIEW_FIELDS, ingestMetadataSchema } from "@/lib/ingest/metadata";
import type { UploadChoices } from "@/lib/queries/spectrum-status";
import { LIGHT_CAUTION, usesUvOrLaserLight } from "@/lib/hazards";
import { formatBytes } from "@/lib/format/bytes";
import { BatchForm, EMPTY_VALUES, type BatchValues } from "./BatchForm";
import type { PickedFile } from "./collectFiles";
import { DropZone } from "./DropZone";
import { LiveStatus } from "./LiveStatus";
import { sendFile, type UploadOutcome } from "./sendFile";
import { FilePreviewPanel, type FileOverrides } from "./FilePreviewPanel";
import { requestPreview, type PreviewAnswer } from "./requestPreview";
import type { FilePreviewOk } from "@/lib/ingest/previewFile";
import type { ImportProfileView } from "@/lib/ingest/profiles/importProfiles";
import type { ProfileChoice } from "@/lib/ingest/profiles/profileChoice";
import { deleteProfile, fetchProfiles, saveProfile } from "./importProfilesClient";

type Item = {
  key: string;
  picked: PickedFile;
  phase: "ready" | "sending" | "done";
  progress: number;
  outcomes: UploadOutcome[];
  localError?: string;
  overrides: FileOverrides;
  preview?: PreviewAnswer | "loading";
  /** The reading fields the preview was made with; a change asks again. */
  previewKey?: string;
};

/** The batch fields that change how a file is read (and so its preview): the preview endpoint's fields. */
const READ_KEYS = PREVIEW_FIELDS;

/**
 * The per-trace choices of a split file as the upload's `assignments` field (docs/api.md), with
 * split=all stated (the split may come from an import profile the server matches, and assignments
 * need it); a typed series value that is not a number goes as null, and the server's refusal names the field.
 */
function assignmentsFor(item: Pick<Item, "overrides" | "preview">): Record<string, string> {
  const preview = item.preview && item.preview !== "loading" && item.preview.ok ? item.preview : null;
  if (!preview?.split) return {};
  const assignments = Object.entries(item.overrides.traces ?? {})
    .filter(([trace, c]) => (c.skip || c.seriesValue) && preview.split!.some((t) => t.label === trace))
    .map(([trace, c]) => (c.skip ? { trace, skip: true } : { trace, seriesValue: Number(c.seriesValue!.replace(",", ".")) }));
  return assignments.length > 0 ? { split: "all", assignments: JSON.stringify(assignments) } : {};
}

function readFieldsFor(values: BatchValues, overrides: FileOverrides): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const k of READ_KEYS) fields[k] = values[k];
  if (overrides.column) fields.column = overrides.column;
  if (overrides.xUnit) fields.xUnit = overrides.xUnit;
  if (overrides.split !== undefined) fields.split = overrides.split ? "all" : "";
  return fields;
}

/** The choices a preview was read with (what was sent and what its profile filled in), as a profile keeps them. */
function profileChoiceOf(fields: Record<string, string>, preview: FilePreviewOk): ProfileChoice {
  const all = { ...fields, ...(preview.profile?.fields ?? {}) };
  const choice: ProfileChoice = {};
  if (all.column) choice.column = all.column;
  if (all.xUnit) choice.xUnit = all.xUnit as ProfileChoice["xUnit"];
  if (all.yKind) choice.yKind = all.yKind as ProfileChoice["yKind"];
  if (all.block) choice.block = Number(all.block);
  if (all.pair) choice.pair = Number(all.pair);
  if (all.sheet) choice.sheet = all.sheet;
  if (all.split === "all") choice.split = true;
  return choice;
}

const PARALLEL = 3;
let counter = 0;

/** Drop files, describe the batch once, watch every file go through upload and analysis. */
export function UploadWorkbench({ choices, maxBytes }: { choices: UploadChoices; maxBytes: number }) {
  const [values, setValues] = useState<BatchValues>({
    ...EMPTY_VALUES,
    projectId: choices.projects.length === 1 ? choices.projects[0].id : "",
  });
  const [errors, setErrors] = useState<Partial<Record<keyof BatchValues, string[]>>>({});
  const [items, setItems] = useState<Item[]>([]);
  const [busy, setBusy] = useState(false);
  const cancel = useRef<AbortController | null>(null);
  const [profiles, setProfiles] = useState<ImportProfileView[]>([]);
  const [profileVersion, setProfileVersion] = useState(0);

  useEffect(() => {
    if (!values.projectId) return;
    let live = true;
    void fetchProfiles(values.projectId).then((p) => {
      if (live) setProfiles(p);
    });
    return () => {
      live = false;
    };
  }, [values.projectId, profileVersion]);

  // A saved or deleted profile changes how waiting files are read: ask their previews again
  // (not the one a profile was just saved from: it is already read with those choices).
  const profilesChanged = (exceptKey?: string) => {
    setProfileVersion((v) => v + 1);
    setItems((old) => old.map((i) => (i.key === exceptKey ? i : { ...i, previewKey: undefined })));
  };
  const saveProfileFrom = async (item: Item, name: string) => {
    if (!item.preview || item.preview === "loading" || !item.preview.ok || !item.preview.signature)
      return { ok: false as const, message: "the file must be read first" };
    const result = await saveProfile(
      values.projectId,
      name,
      profileChoiceOf(readFieldsFor(values, item.overrides), item.preview),
      item.preview.signature,
    );
    if (result.ok) profilesChanged(item.key);
    return result;
  };
  const removeProfile = async (id: string) => {
    const result = await deleteProfile(values.projectId, id);
    if (result.ok) profilesChanged();
  };

  const addFiles = useCallback(
    (picked: PickedFile[]) => {
      setItems((old) => [
        ...old,
        ...picked.map((p) => ({
          key: `f${++counter}`,
          picked: p,
          phase: "ready" as const,
          progress: 0,
          outcomes: [],
          overrides: {},
          localError:
            p.file.size === 0
              ? `${p.name}: the file is empty`
              : p.file.size > maxBytes
                ? `${p.name}: ${formatBytes(p.file.size)} is over the ${formatBytes(maxBytes)} limit`
                : undefined,
        })),
      ]);
    },
    [maxBytes],
  );

  const update = (key: string, change: Partial<Item>) => setItems((old) => old.map((i) => (i.key === key ? { ...i, ...change } : i)));

  const ready = items.filter((i) => i.phase === "ready" && !i.localError);
  const waitingFiles = ready.flatMap((i) =>
    i.preview && i.preview !== "loading" && i.preview.ok && i.preview.bands ? [{ fileName: i.picked.name, bands: i.preview.bands }] : [],
  );

  // Each waiting file is read once per set of reading fields (the batch's and its own).
  useEffect(() => {
    for (const item of items) {
      if (item.phase !== "ready" || item.localError) continue;
      const fields = readFieldsFor(values, item.overrides);
      const key = JSON.stringify(fields);
      if (item.previewKey === key) continue;
      update(item.key, { preview: "loading", previewKey: key });
      void requestPreview(item.picked.file, item.picked.name, fields).then((preview) =>
        setItems((old) => old.map((i) => (i.key === item.key && i.previewKey === key ? { ...i, preview } : i))),
      );
    }
  }, [items, values]);

  const applyToBatch = (overrides: FileOverrides) => {
    setValues((v) => ({
      ...v,
      ...(overrides.column ? { column: overrides.column } : {}),
      ...(overrides.xUnit ? { xUnit: overrides.xUnit } : {}),
      ...(overrides.split !== undefined ? { split: overrides.split ? "all" : "" } : {}),
    }));
    setItems((old) => old.map((i) => ({ ...i, overrides: {} })));
  };
  const counts = useMemo(() => {
    const outcomes = items.flatMap((i) => i.outcomes);
    return {
      stored: outcomes.filter((o) => o.ok && !o.duplicate).length,
      linked: outcomes.filter((o) => o.ok && o.duplicate).length,
      refused: outcomes.filter((o) => !o.ok).length + items.filter((i) => i.localError).length,
    };
  }, [items]);

  /** Sends a file again asking to update the stored record's details with the ones sent (onDuplicate=update). */
  async function updateStored(item: Item) {
    update(item.key, { phase: "sending", progress: 0 });
    const fields = {
      ...values,
      ...readFieldsFor(values, item.overrides),
      ...assignmentsFor(item),
      onDuplicate: "update",
    };
    const result = await sendFile(item.picked.file, item.picked.name, fields, (p) => update(item.key, { progress: p }));
    update(item.key, { phase: "done", progress: 1, outcomes: result.files });
  }

  async function start() {
    const parsed = ingestMetadataSchema.safeParse(values);
    if (!parsed.success) {
      const next: Partial<Record<keyof BatchValues, string[]>> = {};
      for (const issue of parsed.error.issues) {
        const key = String(issue.path[0] ?? "projectId") as keyof BatchValues;
        (next[key] ??= []).push(issue.message);
      }
      setErrors(next);
      return;
    }
    setErrors({});
    setBusy(true);
    const controller = new AbortController();
    cancel.current = controller;
    const queue = [...ready];
    const run = async () => {
      for (let item = queue.shift(); item && !controller.signal.aborted; item = queue.shift()) {
        const key = item.key;
        update(key, { phase: "sending", progress: 0 });
        const fields = { ...values, ...readFieldsFor(values, item.overrides), ...assignmentsFor(item) };
        const result = await sendFile(item.picked.file, item.picked.name, fields, (p) => update(key, { progress: p }), controller.signal);
        if (result.status === 400 && result.error?.field && result.error.field in values) {
          setErrors((e) => ({ ...e, [result.error!.field as keyof BatchValues]: [result.error!.message] }));
        }
        update(key, { phase: "done", progress: 1, outcomes: result.files });
      }
    };
    await Promise.all(Array.from({ length: PARALLEL }, run));
    cancel.current = null;
    setBusy(false);
  }

  if (choices.projects.length === 0) return null;

  return (
    <div className="space-y-6">
      <section aria-labelledby="batch-heading" className="rounded-xl border border-stone-200 bg-white p-5">
        <h2 id="batch-heading" className="mb-3 text-sm font-semibold text-ink-soft">
          Describe the batch
        </h2>
        <BatchForm
          choices={choices}
          values={values}
          errors={errors}
          disabled={busy}
          onChange={setValues}
          waitingFiles={waitingFiles}
          profiles={profiles}
          onDeleteProfile={(id) => void removeProfile(id)}
        />
        {usesUvOrLaserLight(values.technique) && <p className="mt-3 text-xs text-caution">{LIGHT_CAUTION}</p>}
      </section>

      <DropZone onFiles={addFiles} disabled={busy} />

      <section aria-labelledby="files-heading">
        <div className="mb-2 flex flex-wrap items-center justify-between gap-3">
          <h2 id="files-heading" className="text-sm font-semibold text-ink-soft">
            Files <span className="tabular font-normal">({items.length})</span>
          </h2>
          <div className="flex items-center gap-3 text-xs text-ink-soft">
            {counts.stored > 0 && <span>{counts.stored} stored</span>}
            {counts.linked > 0 && <span>{counts.linked} linked</span>}
            {counts.refused > 0 && <span className="text-red-800">{counts.refused} refused</span>}
            {busy ? (
              <button
                type="button"
                onClick={() => cancel.current?.abort()}
                className="rounded-md border border-stone-300 px-3 py-1.5 text-sm"
              >
                Stop
              </button>
            ) : (
              <>
                {items.length > 0 && (
                  <button
                    type="button"
                    onClick={() => setItems((old) => old.filter((i) => i.phase === "ready" && !i.localError))}
                    className="rounded-md px-2 py-1.5 text-sm text-ink-soft hover:text-ink"
                  >
                    Clear finished
                  </button>
                )}
                <button
                  type="button"
                  onClick={start}
                  disabled={ready.length === 0}
                  className="rounded-md bg-glow px-4 py-1.5 text-sm font-medium text-white hover:bg-glow-deep disabled:cursor-not-allowed disabled:bg-stone-300"
                  data-testid="start-upload"
                >
                  Upload {ready.length || ""} {ready.length === 1 ? "file" : "files"}
                </button>
              </>
            )}
          </div>
        </div>
        {items.length === 0 ? (
          <p className="rounded-lg border border-stone-200 bg-white px-4 py-6 text-center text-sm text-ink-faint">
            No files yet. Drop some above; each gets its own progress bar and analysis status.
          </p>
        ) : (
          <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white" data-testid="file-list">
            {items.map((item) => (
              <FileRow
                key={item.key}
                item={item}
                busy={busy}
                onRemove={() => setItems((old) => old.filter((i) => i.key !== item.key))}
                onOverrides={(overrides) => update(item.key, { overrides })}
                onApplyToBatch={() => applyToBatch(item.overrides)}
                onSaveProfile={(name) => saveProfileFrom(item, name)}
                onUpdateStored={() => void updateStored(item)}
              />
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

type FileRowProps = {
  item: Item;
  busy: boolean;
  onRemove: () => void;
  onOverrides: (o: FileOverrides) => void;
  onApplyToBatch: () => void;
  onSaveProfile: (name: string) => Promise<{ ok: true } | { ok: false; message: string }>;
  onUpdateStored: () => void;
};

function FileRow({ item, busy, onRemove, onOverrides, onApplyToBatch, onSaveProfile, onUpdateStored }: FileRowProps) {
  const { picked, phase, progress, outcomes, localError } = item;
  const isBatch = outcomes.length > 1 || outcomes.some((o) => o.zip);
  return (
    <li className="px-4 py-2 text-sm">
      <div className="flex items-center gap-3">
        <span className="min-w-0 flex-1 truncate font-medium" title={picked.name}>
          {picked.name}
        </span>
        <span className="tabular w-20 shrink-0 text-right text-xs text-ink-faint">{formatBytes(picked.file.size)}</span>
        <span className="w-40 shrink-0">
          {phase === "ready" && !localError && (
            <button type="button" onClick={onRemove} className="text-xs text-ink-soft hover:text-ink">
              remove
            </button>
          )}
          {(phase === "sending" || (phase === "done" && outcomes.length === 0)) && (
            <span className="flex items-center gap-2">
              <span
                className="h-1.5 flex-1 overflow-hidden rounded-full bg-stone-200"
                role="progressbar"
                aria-valuemin={0}
                aria-valuemax={100}
                aria-valuenow={Math.round(progress * 100)}
                aria-label={`Upload of ${picked.name}`}
              >
                <span className="block h-full bg-glow transition-[width]" style={{ width: `${Math.round(progress * 100)}%` }} />
              </span>
              <span className="tabular w-9 text-right text-xs text-ink-faint">{Math.round(progress * 100)}%</span>
            </span>
          )}
        </span>
      </div>
      {localError && (
        <p role="alert" className="mt-1 text-xs text-red-800">
          {localError}
        </p>
      )}
      {phase === "ready" && !localError && (
        <FilePreviewPanel
          fileName={picked.name}
          preview={item.preview}
          overrides={item.overrides}
          disabled={busy}
          onChange={onOverrides}
          onApplyToBatch={onApplyToBatch}
          onSaveProfile={onSaveProfile}
        />
      )}
      {outcomes.length > 0 && (
        <ul className={isBatch ? "mt-1 space-y-1 border-l-2 border-stone-100 pl-3" : "mt-1"}>
          {outcomes.map((o, i) => (
            <li key={`${o.fileName}-${i}`} className="flex min-w-0 items-start gap-2 text-xs">
              {isBatch && (
                <span className="w-56 shrink-0 truncate text-ink-soft" title={o.fileName} data-testid="outcome-name">
                  {o.ok && o.trace
                    ? `${o.trace}${o.seriesValue !== undefined && o.seriesValue !== null ? ` → ${o.seriesValue}${o.seriesUnit ? ` ${o.seriesUnit}` : ""}` : ""}`
                    : o.fileName}
                </span>
              )}
              {o.ok ? (
                <span className="min-w-0">
                  <LiveStatus spectrumId={o.spectrumId} duplicate={o.duplicate} />
                  {o.profile && <span className="mt-0.5 block text-ink-soft">Read with profile &quot;{o.profile.name}&quot;</span>}
                  {o.updated ? (
                    <span role="status" className="mt-0.5 block text-emerald-800" data-testid="duplicate-updated">
                      Stored details updated ({o.differences?.map((d) => `${d.label}: ${d.stored ?? "not set"} → ${d.sent}`).join("; ")})
                      {o.updated.reanalysis ? "; a new analysis was requested" : ""}.
                    </span>
                  ) : (
                    o.differences &&
                    o.differences.length > 0 && (
                      <span role="status" className="mt-0.5 block text-caution" data-testid="duplicate-differences">
                        These bytes were already stored with other details (
                        {o.differences.map((d) => `${d.label}: ${d.stored ?? "not set"} stored, ${d.sent} sent`).join("; ")}). The stored
                        details were kept.{" "}
                        <button type="button" onClick={onUpdateStored} className="underline hover:no-underline">
                          Update the stored details
                        </button>
                      </span>
                    )
                  )}
                </span>
              ) : (
                <span role="alert" className="text-red-800">
                  {o.error.message}
                </span>
              )}
            </li>
          ))}
        </ul>
      )}
    </li>
  );
}
