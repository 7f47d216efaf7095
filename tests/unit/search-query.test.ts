import { describe, expect, it } from "vitest";
import { bandRangeEv, HC_EV_CM, HC_EV_NM } from "@/lib/search/bandRangeEv";
import { countText } from "@/lib/search/fastCount";
import { decodeCursor, encodeCursor } from "@/lib/search/keysetCursor";
import { containsPattern } from "@/lib/search/spectrumFilterSql";
import { searchQueryString, spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";

describe("bandRangeEv", () => {
  it("uses hc from CODATA 2018 (h = 6.62607015e-34 J s, c = 299792458 m/s, e = 1.602176634e-19 C, all exact)", () => {
    const hcEvM = (6.62607015e-34 * 299792458) / 1.602176634e-19;
    expect(HC_EV_NM).toBeCloseTo(hcEvM * 1e9, 5);
    expect(HC_EV_CM).toBeCloseTo(hcEvM * 1e2, 12);
  });

  it("turns a wavelength range round: 570–590 nm is 2.1014–2.1752 eV", () => {
    const { minEv, maxEv } = bandRangeEv(570, 590, "nm");
    expect(minEv).toBeCloseTo(1239.841984 / 590, 9);
    expect(maxEv).toBeCloseTo(1239.841984 / 570, 9);
    expect(minEv).toBeLessThan(maxEv);
  });

  it("1 eV is 8065.544 cm⁻¹ (CODATA 2018: 8065.543937… cm⁻¹ per eV) and eV passes through", () => {
    const { minEv, maxEv } = bandRangeEv(8065.543937, 2 * 8065.543937, "cm-1");
    expect(minEv).toBeCloseTo(1, 7);
    expect(maxEv).toBeCloseTo(2, 7);
    expect(bandRangeEv(2.2, 2.1, "eV")).toEqual({ minEv: 2.1, maxEv: 2.2 });
  });

  it("refuses a bound that is not a positive number", () => {
    expect(() => bandRangeEv(0, 590, "nm")).toThrow(new RangeError("band min must be a positive number, got 0"));
    expect(() => bandRangeEv(570, Number.NaN, "nm")).toThrow(RangeError);
  });
});

describe("keyset cursor", () => {
  it("round-trips a position and rejects text it did not write", () => {
    const position = { at: "2026-03-05T10:00:00.123456Z", id: "8f0e1c2a-1b2c-4d3e-8f4a-5b6c7d8e9f00" };
    expect(decodeCursor(encodeCursor(position))).toEqual(position);
    expect(decodeCursor("not-a-cursor")).toBeNull();
    expect(decodeCursor(Buffer.from("2026-03-05|x'; DROP TABLE spectra;--").toString("base64url"))).toBeNull();
  });
});

describe("search query string", () => {
  it("is the same for the same search whatever the order or blanks of the URL", () => {
    const a = spectrumSearchSchema.parse({ bandMax: "590", band: "first-exciton", bandMin: "570", q: "", technique: "absorption" });
    const b = spectrumSearchSchema.parse({
      technique: "absorption",
      band: "first-exciton",
      bandMin: "570",
      bandMax: "590",
      bandUnit: "nm",
    });
    expect(searchQueryString(a)).toBe(searchQueryString(b));
    expect(searchQueryString(a)).toBe("technique=absorption&band=first-exciton&bandMin=570&bandMax=590");
    expect(searchQueryString(spectrumSearchSchema.parse({ band: "band", bandMin: "2900", bandMax: "2950", bandUnit: "cm-1" }))).toContain(
      "bandUnit=cm-1",
    );
  });

  it("takes % _ and \\ in text literally in ILIKE patterns", () => {
    expect(containsPattern("100%_a\\b")).toBe("%100\\%\\_a\\\\b%");
  });

  it("says 'about' only for estimates, rounded to two significant figures", () => {
    expect(countText({ value: 137, exact: true })).toBe("137");
    expect(countText({ value: 123_456, exact: false })).toBe("about 120,000");
  });
});
