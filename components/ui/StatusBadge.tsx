const STYLES: Record<string, { label: string; className: string }> = {
  received: { label: "received", className: "bg-stone-100 text-ink-soft" },
  queued: { label: "waiting", className: "bg-stone-100 text-ink-soft" },
  analysing: { label: "analysing", className: "bg-sky-100 text-sky-800" },
  analysed: { label: "analysed", className: "bg-leaf-soft text-leaf" },
  failed: { label: "could not read", className: "bg-red-100 text-red-800" },
  awaiting: { label: "awaiting review", className: "bg-glow-soft text-glow-deep" },
  confirmed: { label: "confirmed", className: "bg-leaf-soft text-leaf" },
  dismissed: { label: "dismissed", className: "bg-stone-200 text-ink-soft" },
};

export function StatusBadge({ status }: { status: string }) {
  const style = STYLES[status] ?? { label: status, className: "bg-stone-100 text-ink-soft" };
  return <span className={`rounded-full px-2 py-0.5 text-xs font-medium ${style.className}`}>{style.label}</span>;
}
