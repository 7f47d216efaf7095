import { describe, expect, it } from "vitest";
import { hazardClassOf, hazardsOf } from "@/lib/hazards";

describe("hazard cautions", () => {
  it("flags cadmium, lead and arsenic compounds by element symbol", () => {
    expect(hazardsOf({ material: "CdSe" }).map((h) => h.code)).toEqual(["cadmium"]);
    expect(hazardsOf({ material: "PbS" }).map((h) => h.code)).toEqual(["lead"]);
    expect(hazardsOf({ material: "InAs" }).map((h) => h.code)).toEqual(["arsenic"]);
    expect(hazardsOf({ material: "InP", coreShell: "InP/ZnSe/ZnS" })).toEqual([]);
    expect(hazardsOf({ material: "CsPbBr3" }).map((h) => h.code)).toEqual(["lead"]);
  });

  it("does not mistake other symbols that start with the same letters", () => {
    // Ca, Co, Ce, Pt, Pd, Ag, Al start with the same capitals but are other elements.
    expect(hazardsOf({ material: "CaF2" })).toEqual([]);
    expect(hazardsOf({ material: "Pd" })).toEqual([]);
    expect(hazardsOf({ material: "Ag2S" })).toEqual([]);
  });

  it("adds a flammable-solvent caution and reads core/shell text too", () => {
    const codes = hazardsOf({ material: "InP", coreShell: "InP/CdS", solvent: "hexane" }).map((h) => h.code);
    expect(codes).toEqual(["cadmium", "flammable-solvent"]);
    expect(hazardClassOf({ material: "ZnSe", solvent: "water" })).toBe("none");
  });
});
