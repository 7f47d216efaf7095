// The substances Bandkeep recognises in a sample's material, core/shell, ligand and solvent text,
// with the hazard statements shown for each and where each statement comes from. Bandkeep does
// not assess risk: these notes point people to the safety data sheet and their institution's rules.
//
// Sources: "CLP Annex VI" is the harmonised classification of Regulation (EC) No 1272/2008,
// Annex VI, Table 3 (the GHS classification in the EU); "supplier SDS" is the classification that
// suppliers' safety data sheets give where no harmonised one exists. Every entry was written from
// memory of those sources (no copy at hand when it was written) and says so; the supplier's SDS
// for the lot in use is the authority.

/** GHS hazard statements used below (wording of the GHS / CLP Annex III). */
export const HAZARD_STATEMENTS = {
  H224: "extremely flammable liquid and vapour",
  H225: "highly flammable liquid and vapour",
  H300: "fatal if swallowed",
  H301: "toxic if swallowed",
  H302: "harmful if swallowed",
  H304: "may be fatal if swallowed and enters airways",
  H310: "fatal in contact with skin",
  H311: "toxic in contact with skin",
  H312: "harmful in contact with skin",
  H314: "causes severe skin burns and eye damage",
  H315: "causes skin irritation",
  H319: "causes serious eye irritation",
  H330: "fatal if inhaled",
  H331: "toxic if inhaled",
  H332: "harmful if inhaled",
  H335: "may cause respiratory irritation",
  H336: "may cause drowsiness or dizziness",
  H341: "suspected of causing genetic defects",
  H350: "may cause cancer",
  H351: "suspected of causing cancer",
  H360: "may damage fertility or the unborn child",
  H361: "suspected of damaging fertility or the unborn child",
  H370: "causes damage to organs",
  H372: "causes damage to organs through prolonged or repeated exposure",
  H373: "may cause damage to organs through prolonged or repeated exposure",
  H400: "very toxic to aquatic life",
  H410: "very toxic to aquatic life with long lasting effects",
  H411: "toxic to aquatic life with long lasting effects",
  H413: "may cause long lasting harmful effects to aquatic life",
  EUH019: "may form explosive peroxides",
} as const;

export type HazardStatementCode = keyof typeof HAZARD_STATEMENTS;

export type SubstanceGroup = "element" | "solvent" | "ligand";

export interface SubstanceHazard {
  /** Stable code, stored as a sample's hazard class when it is the most serious one. */
  code: string;
  group: SubstanceGroup;
  label: string;
  /** Matches the substance in free text (material formula for elements; names for the rest). */
  pattern: RegExp;
  statements: readonly HazardStatementCode[];
  /** One practical line after the statements, where the statements alone would mislead. */
  note?: string;
  source: string;
}

const CLP = "CLP Annex VI (harmonised classification), from memory";
const SDS = "supplier SDS classification, from memory";

/** Ordered from the most to the least serious; the first match is a sample's hazard class. */
export const SUBSTANCES: readonly SubstanceHazard[] = [
  {
    code: "cadmium",
    group: "element",
    label: "Cadmium compound",
    pattern: /Cd(?![a-z])/,
    statements: ["H350", "H341", "H361", "H372", "H302", "H312", "H332", "H410"],
    note: "Avoid dusts and skin contact and collect waste separately.",
    source: `${CLP}: cadmium compounds group entry (H302, H312, H332, H410); cadmium oxide and sulfide also Carc. 1B H350, Muta. 2 H341, Repr. 2 H361, STOT RE 1 H372`,
  },
  {
    code: "lead",
    group: "element",
    label: "Lead compound",
    pattern: /Pb(?![a-z])/,
    statements: ["H360", "H302", "H332", "H373", "H410"],
    note: "Avoid ingestion and dusts and collect waste separately.",
    source: `${CLP}: lead compounds group entry (Repr. 1A H360Df, Acute Tox. 4 H302/H332, STOT RE 2 H373, H400/H410)`,
  },
  {
    code: "arsenic",
    group: "element",
    label: "Arsenic compound",
    pattern: /As(?![a-z])/,
    statements: ["H350", "H301", "H331", "H410"],
    note: "Some arsenic precursors release arsine: work in a fume hood.",
    source: `${CLP}: arsenic compounds group entry (Acute Tox. 3 H301/H331, H400/H410); many arsenic compounds also Carc. 1A H350`,
  },
  {
    code: "mercury",
    group: "element",
    label: "Mercury compound",
    pattern: /Hg(?![a-z])/,
    statements: ["H300", "H310", "H330", "H373", "H410"],
    source: `${CLP}: inorganic mercury compounds group entry`,
  },
  {
    code: "selenium",
    group: "element",
    label: "Selenium compound",
    pattern: /Se(?![a-z])/,
    statements: ["H301", "H331", "H373", "H413"],
    source: `${CLP}: selenium compounds group entry`,
  },
  {
    code: "chloroform",
    group: "solvent",
    label: "Chloroform",
    pattern: /chloroform|trichloromethane/i,
    statements: ["H302", "H331", "H315", "H319", "H351", "H361", "H372"],
    note: "Not flammable; the harm is toxicity (liver and kidneys on repeated exposure): use a fume hood.",
    source: `${CLP}: chloroform`,
  },
  {
    code: "dichloromethane",
    group: "solvent",
    label: "Dichloromethane",
    pattern: /dichloromethane|methylene chloride|\bdcm\b/i,
    statements: ["H351", "H315", "H319", "H336"],
    note: "Not flammable; use a fume hood.",
    source: `${CLP} (H351); ${SDS} (H315, H319, H336)`,
  },
  {
    code: "tetrachloroethylene",
    group: "solvent",
    label: "Tetrachloroethylene",
    pattern: /tetrachloroethylene|perchloroethylene|\bpce\b/i,
    statements: ["H351", "H411"],
    note: "Not flammable; use a fume hood.",
    source: `${CLP}: tetrachloroethylene`,
  },
  {
    code: "methanol",
    group: "solvent",
    label: "Methanol",
    pattern: /methanol/i,
    statements: ["H225", "H301", "H311", "H331", "H370"],
    source: `${CLP}: methanol`,
  },
  {
    code: "hexane",
    group: "solvent",
    label: "Hexane",
    pattern: /(?<!cyclo)hexanes?\b/i,
    statements: ["H225", "H304", "H315", "H336", "H361", "H373", "H411"],
    source: `${CLP}: n-hexane`,
  },
  {
    code: "toluene",
    group: "solvent",
    label: "Toluene",
    pattern: /toluene/i,
    statements: ["H225", "H304", "H315", "H336", "H361", "H373"],
    source: `${CLP}: toluene`,
  },
  {
    code: "tetrahydrofuran",
    group: "solvent",
    label: "Tetrahydrofuran",
    pattern: /tetrahydrofuran|\bthf\b/i,
    statements: ["H225", "H302", "H319", "H335", "H351", "EUH019"],
    source: `${CLP}: tetrahydrofuran`,
  },
  {
    code: "diethyl-ether",
    group: "solvent",
    label: "Diethyl ether",
    pattern: /diethyl ether|(?<!petroleum )\bether\b/i,
    statements: ["H224", "H302", "H336", "EUH019"],
    source: `${CLP}: diethyl ether`,
  },
  {
    code: "heptane",
    group: "solvent",
    label: "Heptane",
    pattern: /heptane/i,
    statements: ["H225", "H304", "H315", "H336", "H410"],
    source: `${CLP}: n-heptane`,
  },
  {
    code: "octane",
    group: "solvent",
    label: "Octane",
    pattern: /\boctane\b/i,
    statements: ["H225", "H304", "H315", "H336", "H410"],
    source: `${CLP}: n-octane`,
  },
  {
    code: "acetone",
    group: "solvent",
    label: "Acetone",
    pattern: /acetone/i,
    statements: ["H225", "H319", "H336"],
    source: `${CLP}: acetone`,
  },
  {
    code: "isopropanol",
    group: "solvent",
    label: "Isopropanol",
    pattern: /isopropanol|2-propanol|propan-2-ol|\bipa\b/i,
    statements: ["H225", "H319", "H336"],
    source: `${CLP}: propan-2-ol`,
  },
  {
    code: "ethanol",
    group: "solvent",
    label: "Ethanol",
    pattern: /ethanol/i,
    statements: ["H225", "H319"],
    source: `${CLP} (H225); ${SDS} (H319)`,
  },
  {
    code: "octadecene",
    group: "solvent",
    label: "1-Octadecene",
    pattern: /octadecene|\bode\b/i,
    statements: ["H304"],
    note: "Combustible but not classed as flammable (flash point well above 60 °C); hot reaction mixtures are a burn and fire risk.",
    source: `${SDS}: 1-octadecene`,
  },
  {
    code: "oleylamine",
    group: "ligand",
    label: "Oleylamine",
    pattern: /oleylamine|\bolam\b/i,
    statements: ["H302", "H304", "H314", "H335", "H373", "H410"],
    source: `${SDS}: oleylamine`,
  },
  {
    code: "trioctylphosphine",
    group: "ligand",
    label: "Trioctylphosphine",
    pattern: /trioctylphosphine(?! oxide)|\btop\b/i,
    statements: ["H314"],
    note: "Air-sensitive: handle under inert gas.",
    source: `${SDS}: trioctylphosphine`,
  },
  {
    code: "trioctylphosphine-oxide",
    group: "ligand",
    label: "Trioctylphosphine oxide",
    pattern: /trioctylphosphine oxide|\btopo\b/i,
    statements: ["H315", "H319"],
    source: `${SDS}: trioctylphosphine oxide`,
  },
  {
    code: "dodecanethiol",
    group: "ligand",
    label: "1-Dodecanethiol",
    pattern: /dodecanethiol|\bddt\b/i,
    statements: ["H314", "H410"],
    source: `${SDS}: 1-dodecanethiol`,
  },
];
