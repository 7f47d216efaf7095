/** One titled panel of the spectrum page's side column. */
export function SidePanel({ title, children, testId }: { title: string; children: React.ReactNode; testId?: string }) {
  return (
    <section className="rounded-lg border border-stone-200 bg-white p-4 text-sm" data-testid={testId}>
      <h2 className="mb-2 text-sm font-semibold text-ink-soft">{title}</h2>
      {children}
    </section>
  );
}
