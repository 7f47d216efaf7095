"use client";

import { X_UNITS, X_UNIT_NAMES } from "@/lib/engine/parse/readChoice";
import { useState } from "react";
import type { PreviewAnswer } from "./requestPreview";

/** What a person may change for one file before it is stored. */
/** Per trace of a split file: a series value typed over the header's, or left out. */
export type TraceChoice = { seriesValue?: string; skip?: boolean };
export type FileOverrides = { column?: string; xUnit?: string; split?: boolean; traces?: Record<string, TraceChoice> };

const LAYOUT_WORDS = { "x-then-y": "X then Y columns", pairs: "X,Y pairs side by side", blocks: "blocks one after another" } as const;
const SOURCE_WORDS = { file: "stated in the file", values: "inferred from the values", chosen: "chosen" } as const;
const ENCODING_WORDS: Record<string, string> = {
  "utf-8": "UTF-8",
  "utf-8-bom": "UTF-8 with byte-order mark",
  "utf-16le": "UTF-16 (little-endian)",
  "utf-16be": "UTF-16 (big-endian)",
  "windows-1252": "Windows Western (1252)",
  "iso-8859-1": "Latin-1",
  "iso-8859-15": "Latin-9",
  xlsx: "spreadsheet (.xlsx)",
};

function Sparkline({ x, y, label }: { x: number[]; y: number[]; label: string }) {
  const w = 240;
  const h = 64;
  const [x0, x1] = [Math.min(...x), Math.max(...x)];
  const [y0, y1] = [Math.min(...y), Math.max(...y)];
  const sx = (v: number) => ((v - x0) / (x1 - x0 || 1)) * (w - 4) + 2;
  const sy = (v: number) => h - 2 - ((v - y0) / (y1 - y0 || 1)) * (h - 4);
  const points = x.map((v, i) => `${sx(v).toFixed(1)},${sy(y[i]!).toFixed(1)}`).join(" ");
  return (
    <svg
      width={w}
      height={h}
      viewBox={`0 0 ${w} ${h}`}
      role="img"
      aria-label={label}
      className="shrink-0 rounded border border-stone-200 bg-stone-50"
    >
      <polyline points={points} fill="none" stroke="currentColor" strokeWidth="1.2" className="text-glow-deep" />
    </svg>
  );
}

type Props = {
  fileName: string;
  preview: PreviewAnswer | "loading" | undefined;
  overrides: FileOverrides;
  disabled: boolean;
  onChange: (overrides: FileOverrides) => void;
  onApplyToBatch: () => void;
  /** Saves the choices this preview was read with as a named import profile of the project. */
  onSaveProfile: (name: string) => Promise<{ ok: true } | { ok: false; message: string }>;
};

function SaveProfile({ idPrefix, disabled, onSave }: { idPrefix: string; disabled: boolean; onSave: Props["onSaveProfile"] }) {
  const [name, setName] = useState("");
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const save = async () => {
    const result = await onSave(name.trim());
    setNote(
      result.ok
        ? { ok: true, text: `Saved as profile "${name.trim()}": files with the same header will be read this way.` }
        : { ok: false, text: result.message },
    );
  };
  return (
    <div className="mt-2 flex flex-col gap-1 border-t border-stone-200 pt-2">
      <label htmlFor={`${idPrefix}-profile`} className="text-ink-soft">
        Save these choices as a profile
      </label>
      <span className="flex gap-1">
        <input
          id={`${idPrefix}-profile`}
          value={name}
          maxLength={80}
          disabled={disabled}
          onChange={(e) => setName(e.target.value)}
          placeholder="e.g. Plate reader, three columns"
          className="w-44 rounded border border-stone-300 px-1 py-0.5"
        />
        <button
          type="button"
          disabled={disabled || name.trim() === ""}
          onClick={save}
          className="rounded border border-stone-300 px-2 py-0.5 hover:bg-white disabled:opacity-50"
        >
          Save profile
        </button>
      </span>
      {note && (
        <p role={note.ok ? "status" : "alert"} data-testid="profile-saved" className={note.ok ? "text-emerald-800" : "text-red-800"}>
          {note.text}
        </p>
      )}
    </div>
  );
}

/** The preview of one file: what was found, a small plot, and the choices for this file. */
export function FilePreviewPanel({ fileName, preview, overrides, disabled, onChange, onApplyToBatch, onSaveProfile }: Props) {
  if (preview === undefined || preview === "loading") return <p className="mt-1 text-xs text-ink-faint">Reading {fileName}…</p>;
  const id = (k: string) => `${fileName}-${k}`.replace(/[^\w-]/g, "_");
  return (
    <div className="mt-2 flex flex-wrap items-start gap-4 rounded-md bg-stone-50 px-3 py-2 text-xs" data-testid="file-preview">
      {preview.ok ? (
        <>
          <Sparkline x={preview.plot.x} y={preview.plot.y} label={`Plot of ${preview.column}`} />
          <dl className="grid min-w-64 flex-1 grid-cols-[auto_1fr] gap-x-3 gap-y-0.5">
            <dt className="text-ink-soft">Encoding</dt>
            <dd>
              {ENCODING_WORDS[preview.encoding] ?? preview.encoding}
              {preview.sheet ? ` · sheet "${preview.sheet}"` : ""}
            </dd>
            <dt className="text-ink-soft">Layout</dt>
            <dd>{LAYOUT_WORDS[preview.layout]}</dd>
            <dt className="text-ink-soft">X unit</dt>
            <dd data-testid="preview-x-unit">
              {preview.xUnitLabel} ({SOURCE_WORDS[preview.xUnitSource]})
            </dd>
            <dt className="text-ink-soft">Signal</dt>
            <dd>{preview.yKindLabel}</dd>
            <dt className="text-ink-soft">Column</dt>
            <dd data-testid="preview-column">{preview.column}</dd>
            {preview.profile && (
              <>
                <dt className="text-ink-soft">Profile</dt>
                <dd data-testid="preview-profile">
                  &quot;{preview.profile.name}&quot; ({preview.profile.how === "matched" ? "matched by the file's header" : "chosen"})
                </dd>
              </>
            )}
            <dt className="text-ink-soft">Will create</dt>
            <dd data-testid="preview-creates">{preview.creates}</dd>
            {preview.warnings.length > 0 && (
              <>
                <dt className="text-ink-soft">Notes</dt>
                <dd>{preview.warnings.join("; ")}</dd>
              </>
            )}
          </dl>
        </>
      ) : (
        <p role="alert" className="flex-1 text-red-800" data-testid="preview-error">
          {preview.error}
        </p>
      )}
      <div className="flex flex-col gap-1">
        <label htmlFor={id("column")} className="text-ink-soft">
          Column for this file
        </label>
        <select
          id={id("column")}
          value={overrides.column ?? ""}
          disabled={disabled}
          onChange={(e) => onChange({ ...overrides, column: e.target.value || undefined })}
          className="rounded border border-stone-300 px-1 py-0.5"
        >
          <option value="">As for the batch</option>
          {preview.ok &&
            preview.traces.map((t) => (
              <option key={t.label} value={t.label}>
                {t.label}
                {t.seriesValue ? ` (${t.seriesValue.value} ${t.seriesValue.unit})` : ""}
              </option>
            ))}
        </select>
        <label htmlFor={id("xUnit")} className="text-ink-soft">
          X unit for this file
        </label>
        <select
          id={id("xUnit")}
          value={overrides.xUnit ?? ""}
          disabled={disabled}
          onChange={(e) => onChange({ ...overrides, xUnit: e.target.value || undefined })}
          className="rounded border border-stone-300 px-1 py-0.5"
        >
          <option value="">As for the batch</option>
          {X_UNIT_NAMES.map((u) => (
            <option key={u} value={u}>
              {X_UNITS[u].label}
            </option>
          ))}
        </select>
        {preview.ok && preview.traces.length > 1 && preview.format !== "jcamp-dx" && (
          <label className="mt-1 flex items-center gap-1.5">
            <input
              type="checkbox"
              checked={preview.split !== null}
              disabled={disabled}
              data-testid="preview-split"
              onChange={(e) => onChange({ ...overrides, split: e.target.checked })}
            />
            Split into {preview.traces.length} spectra (one per column)
          </label>
        )}
        {preview.ok && preview.split !== null && (
          <fieldset className="mt-1 rounded border border-stone-200 p-2" data-testid="preview-traces">
            <legend className="px-1 text-ink-soft">Spectra this file will become</legend>
            {preview.traces.map((t, i) => {
              const choice = overrides.traces?.[t.label] ?? {};
              const set = (next: TraceChoice) =>
                onChange({ ...overrides, traces: { ...overrides.traces, [t.label]: { ...choice, ...next } } });
              return (
                <div key={t.label} data-trace={t.label} className="flex flex-wrap items-center gap-2 py-0.5">
                  <span className="min-w-[6rem]">{t.label}</span>
                  <label htmlFor={id(`trace-value-${i}`)} className="text-ink-soft">
                    series value
                  </label>
                  <input
                    id={id(`trace-value-${i}`)}
                    inputMode="decimal"
                    value={choice.seriesValue ?? ""}
                    placeholder={t.seriesValue ? `${t.seriesValue.value} (from the header)` : "none"}
                    disabled={disabled || choice.skip}
                    onChange={(e) => set({ seriesValue: e.target.value || undefined })}
                    className="w-36 rounded border border-stone-300 px-1 py-0.5"
                  />
                  <label className="flex items-center gap-1">
                    <input
                      type="checkbox"
                      checked={choice.skip ?? false}
                      disabled={disabled}
                      onChange={(e) => set({ skip: e.target.checked || undefined })}
                    />
                    leave out
                  </label>
                </div>
              );
            })}
            <LeftOutSummary total={preview.split.length} leftOut={preview.split.filter((t) => overrides.traces?.[t.label]?.skip).length} />
          </fieldset>
        )}
        <button
          type="button"
          disabled={disabled || (!overrides.column && !overrides.xUnit && overrides.split === undefined)}
          onClick={onApplyToBatch}
          className="mt-1 rounded border border-stone-300 px-2 py-0.5 text-left hover:bg-white disabled:opacity-50"
        >
          Use these choices for the whole batch
        </button>
        {preview.ok && preview.signature && <SaveProfile idPrefix={id("save")} disabled={disabled} onSave={onSaveProfile} />}
      </div>
    </div>
  );
}

function LeftOutSummary({ total, leftOut }: { total: number; leftOut: number }) {
  if (leftOut === 0) return null;
  return (
    <p className={leftOut === total ? "pt-1 text-red-800" : "pt-1 text-ink-soft"} data-testid="preview-left-out">
      {leftOut === total
        ? "Every column is left out: this file would store nothing."
        : `${total - leftOut} of ${total} will be stored; ${leftOut} left out.`}
    </p>
  );
}
