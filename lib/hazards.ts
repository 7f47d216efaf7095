import { techniqueSpec } from "@/lib/registry/techniques";

// Hazard cautions shown where samples are registered and displayed. Bandkeep does not
// assess risk: it names what the sample's text contains, quotes the classification with its
// source (lib/hazardSubstances.ts), and points people to their institution's rules.
import { HAZARD_STATEMENTS, SUBSTANCES, type SubstanceHazard } from "@/lib/hazardSubstances";

export type HazardFlag = { code: string; label: string; caution: string; source: string };

export const GENERAL_CAUTION =
  "Follow your institution's chemical hygiene plan, the supplier's safety data sheet, local regulations and licensed practice; these notes do not replace them.";

/** Source: IEC 60825-1 (laser product classes) and common practice for UV lamps. */
export const LIGHT_CAUTION =
  "Photoluminescence work uses UV lamps and lasers: use the eye and skin protection your laser safety officer specifies.";

function sentence(s: SubstanceHazard): string {
  const phrases = s.statements.map((c) => HAZARD_STATEMENTS[c]);
  const text = `${s.label}: ${phrases.join("; ")} (${s.statements.join(", ")}).`;
  return s.note ? `${text} ${s.note}` : text;
}

function toFlag(s: SubstanceHazard): HazardFlag {
  return { code: s.code, label: s.label, caution: sentence(s), source: s.source };
}

/** Cautions for a sample from its material, core/shell, ligand and solvent text, most serious first. */
export function hazardsOf(sample: {
  material: string;
  coreShell?: string | null;
  ligand?: string | null;
  solvent?: string | null;
}): HazardFlag[] {
  const formula = `${sample.material} ${sample.coreShell ?? ""}`;
  const names = `${sample.ligand ?? ""} ${sample.solvent ?? ""}`;
  return SUBSTANCES.filter((s) => s.pattern.test(s.group === "element" ? formula : names)).map(toFlag);
}

/** The stored hazard class: the most serious flag's code, or "none". */
export function hazardClassOf(sample: {
  material: string;
  coreShell?: string | null;
  ligand?: string | null;
  solvent?: string | null;
}): string {
  return hazardsOf(sample)[0]?.code ?? "none";
}

/** True when the technique calls for the UV and laser light caution (lib/registry/techniques.ts). */
export function usesUvOrLaserLight(technique: string): boolean {
  const spec = techniqueSpec(technique);
  return spec !== undefined && spec.cautions.includes("uv-laser-light");
}
