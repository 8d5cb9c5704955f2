/**
 * Steel and electrode catalogue.
 *
 * Steel minimum Fy/Fu values are those tabulated for the ASTM grades in the AISC Steel
 * Construction Manual (Part 2) and, for EN grades, EN 1993-1-1 Table 3.1; all from memory and
 * marked so in the tests. Each grade carries thickness bands: past the last band the
 * catalogue does not know the grade's strength and the caller must give fy and fu directly.
 */
import { convertLength, convertStress, type UnitSystemId } from './units.js';
import { EngineError } from './errors.js';

export interface SteelBand {
  /** Largest thickness covered by this band, in the grade's native length unit. */
  readonly upTo: number;
  readonly fy: number;
  readonly fu: number;
}

export interface SteelGrade {
  readonly name: string;
  readonly standard: string;
  readonly description: string;
  /** The unit system in which the grade is specified (ASTM: imperial, EN: metric). */
  readonly native: UnitSystemId;
  readonly bands: readonly SteelBand[];
}

const ASTM = 'imperial' as const;
const EN = 'metric' as const;
const ANY = Number.POSITIVE_INFINITY;

export const STEELS: readonly SteelGrade[] = Object.freeze([
  { name: 'A36', standard: 'ASTM A36', description: 'carbon plate and shapes', native: ASTM, bands: [{ upTo: 8, fy: 36, fu: 58 }, { upTo: ANY, fy: 32, fu: 58 }] },
  { name: 'A572-42', standard: 'ASTM A572 Grade 42', description: 'HSLA plate and shapes', native: ASTM, bands: [{ upTo: 6, fy: 42, fu: 60 }] },
  { name: 'A572-50', standard: 'ASTM A572 Grade 50', description: 'HSLA plate and shapes', native: ASTM, bands: [{ upTo: 4, fy: 50, fu: 65 }] },
  { name: 'A572-55', standard: 'ASTM A572 Grade 55', description: 'HSLA plate and shapes', native: ASTM, bands: [{ upTo: 2, fy: 55, fu: 70 }] },
  { name: 'A572-60', standard: 'ASTM A572 Grade 60', description: 'HSLA plate and shapes', native: ASTM, bands: [{ upTo: 1.25, fy: 60, fu: 75 }] },
  { name: 'A572-65', standard: 'ASTM A572 Grade 65', description: 'HSLA plate and shapes', native: ASTM, bands: [{ upTo: 1.25, fy: 65, fu: 80 }] },
  { name: 'A992', standard: 'ASTM A992', description: 'wide-flange shapes', native: ASTM, bands: [{ upTo: ANY, fy: 50, fu: 65 }] },
  { name: 'A588', standard: 'ASTM A588', description: 'weathering plate and shapes', native: ASTM, bands: [{ upTo: 4, fy: 50, fu: 70 }, { upTo: 5, fy: 46, fu: 67 }, { upTo: 8, fy: 42, fu: 63 }] },
  { name: 'A529-50', standard: 'ASTM A529 Grade 50', description: 'carbon-manganese plate and bars', native: ASTM, bands: [{ upTo: 1, fy: 50, fu: 65 }] },
  { name: 'A1085', standard: 'ASTM A1085', description: 'hollow structural sections', native: ASTM, bands: [{ upTo: ANY, fy: 50, fu: 65 }] },
  { name: 'A500-B-round', standard: 'ASTM A500 Grade B, round', description: 'round HSS', native: ASTM, bands: [{ upTo: ANY, fy: 42, fu: 58 }] },
  { name: 'A500-B-rect', standard: 'ASTM A500 Grade B, rectangular', description: 'rectangular HSS', native: ASTM, bands: [{ upTo: ANY, fy: 46, fu: 58 }] },
  { name: 'A500-C-round', standard: 'ASTM A500 Grade C, round', description: 'round HSS', native: ASTM, bands: [{ upTo: ANY, fy: 46, fu: 62 }] },
  { name: 'A500-C-rect', standard: 'ASTM A500 Grade C, rectangular', description: 'rectangular HSS', native: ASTM, bands: [{ upTo: ANY, fy: 50, fu: 62 }] },
  { name: 'A53-B', standard: 'ASTM A53 Grade B', description: 'pipe', native: ASTM, bands: [{ upTo: ANY, fy: 35, fu: 60 }] },
  { name: 'A514', standard: 'ASTM A514', description: 'quenched and tempered alloy plate', native: ASTM, bands: [{ upTo: 2.5, fy: 100, fu: 110 }, { upTo: 6, fy: 90, fu: 100 }] },
  { name: 'A913-65', standard: 'ASTM A913 Grade 65', description: 'QST shapes', native: ASTM, bands: [{ upTo: ANY, fy: 65, fu: 80 }] },
  { name: 'S235', standard: 'EN 10025-2 S235', description: 'non-alloy structural steel', native: EN, bands: [{ upTo: 40, fy: 235, fu: 360 }, { upTo: 80, fy: 215, fu: 360 }] },
  { name: 'S275', standard: 'EN 10025-2 S275', description: 'non-alloy structural steel', native: EN, bands: [{ upTo: 40, fy: 275, fu: 430 }, { upTo: 80, fy: 255, fu: 410 }] },
  { name: 'S355', standard: 'EN 10025-2 S355', description: 'non-alloy structural steel', native: EN, bands: [{ upTo: 40, fy: 355, fu: 510 }, { upTo: 80, fy: 335, fu: 470 }] },
  { name: 'S460', standard: 'EN 10025-3 S460N', description: 'normalized fine-grain steel', native: EN, bands: [{ upTo: 40, fy: 460, fu: 540 }, { upTo: 80, fy: 430, fu: 540 }] },
] satisfies SteelGrade[]);

export const STEEL_NAMES = STEELS.map((s) => s.name) as readonly string[];

const steelByName = new Map(STEELS.map((s) => [s.name, s]));

export interface Electrode {
  readonly name: string;
  /** Classification strength FEXX in the grade's native stress unit. */
  readonly fexx: number;
  readonly native: UnitSystemId;
}

/** AWS A5 classifications by tensile strength (E70 = 70 ksi; metric E49 = 490 MPa). */
export const ELECTRODES: readonly Electrode[] = Object.freeze([
  { name: 'E60', fexx: 60, native: ASTM },
  { name: 'E70', fexx: 70, native: ASTM },
  { name: 'E80', fexx: 80, native: ASTM },
  { name: 'E90', fexx: 90, native: ASTM },
  { name: 'E100', fexx: 100, native: ASTM },
  { name: 'E110', fexx: 110, native: ASTM },
  { name: 'E43', fexx: 430, native: EN },
  { name: 'E49', fexx: 490, native: EN },
  { name: 'E55', fexx: 550, native: EN },
  { name: 'E62', fexx: 620, native: EN },
  { name: 'E69', fexx: 690, native: EN },
  { name: 'E76', fexx: 760, native: EN },
] satisfies Electrode[]);

export const ELECTRODE_NAMES = ELECTRODES.map((e) => e.name) as readonly string[];

const electrodeByName = new Map(ELECTRODES.map((e) => [e.name, e]));

/** A steel resolved for one part: strengths in the request's unit system. */
export interface ResolvedSteel {
  readonly name: string | null;
  readonly fy: number;
  readonly fu: number;
}

export type SteelSpec = string | { readonly fy: number; readonly fu: number };
export type ElectrodeSpec = string | { readonly fexx: number };

/**
 * Resolves a steel given by name or by numbers for a part of thickness `t` (request units).
 * `pointer` names the request field in an error.
 */
export function resolveSteel(spec: SteelSpec, t: number, system: UnitSystemId, pointer: string): ResolvedSteel {
  if (typeof spec !== 'string') {
    if (spec.fy > spec.fu) {
      throw new EngineError('MATERIAL_FY_EXCEEDS_FU', `fy (${spec.fy}) is greater than fu (${spec.fu}); a structural steel's yield strength cannot exceed its tensile strength.`, pointer);
    }
    return { name: null, fy: spec.fy, fu: spec.fu };
  }
  const grade = steelByName.get(spec);
  if (!grade) throw new EngineError('UNKNOWN_MATERIAL', `Unknown steel "${spec}".`, pointer);
  const tNative = convertLength(t, system, grade.native);
  const band = grade.bands.find((b) => tNative <= b.upTo);
  if (!band) {
    const last = grade.bands[grade.bands.length - 1];
    throw new EngineError(
      'MATERIAL_THICKNESS_OUT_OF_RANGE',
      `The catalogue gives ${grade.name} strengths only up to ${last ? last.upTo : 0} ${grade.native === 'imperial' ? 'in' : 'mm'} thick; give fy and fu for this part directly.`,
      pointer,
    );
  }
  return { name: grade.name, fy: convertStress(band.fy, grade.native, system), fu: convertStress(band.fu, grade.native, system) };
}

export interface ResolvedElectrode {
  readonly name: string | null;
  /** FEXX in the request's stress unit. */
  readonly fexx: number;
}

export function resolveElectrode(spec: ElectrodeSpec, system: UnitSystemId, pointer: string): ResolvedElectrode {
  if (typeof spec !== 'string') return { name: null, fexx: spec.fexx };
  const e = electrodeByName.get(spec);
  if (!e) throw new EngineError('UNKNOWN_MATERIAL', `Unknown electrode "${spec}".`, pointer);
  return { name: e.name, fexx: convertStress(e.fexx, e.native, system) };
}

/**
 * Matching-filler advice (AWS D1.1 matching tables summarised, common practice, no source):
 * an electrode matches a base metal when FEXX >= matchRatio · Fu; it is over-matched when it
 * exceeds the strongest part's Fu by more than `overmatchMargin`.
 */
export const MATCHING = Object.freeze({
  matchRatio: 0.95,
  overmatchMargin: { imperial: 12, metric: 83 } as Readonly<Record<UnitSystemId, number>>,
});

export type Match = 'matching' | 'under' | 'over';

export function electrodeMatch(fexx: number, fuParts: readonly number[], system: UnitSystemId): Match {
  return electrodeMatchRange(fexx, Math.min(...fuParts), Math.max(...fuParts), system);
}

/** electrodeMatch given the weakest and strongest parts' Fu. */
export function electrodeMatchRange(fexx: number, fuMin: number, fuMax: number, system: UnitSystemId): Match {
  if (fexx < MATCHING.matchRatio * fuMax) return 'under';
  if (fexx > fuMin + MATCHING.overmatchMargin[system]) return 'over';
  return 'matching';
}

const PART_STEEL_POINTERS = Array.from({ length: 16 }, (_, i) => `/parts/${i}/steel`);

/** `/parts/<i>/steel`, the pointer an error about a part's steel names (made once, not per call). */
export function partSteelPointer(i: number): string {
  return PART_STEEL_POINTERS[i] ?? `/parts/${i}/steel`;
}

/** The catalogue as served by GET /v1/catalog/*, in the requested system. */
export function steelCatalogue(system: UnitSystemId): Array<{ name: string; standard: string; description: string; bands: Array<{ upTo: number | null; fy: number; fu: number }> }> {
  return STEELS.map((g) => ({
    name: g.name,
    standard: g.standard,
    description: g.description,
    bands: g.bands.map((b) => ({
      upTo: Number.isFinite(b.upTo) ? convertLength(b.upTo, g.native, system) : null,
      fy: convertStress(b.fy, g.native, system),
      fu: convertStress(b.fu, g.native, system),
    })),
  }));
}

export function electrodeCatalogue(system: UnitSystemId): Array<{ name: string; fexx: number; native: UnitSystemId }> {
  return ELECTRODES.map((e) => ({ name: e.name, fexx: convertStress(e.fexx, e.native, system), native: e.native }));
}
