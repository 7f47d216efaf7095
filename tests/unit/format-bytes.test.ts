import { describe, expect, it } from "vitest";
import { formatBytes } from "@/lib/format/bytes";

// Binary prefixes: IEC 80000-13 (1 KiB = 1024 B).
describe("formatBytes", () => {
  it("keeps small files in whole bytes instead of 0.0 KiB", () => {
    expect(formatBytes(8)).toBe("8 B");
    expect(formatBytes(1023)).toBe("1023 B");
  });
  it("uses KiB, MiB and GiB at powers of 1024", () => {
    expect(formatBytes(1024)).toBe("1.0 KiB");
    expect(formatBytes(1536)).toBe("1.5 KiB");
    expect(formatBytes(20 * 1024 * 1024)).toBe("20 MiB");
    expect(formatBytes(3 * 1024 ** 3)).toBe("3.0 GiB");
  });
});
