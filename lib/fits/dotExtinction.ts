import { MATERIALS } from "@/lib/engine/derived/materials";
import { SIZING_CURVES } from "@/lib/engine/derived/sizingCurves";
import type { MaterialName } from "@/lib/engine/types";

export interface DotExtinction {
  /** Molar extinction, M⁻¹cm⁻¹, at `readingNm`. */
  epsilonPerMPerCm: number;
  /** Where the absorbance must be read for this ε: the first exciton, or 400 nm for the lead chalcogenides. */
  readingNm: number;
  readingLabel: "first exciton" | "400 nm";
  diameterNm: number;
  source: string;
  warnings: string[];
}

/**
 * A dot's extinction coefficient from its material's default sizing curve (Yu et al., Chem. Mater.
 * 2003, 15, 2854 for the Cd chalcogenides, ε at the first exciton; Moreels et al., ACS Nano 2009,
 * 3, 3023 and Chem. Mater. 2007, 19, 6101 for PbS and PbSe, ε at 400 nm), and the wavelength at
 * which a Beer–Lambert concentration must therefore read the absorbance.
 */
export function dotExtinction(material: MaterialName, firstExcitonNm: number): DotExtinction {
  if (!Object.prototype.hasOwnProperty.call(MATERIALS, material)) throw new RangeError(`material ${String(material)} has no sizing curve`);
  if (!(Number.isFinite(firstExcitonNm) && firstExcitonNm > 0)) throw new RangeError("first exciton must be a positive wavelength in nm");
  const curve = SIZING_CURVES[MATERIALS[material].defaultSizing];
  const r = curve.size(firstExcitonNm);
  const atExciton = r.extinctionAt === "first-exciton";
  return {
    epsilonPerMPerCm: r.extinctionPerMPerCm,
    readingNm: atExciton ? firstExcitonNm : 400,
    readingLabel: atExciton ? "first exciton" : "400 nm",
    diameterNm: r.diameterNm,
    source: r.source,
    warnings: r.warnings,
  };
}
