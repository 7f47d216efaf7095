import { formatBytes } from "@/lib/format/bytes";
import { formatWhen } from "@/lib/format/dates";
import type { SpectrumDetail } from "@/lib/queries/spectrum-detail";
import { SidePanel } from "./SidePanel";

/** How the spectrum was measured and the stored file's identity. */
export function AcquisitionPanel({ s }: { s: Pick<SpectrumDetail, "acquisition" | "createdAt" | "sha256" | "sizeBytes"> }) {
  return (
    <SidePanel title="Acquisition">
      <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
        {s.acquisition.map((a) => (
          <div key={a.label} className="contents">
            <dt className="text-ink-soft">{a.label}</dt>
            <dd>{a.value}</dd>
          </div>
        ))}
        <dt className="text-ink-soft">Uploaded</dt>
        <dd>{formatWhen(s.createdAt)}</dd>
        <dt className="text-ink-soft">sha256</dt>
        <dd className="truncate font-mono text-xs" title={s.sha256}>
          {s.sha256}
        </dd>
        <dt className="text-ink-soft">Size</dt>
        <dd>{formatBytes(s.sizeBytes)}</dd>
      </dl>
    </SidePanel>
  );
}
