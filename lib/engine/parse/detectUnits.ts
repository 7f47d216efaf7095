import type { Technique, XUnit, YUnit } from '../types';
import { TECHNIQUE_SPECS } from '../../registry/techniques';

/** Reads an X unit from header or metadata text; undefined when none is stated. */
export function detectXUnit(text: string): XUnit | undefined {
  const t = text.toLowerCase();
  if (/cm\s*(?:-1|⁻¹|\^-1|\^\{-1\})|1\s*\/\s*cm|wavenumber|wave number/.test(t)) return 'cm-1';
  if (/\bnm\b|nanomet/.test(t)) return 'nm';
  if (/µm|μm|\bum\b|micron|micromet/.test(t)) return 'um';
  if (/\bev\b|electron ?volt|energy/.test(t)) return 'eV';
  if (/wavelength/.test(t)) return 'nm';
  return undefined;
}

/** Reads a Y unit from header or metadata text; undefined when none is stated. */
export function detectYUnit(text: string): YUnit | undefined {
  const t = text.toLowerCase();
  if (/%\s*t\b|transmittance|transmission/.test(t)) return 'percent-transmittance';
  if (/absorbance|\babs\b|optical density|\bo\.?d\.?\b/.test(t)) return 'absorbance';
  if (/counts|intensity|\bcps\b|\ba\.?u\.?\b|emission|fluorescence|photoluminescence|\bpl\b/.test(t)) return 'counts';
  return undefined;
}

/** Reads a technique hint from a file name (e.g. "uv-vis", "abs", "pl", "fl", "ir"). */
export function detectTechniqueFromName(fileName: string): Technique | undefined {
  const t = fileName.toLowerCase().replace(/\.[a-z0-9]+$/, '');
  if (/(?:^|[^a-z])(?:pl|fl|emission|fluor\w*|photolum\w*|lum\w*)(?:[^a-z]|$)/.test(t)) return 'pl';
  if (/(?:^|[^a-z])(?:uv-?vis|absorbance|abs|absorption)(?:[^a-z]|$)/.test(t)) return 'absorption';
  if (/(?:^|[^a-z])(?:ir|ftir|ft-ir|infrared)(?:[^a-z]|$)/.test(t)) return 'ir';
  return undefined;
}

/** Y unit implied by a technique when nothing else states it. */
export function yUnitForTechnique(technique: Technique): YUnit {
  return TECHNIQUE_SPECS[technique].defaultYUnit;
}

/** Technique guessed from the units. */
export function guessTechnique(xUnit: XUnit, yUnit: YUnit, hint?: Technique): Technique {
  if (hint) return hint;
  if (yUnit === 'counts') return 'pl';
  if (xUnit === 'cm-1' || xUnit === 'um' || yUnit === 'percent-transmittance') return 'ir';
  return 'absorption';
}
