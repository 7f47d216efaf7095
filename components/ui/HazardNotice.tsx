import { GENERAL_CAUTION, type HazardFlag } from "@/lib/hazards";

export function HazardNotice({ flags, compact = false }: { flags: HazardFlag[]; compact?: boolean }) {
  if (flags.length === 0) return null;
  if (compact) {
    return (
      <span className="inline-flex flex-wrap gap-1">
        {flags.map((f) => (
          <span
            key={f.code}
            title={`${f.caution}\nSource: ${f.source}`}
            className="rounded bg-caution-soft px-1.5 py-0.5 text-xs font-medium text-caution"
          >
            ⚠ {f.label}
          </span>
        ))}
      </span>
    );
  }
  return (
    <div role="note" aria-label="Safety cautions" className="rounded-lg border border-caution/40 bg-caution-soft px-4 py-3 text-sm">
      <p className="mb-1 font-semibold text-caution">⚠ Safety cautions</p>
      <ul className="list-disc space-y-0.5 pl-5 text-ink">
        {flags.map((f) => (
          <li key={f.code}>
            {f.caution} <span className="text-xs text-ink-soft">Source: {f.source}.</span>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-ink-soft">{GENERAL_CAUTION}</p>
    </div>
  );
}
