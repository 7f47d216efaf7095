/** The review page's URL with some query parameters changed (undefined or "" removes one). */
export function queueHref(current: Record<string, string>, changes: Record<string, string | number | undefined>): string {
  const params = new URLSearchParams();
  const merged: Record<string, string | number | undefined> = { ...current, ...changes };
  for (const [k, v] of Object.entries(merged)) if (v !== undefined && v !== "") params.set(k, String(v));
  const qs = params.toString();
  return qs ? `/review?${qs}` : "/review";
}
