import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { DEFAULT_THRESHOLDS, FLAG_KIND_SPECS, FLAG_KINDS, THRESHOLD_SPECS, kindLabel } from "@/lib/registry/flagKinds";
import { TECHNIQUES } from "@/lib/registry/techniques";
import { BAND_ROLE_LABELS, TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { inCheck, valuesOfCheck } from "@/lib/registry/sqlChecks";

describe("flag-kind registry", () => {
  it("names each threshold once, with its default inside its own bounds", () => {
    const names = THRESHOLD_SPECS.map((t) => t.name);
    expect(new Set(names).size).toBe(names.length);
    for (const t of THRESHOLD_SPECS) {
      expect(t.default, t.name).toBeGreaterThan(t.min);
      expect(t.default, t.name).toBeLessThanOrEqual(t.max);
    }
  });

  it("gives each kind its own marker colour, so two kinds never look alike on the chart", () => {
    const colours = FLAG_KINDS.map((k) => FLAG_KIND_SPECS[k].colour.toLowerCase());
    expect(new Set(colours).size).toBe(colours.length);
  });

  it("names a kind in the words of the spectrum's technique: an emission shift in PL, never an exciton's", () => {
    expect(kindLabel("shift", "pl")).toBe("Emission shift");
    expect(kindLabel("shift", "absorption")).toBe("Exciton shift");
    expect(kindLabel("broadening", "ir")).toBe("Band broadening");
    // a filter that spans techniques uses the general word
    expect(kindLabel("shift")).toBe("Shift");
    // the bleach is measured on absorption only (lib/engine/compare/compareSpectra.ts)
    for (const k of FLAG_KINDS.filter((kind) => kind !== "bleach")) {
      expect(kindLabel(k, "pl"), k).not.toMatch(/exciton/i);
      expect(kindLabel(k, "ir"), k).not.toMatch(/exciton/i);
    }
    for (const t of TECHNIQUES) expect(kindLabel("pl-quench", t)).toBe("PL quench");
  });

  it("states the defaults docs/analysis-json.md states", () => {
    const doc = readFileSync("docs/analysis-json.md", "utf8");
    const line = doc.split("\n").find((l) => l.startsWith("| `parameters.thresholds`"))!;
    const stated = Object.fromEntries([...line.matchAll(/`(min\w+)` ([\d.]+)/g)].map((m) => [m[1], Number(m[2])]));
    expect(stated).toEqual({ ...DEFAULT_THRESHOLDS });
  });
});

describe("technique registry", () => {
  it("writes the JCAMP-DX data types of the standard for absorption and IR (McDonald & Wilks, Appl. Spectrosc. 1988, 42, 151)", () => {
    expect(TECHNIQUE_SPECS.absorption.jcampDataType).toBe("UV/VIS SPECTRUM");
    expect(TECHNIQUE_SPECS.ir.jcampDataType).toBe("INFRARED SPECTRUM");
  });

  it("applies the energy Jacobian to emission only (Mooney & Kambhampati, J. Phys. Chem. Lett. 2013, 4, 3316)", () => {
    expect(TECHNIQUE_SPECS.pl.jacobian).toBe(true);
    expect(TECHNIQUE_SPECS.absorption.jacobian).toBe(false); // absorbance is not a density per unit of the axis
    expect(TECHNIQUE_SPECS.ir.jacobian).toBe(false);
  });

  it("names every technique's band role with a label", () => {
    for (const spec of Object.values(TECHNIQUE_SPECS)) expect(BAND_ROLE_LABELS[spec.bandRole]).toMatch(/\w/);
  });
});

describe("SQL checks", () => {
  it("round-trips the values through PostgreSQL's written form of an IN check", () => {
    expect(inCheck({ column: "kind", nullable: false }, ["bleach", "new-band"])).toBe("CHECK (kind IN ('bleach', 'new-band'))");
    // pg_get_constraintdef's form of the same check (PostgreSQL 15+ rewrites IN to = ANY (ARRAY[...]))
    expect(valuesOfCheck("CHECK ((kind = ANY (ARRAY['bleach'::text, 'new-band'::text])))")).toEqual(["bleach", "new-band"]);
  });

  it("refuses a key that could break out of the SQL literal", () => {
    expect(() => inCheck({ column: "kind", nullable: false }, ["bad'); DROP TABLE x; --"])).toThrow(RangeError);
  });
});
