// Turns what was dropped or picked (files, folders, zips) into a flat list of files with
// the path they had inside a dropped folder.

export type PickedFile = { file: File; name: string };

const hidden = (name: string) => name.split("/").some((part) => part.startsWith(".") || part === "__MACOSX");

type Entry = {
  isFile: boolean;
  isDirectory: boolean;
  fullPath: string;
  file?: (ok: (f: File) => void, err: (e: unknown) => void) => void;
  createReader?: () => { readEntries: (ok: (entries: Entry[]) => void, err: (e: unknown) => void) => void };
};

async function walk(entry: Entry, out: PickedFile[]): Promise<void> {
  if (entry.isFile && entry.file) {
    const file = await new Promise<File>((ok, err) => entry.file!(ok, err));
    const name = entry.fullPath.replace(/^\/+/, "") || file.name;
    if (!hidden(name)) out.push({ file, name });
    return;
  }
  if (entry.isDirectory && entry.createReader) {
    const reader = entry.createReader();
    // readEntries returns at most ~100 entries per call: read until it returns none.
    for (;;) {
      const batch = await new Promise<Entry[]>((ok, err) => reader.readEntries(ok, err));
      if (batch.length === 0) break;
      for (const child of batch) await walk(child, out);
    }
  }
}

export async function filesFromDrop(data: DataTransfer): Promise<PickedFile[]> {
  const out: PickedFile[] = [];
  const entries = Array.from(data.items)
    .filter((i) => i.kind === "file")
    .map((i) => (i as DataTransferItem & { webkitGetAsEntry?: () => Entry | null }).webkitGetAsEntry?.() ?? null);
  if (entries.length > 0 && entries.every((e) => e !== null)) {
    for (const e of entries) await walk(e as Entry, out);
    return out;
  }
  return Array.from(data.files)
    .filter((f) => !hidden(f.name))
    .map((file) => ({ file, name: file.name }));
}

export function filesFromInput(list: FileList | null): PickedFile[] {
  return Array.from(list ?? [])
    .map((file) => ({ file, name: (file as File & { webkitRelativePath?: string }).webkitRelativePath || file.name }))
    .filter((p) => !hidden(p.name));
}
