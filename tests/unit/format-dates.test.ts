import { describe, expect, it } from "vitest";
import { formatDay, formatWhen, ISO_DAY_PATTERN } from "@/lib/format/dates";

// ISO 8601 instants in, one unambiguous style out (month as a name, 24-hour UTC time).
describe("date formatting", () => {
  it("writes the month as a word so 02/12 and 12/02 cannot be confused", () => {
    expect(formatDay("2026-12-02T13:03:00Z")).toBe("2 Dec 2026");
    expect(formatDay("2026-02-12T00:00:00Z")).toBe("12 Feb 2026");
  });
  it("names the time zone and uses 24-hour UTC time whatever the machine's zone", () => {
    expect(formatWhen("2026-12-02T13:03:59Z")).toBe("2 Dec 2026, 13:03 UTC");
    expect(formatWhen("2026-12-02T23:30:00-02:00")).toBe("3 Dec 2026, 01:30 UTC");
    expect(formatWhen(new Date(Date.UTC(2026, 0, 5, 0, 7)))).toBe("5 Jan 2026, 00:07 UTC");
  });
  it("shows a dash for no date or an unreadable one", () => {
    expect(formatWhen(null)).toBe("—");
    expect(formatDay("not a date")).toBe("—");
  });
  it("date fields accept ISO 8601 calendar dates only", () => {
    const re = new RegExp(`^${ISO_DAY_PATTERN}$`);
    expect(re.test("2026-12-02")).toBe(true);
    expect(re.test("02/12/2026")).toBe(false);
  });
});
