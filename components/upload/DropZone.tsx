"use client";

import { useRef, useState } from "react";
import { filesFromDrop, filesFromInput, type PickedFile } from "./collectFiles";

/** Accepts files, whole folders and zips, by drag and drop or from the file pickers. */
export function DropZone({ onFiles, disabled }: { onFiles: (files: PickedFile[]) => void; disabled?: boolean }) {
  const [over, setOver] = useState(false);
  const [reading, setReading] = useState(false);
  const filesInput = useRef<HTMLInputElement>(null);
  const folderInput = useRef<HTMLInputElement>(null);

  return (
    <div
      onDragOver={(e) => {
        e.preventDefault();
        if (!disabled) setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={async (e) => {
        e.preventDefault();
        setOver(false);
        if (disabled) return;
        setReading(true);
        try {
          onFiles(await filesFromDrop(e.dataTransfer));
        } finally {
          setReading(false);
        }
      }}
      className={`rounded-xl border-2 border-dashed px-6 py-8 text-center transition-colors ${
        over ? "border-glow bg-glow-soft" : "border-stone-300 bg-white"
      } ${disabled ? "opacity-60" : ""}`}
      data-testid="drop-zone"
    >
      <p className="text-sm font-medium">{reading ? "Reading the folder…" : "Drop exports, folders or zips here"}</p>
      <p className="mt-1 text-xs text-ink-faint">
        CSV, TSV or text exports (any common encoding), JCAMP-DX and .xlsx spreadsheets; zips are unpacked on the server, spreadsheets are
        not.
      </p>
      <div className="mt-4 flex justify-center gap-2">
        <button
          type="button"
          disabled={disabled}
          onClick={() => filesInput.current?.click()}
          className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50"
        >
          Choose files
        </button>
        <button
          type="button"
          disabled={disabled}
          onClick={() => folderInput.current?.click()}
          className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50"
        >
          Choose a folder
        </button>
      </div>
      <input
        ref={filesInput}
        type="file"
        multiple
        className="sr-only"
        aria-label="Choose files"
        data-testid="file-input"
        onChange={(e) => {
          onFiles(filesFromInput(e.target.files));
          e.target.value = "";
        }}
      />
      <input
        ref={folderInput}
        type="file"
        multiple
        className="sr-only"
        aria-label="Choose a folder"
        {...({ webkitdirectory: "", directory: "" } as Record<string, string>)}
        onChange={(e) => {
          onFiles(filesFromInput(e.target.files));
          e.target.value = "";
        }}
      />
    </div>
  );
}
