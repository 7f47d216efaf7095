import { describe, expect, it } from "vitest";
import { COLUMNS_MEDIA_TYPE, decodeColumns, encodeColumns } from "@/lib/spectrum-view/columnsFormat";

// The binary columns format of the data endpoint (lib/spectrum-view/columnsFormat.ts).
describe("columns format", () => {
  const x = Float64Array.from({ length: 1001 }, (_, i) => 400 + i * 0.175123456789);
  const y = Float64Array.from({ length: 1001 }, (_, i) => Math.sin(i / 50) * 0.3 + 1e-4 * i);

  it("round-trips X exactly (float64) and curves to float32 precision, missing values as NaN", () => {
    const withGap = Float64Array.from(y);
    withGap[10] = Number.NaN;
    withGap[11] = Number.POSITIVE_INFINITY;
    const bytes = encodeColumns({ points: x.length, runId: "r1", axis: "nm" }, [
      { name: "x", type: "f64", values: x },
      { name: "smoothed", type: "f32", values: withGap },
    ]);
    const { head, columns } = decodeColumns(bytes);
    expect(head).toMatchObject({
      points: 1001,
      runId: "r1",
      axis: "nm",
      columns: [
        { name: "x", type: "f64" },
        { name: "smoothed", type: "f32" },
      ],
    });
    expect(Array.from(columns.x!)).toEqual(Array.from(x));
    expect(Number.isNaN(columns.smoothed![10]!)).toBe(true);
    expect(Number.isNaN(columns.smoothed![11]!), "non-finite values travel as NaN").toBe(true);
    for (let i = 20; i < y.length; i += 7) {
      // Math.fround is IEEE 754 binary32 rounding (ECMA-262 §21.3.2.17): the exact expected value
      expect(columns.smoothed![i]).toBe(Math.fround(y[i]!));
    }
  });

  it("aligns the columns on 8 bytes after a head of any length, and the size is what the layout says", () => {
    for (const pad of ["", "a", "abcdefg"]) {
      const bytes = encodeColumns({ points: 3, note: pad }, [
        { name: "x", type: "f64", values: [1, 2, 3] },
        { name: "raw", type: "f32", values: [4, 5, 6] },
      ]);
      const headLength = new DataView(bytes.buffer).getUint32(4, true);
      const dataStart = Math.ceil((8 + headLength) / 8) * 8;
      expect(bytes.length).toBe(dataStart + 3 * 8 + 3 * 4);
      expect(Array.from(decodeColumns(bytes).columns.raw!)).toEqual([4, 5, 6]);
    }
  });

  it("refuses bodies that are not in the format or are cut short, and columns of the wrong length", () => {
    expect(() => decodeColumns(new TextEncoder().encode('{"x":[1,2]}'))).toThrow(/magic/);
    const bytes = encodeColumns({ points: 100 }, [{ name: "x", type: "f64", values: new Float64Array(100) }]);
    expect(() => decodeColumns(bytes.slice(0, bytes.length - 8))).toThrow(/truncated \(column x\)/);
    expect(() => encodeColumns({ points: 5 }, [{ name: "x", type: "f64", values: [1, 2] }])).toThrow(/column x has 2 values/);
    expect(COLUMNS_MEDIA_TYPE).toMatch(/^application\/vnd\./); // RFC 6838 vendor tree
  });
});
