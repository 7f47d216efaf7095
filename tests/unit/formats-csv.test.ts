import { describe, expect, it } from "vitest";
import { csvCell, csvLine, writeCsvTable } from "@/lib/formats/csv";
import { writeCsv } from "@/lib/spectrum-view/writeCsv";

// OWASP "CSV Injection": cells starting with = + - @ (and tab, CR) are run as formulas by
// spreadsheet programs; the mitigation is a leading apostrophe. Quoting per RFC 4180 §2.
describe("csvCell", () => {
  it.each([
    ['=HYPERLINK("http://evil.example")', '"\'=HYPERLINK(""http://evil.example"")"'],
    ["+1+cmd|' /C calc'!A0", "'+1+cmd|' /C calc'!A0"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1:A9)", "'@SUM(A1:A9)"],
    ["\tTAB", "'\tTAB"],
  ])("guards formula text %j", (text, expected) => {
    expect(csvCell(text)).toBe(expected);
  });

  it("leaves plain text, numbers and negative numbers alone, and quotes per RFC 4180", () => {
    expect(csvCell("CdSe batch 12")).toBe("CdSe batch 12");
    expect(csvCell(-0.25)).toBe("-0.25");
    expect(csvCell(Number.NaN)).toBe("");
    expect(csvCell(null)).toBe("");
    expect(csvCell("a,b")).toBe('"a,b"');
    expect(csvCell("line\nbreak")).toBe('"line\nbreak"');
    expect(csvLine(["x", 1, null])).toBe("x,1,");
  });

  it("is what the spectrum CSV export writes for a column named like a formula", () => {
    const csv = writeCsv(
      { axis: "nm", x: new Float64Array([400, 401]), series: { measured: new Float64Array([-0.1, 0.2]) } },
      { columnNames: { measured: "=cmd|' /C calc'!A0" }, metadata: { sample: "@evil", pathLengthCm: 1 } },
    );
    expect(csv.split("\r\n")).toEqual([
      "sample,'@evil",
      "pathLengthCm,1",
      "wavelength (nm),'=cmd|' /C calc'!A0",
      "400,-0.1",
      "401,0.2",
      "",
    ]);
  });
});

// RFC 4180 §2: CRLF line ends, a line end after the last record allowed; every line of a table has the header's field count.
describe("writeCsvTable", () => {
  it("writes metadata, the header and one line per point, CRLF-ended, empty cells for non-finite numbers", () => {
    const csv = writeCsvTable({
      metadata: { spectrum: "a,b.csv" },
      header: ["x_nm", "y_absorbance"],
      columns: [
        [400, 401],
        [0.5, Number.NaN],
      ],
    });
    expect(csv).toBe('spectrum,"a,b.csv"\r\nx_nm,y_absorbance\r\n400,0.5\r\n401,\r\n');
  });
  it("refuses columns of different lengths, naming the column", () => {
    expect(() => writeCsvTable({ header: ["x", "y"], columns: [[1, 2], [1]] })).toThrow(
      new RangeError("column y has 1 values for 2 points"),
    );
  });
});
