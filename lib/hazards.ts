import { techniqueSpec } from "@/lib/registry/techniques";

// Hazard cautions shown where samples are registered and displayed. Bandkeep does not
// assess risk: it points people to their institution's rules.

export type HazardFlag = { code: string; label: string; caution: string };

const ELEMENT_HAZARDS: { pattern: RegExp; flag: HazardFlag }[] = [
  {
    pattern: /Cd(?![a-z])/,
    flag: { code: "cadmium", label: "Cadmium compound", caution: "Cadmium compounds are toxic and carcinogenic: handle as hazardous, avoid dusts and skin contact, and collect waste separately." },
  },
  {
    pattern: /Pb(?![a-z])/,
    flag: { code: "lead", label: "Lead compound", caution: "Lead compounds are toxic, including to reproduction: avoid ingestion and dusts, and collect waste separately." },
  },
  {
    pattern: /As(?![a-z])/,
    flag: { code: "arsenic", label: "Arsenic compound", caution: "Arsenic compounds are toxic and carcinogenic; some precursors release arsine: work in a fume hood." },
  },
  {
    pattern: /Hg(?![a-z])/,
    flag: { code: "mercury", label: "Mercury compound", caution: "Mercury compounds are highly toxic: avoid skin contact and vapours." },
  },
];

const FLAMMABLE_SOLVENTS = /(hexane|heptane|octane|toluene|chloroform|methanol|ethanol|acetone|octadecene|tetrahydrofuran|thf|ether|isopropanol|2-propanol)/i;

export const GENERAL_CAUTION =
  "Follow your institution's chemical hygiene plan, local regulations and licensed practice; these notes do not replace them.";

export const LIGHT_CAUTION =
  "Photoluminescence work uses UV lamps and lasers: use the eye and skin protection your laser safety officer specifies.";

/** Cautions for a sample from its material, core/shell and solvent text. */
export function hazardsOf(sample: { material: string; coreShell?: string; solvent?: string }): HazardFlag[] {
  const text = `${sample.material} ${sample.coreShell ?? ""}`;
  const flags = ELEMENT_HAZARDS.filter((h) => h.pattern.test(text)).map((h) => h.flag);
  if (sample.solvent && FLAMMABLE_SOLVENTS.test(sample.solvent)) {
    flags.push({ code: "flammable-solvent", label: "Flammable solvent", caution: `${sample.solvent.charAt(0).toUpperCase()}${sample.solvent.slice(1)} is flammable: keep away from ignition sources and store in approved cabinets.` });
  }
  return flags;
}

/** The stored hazard class: the most serious flag's code, or "none". */
export function hazardClassOf(sample: { material: string; coreShell?: string; solvent?: string }): string {
  return hazardsOf(sample)[0]?.code ?? "none";
}

/** True when the technique calls for the UV and laser light caution (lib/registry/techniques.ts). */
export function usesUvOrLaserLight(technique: string): boolean {
  const spec = techniqueSpec(technique);
  return spec !== undefined && spec.cautions.includes("uv-laser-light");
}
