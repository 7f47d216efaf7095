// One date style on screen: day, month name and year ("2 Dec 2026"), with the time in UTC and
// the zone named ("2 Dec 2026, 13:03 UTC"), the same on server and client. Files use ISO 8601.

const DAY = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const TIME = new Intl.DateTimeFormat("en-GB", { hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone: "UTC" });

type DateInput = string | number | Date | null | undefined;

function toDate(value: DateInput): Date | null {
  if (value === null || value === undefined || value === "") return null;
  const d = value instanceof Date ? value : new Date(value);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** "2 Dec 2026", or "—" when there is no date. */
export function formatDay(value: DateInput): string {
  const d = toDate(value);
  return d ? DAY.format(d) : "—";
}

/** "2 Dec 2026, 13:03 UTC", or "—" when there is no date. */
export function formatWhen(value: DateInput): string {
  const d = toDate(value);
  return d ? `${DAY.format(d)}, ${TIME.format(d)} UTC` : "—";
}

/** The shape date fields take and show: ISO 8601 calendar dates ("2026-12-02"). */
export const ISO_DAY_PATTERN = "\\d{4}-\\d{2}-\\d{2}";
