import { describe, expect, it } from "vitest";
import { hazardClassOf, hazardsOf } from "@/lib/hazards";
import { HAZARD_STATEMENTS, SUBSTANCES } from "@/lib/hazardSubstances";

// Classifications checked here are those of CLP Annex VI (Regulation (EC) No 1272/2008) or the
// suppliers' safety data sheets as written in lib/hazardSubstances.ts, all from memory there.
const codes = (s: Parameters<typeof hazardsOf>[0]) => hazardsOf(s).map((h) => h.code);

describe("hazard cautions", () => {
  it("flags cadmium, lead, arsenic and selenium compounds by element symbol", () => {
    expect(codes({ material: "CdSe" })).toEqual(["cadmium", "selenium"]);
    expect(codes({ material: "PbS" })).toEqual(["lead"]);
    expect(codes({ material: "InAs" })).toEqual(["arsenic"]);
    expect(codes({ material: "InP", coreShell: "InP/ZnS" })).toEqual([]);
    expect(codes({ material: "CsPbBr3" })).toEqual(["lead"]);
  });

  it("does not mistake other symbols that start with the same letters", () => {
    // Ca, Co, Ce, Pt, Pd, Ag, Al, Sn, S start with the same capitals but are other elements.
    expect(hazardsOf({ material: "CaF2" })).toEqual([]);
    expect(hazardsOf({ material: "Pd" })).toEqual([]);
    expect(hazardsOf({ material: "Ag2S" })).toEqual([]);
    expect(hazardsOf({ material: "SnS" })).toEqual([]);
  });

  it("never calls chloroform flammable, and states its toxicity (CLP Annex VI: H302, H331, H351, H372)", () => {
    const [flag] = hazardsOf({ material: "ZnS", solvent: "chloroform" });
    expect(flag?.code).toBe("chloroform");
    expect(flag?.caution).not.toMatch(/flammable liquid/);
    expect(flag?.caution).toMatch(/Not flammable/);
    expect(flag?.caution).toContain(HAZARD_STATEMENTS.H351);
    expect(flag?.caution).toContain(HAZARD_STATEMENTS.H372);
  });

  it("calls hexane and toluene highly flammable (CLP Annex VI: H225) and reads core/shell and ligand text", () => {
    expect(codes({ material: "InP", coreShell: "InP/CdS", solvent: "hexane" })).toEqual(["cadmium", "hexane"]);
    expect(hazardsOf({ material: "ZnS", solvent: "toluene" })[0]?.caution).toContain(HAZARD_STATEMENTS.H225);
    expect(codes({ material: "ZnS", ligand: "oleylamine", solvent: "octadecene" })).toEqual(["octadecene", "oleylamine"]);
    expect(hazardClassOf({ material: "ZnS", solvent: "water" })).toBe("none");
  });

  it("keeps cyclohexane, petroleum ether and octadecane out of entries that do not describe them", () => {
    expect(codes({ material: "ZnS", solvent: "cyclohexane" })).toEqual([]);
    expect(codes({ material: "ZnS", solvent: "petroleum ether" })).toEqual([]);
    expect(codes({ material: "ZnS", solvent: "octadecane" })).toEqual([]);
  });

  it("tells trioctylphosphine from its oxide", () => {
    expect(codes({ material: "ZnS", ligand: "trioctylphosphine oxide" })).toEqual(["trioctylphosphine-oxide"]);
    expect(codes({ material: "ZnS", ligand: "trioctylphosphine" })).toEqual(["trioctylphosphine"]);
  });

  it("every substance names its source, says whether it is from memory, and uses only known statements", () => {
    for (const s of SUBSTANCES) {
      expect(s.source, s.code).toMatch(/CLP Annex VI|supplier SDS/);
      expect(s.source, s.code).toMatch(/from memory/);
      expect(s.statements.length, s.code).toBeGreaterThan(0);
      for (const c of s.statements) expect(HAZARD_STATEMENTS[c], `${s.code} ${c}`).toBeTruthy();
      for (const f of hazardsOf({ material: "", ligand: s.label, solvent: s.label }).filter((f) => f.code === s.code))
        expect(f.source).toBe(s.source);
    }
    expect(new Set(SUBSTANCES.map((s) => s.code)).size).toBe(SUBSTANCES.length);
  });
});
