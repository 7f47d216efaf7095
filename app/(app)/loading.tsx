export default function Loading() {
  return (
    <div aria-busy="true" aria-label="Loading" className="animate-pulse space-y-3">
      <div className="h-8 w-64 rounded bg-stone-200" />
      <div className="h-4 w-96 rounded bg-stone-200" />
      <div className="h-48 rounded-lg bg-stone-200" />
    </div>
  );
}
