/**
 * Groove weld provisions, one function or data table per published table or equation:
 * the effective throat of PJP groove welds (Table J2.1), of flare groove welds (Table J2.2),
 * the minimum effective throat of PJP groove welds (Table J2.3), the effective throat of CJP
 * groove welds (§J2.1a) and the groove-weld rows of Table J2.5 with their phi and Omega.
 *
 * Lengths are in the system's length unit (in or mm), stresses in its stress unit (ksi or MPa),
 * forces in its force unit (kip or kN). Metric values are the Specification's own (3 mm, 5 mm,
 * 10 mm ...), not conversions of the imperial ones.
 *
 * These tables were written from memory of AISC 360-22 and agree with weld-rules.md section 2
 * except where a comment says otherwise (the CJP filler rule for tension or compression
 * parallel to the axis, which weld-rules.md does not list).
 */
import type { UnitSystem, UnitSystemId } from '../units.js';
import { FACTORS, type Factors } from './resistance.js';

export const GROOVE_TYPES = ['J', 'U', 'V-60', 'bevel-60', 'bevel-45', 'flare-bevel', 'flare-V'] as const;
export type GrooveType = (typeof GROOVE_TYPES)[number];

/** FCAW-G (gas shielded) and FCAW-S (self shielded) are told apart only by Table J2.2. */
export const WELD_PROCESSES = ['SMAW', 'GMAW', 'FCAW', 'FCAW-G', 'FCAW-S', 'SAW'] as const;
export type WeldProcess = (typeof WELD_PROCESSES)[number];

export const WELD_POSITIONS = ['flat', 'horizontal', 'vertical', 'overhead'] as const;
export type WeldPosition = (typeof WELD_POSITIONS)[number];

export const GROOVE_LOAD_CASES = [
  'tension-normal',
  'compression-column-bearing',
  'compression-member-bearing',
  'compression-not-bearing',
  'parallel',
  'shear',
] as const;
export type GrooveLoadCase = (typeof GROOVE_LOAD_CASES)[number];

export type FlareGroove = 'flare-bevel' | 'flare-V';

export function isFlare(type: GrooveType): type is FlareGroove {
  return type === 'flare-bevel' || type === 'flare-V';
}

// ------------------------------------------------------------------ Table J2.1

/** The process families of Table J2.1, which does not tell FCAW-G from FCAW-S. */
export type TableJ21Process = 'SMAW' | 'GMAW' | 'FCAW' | 'SAW';

export function tableJ21Process(weldProcess: WeldProcess): TableJ21Process {
  return weldProcess === 'FCAW-G' || weldProcess === 'FCAW-S' ? 'FCAW' : weldProcess;
}

export interface ThroatRow {
  readonly processes: readonly TableJ21Process[];
  readonly positions: readonly WeldPosition[];
  readonly grooves: readonly GrooveType[];
  /** true: effective throat = S - 1/8 in (3 mm); false: S. */
  readonly deducted: boolean;
}

const ALL_POSITIONS = WELD_POSITIONS;

/**
 * The rows of Table J2.1 (effective throat of PJP groove welds). Groove types as in the
 * structural welding code's prequalified PJP details.
 * @cite AISC 360-22 Table J2.1
 */
export const TABLE_J2_1: readonly ThroatRow[] = Object.freeze([
  { processes: ['SMAW', 'GMAW', 'FCAW'], positions: ALL_POSITIONS, grooves: ['J', 'U', 'V-60'], deducted: false },
  { processes: ['SAW'], positions: ['flat'], grooves: ['J', 'U', 'bevel-60', 'V-60'], deducted: false },
  { processes: ['GMAW', 'FCAW'], positions: ['flat', 'horizontal'], grooves: ['bevel-45'], deducted: false },
  { processes: ['SMAW'], positions: ALL_POSITIONS, grooves: ['bevel-45'], deducted: true },
  { processes: ['GMAW', 'FCAW'], positions: ['vertical', 'overhead'], grooves: ['bevel-45'], deducted: true },
] satisfies ThroatRow[]);

/** The deduction of Table J2.1: 1/8 in (3 mm). @cite AISC 360-22 Table J2.1 */
export const THROAT_DEDUCTION: Readonly<Record<UnitSystemId, number>> = Object.freeze({ imperial: 0.125, metric: 3 });

/**
 * The Table J2.1 row for a process, position and groove type, or undefined when the
 * combination has no prequalified throat. With no position given, only a row that covers
 * every position can answer.
 * @cite AISC 360-22 Table J2.1
 */
export function tableJ21Row(weldProcess: WeldProcess, position: WeldPosition | null, groove: GrooveType): ThroatRow | undefined {
  const p = tableJ21Process(weldProcess);
  return TABLE_J2_1.find(
    (r) =>
      r.processes.includes(p) &&
      r.grooves.includes(groove) &&
      (position === null ? r.positions.length === ALL_POSITIONS.length : r.positions.includes(position)),
  );
}

/** Whether the Table J2.1 answer for this process and groove depends on the position. */
export function positionMatters(weldProcess: WeldProcess, groove: GrooveType): boolean {
  const answers = ALL_POSITIONS.map((pos) => {
    const r = tableJ21Row(weldProcess, pos, groove);
    return r === undefined ? 'none' : r.deducted ? 'deducted' : 'full';
  });
  return answers.some((a) => a !== answers[0]);
}

/**
 * Effective throat of a PJP groove weld of groove depth S: S, or S - 1/8 in (3 mm) where the
 * table deducts; never below zero. Undefined when the combination has no prequalified throat.
 * @cite AISC 360-22 Table J2.1
 */
export function tePjp(S: number, weldProcess: WeldProcess, position: WeldPosition | null, groove: GrooveType, system: UnitSystemId): number | undefined {
  const row = tableJ21Row(weldProcess, position, groove);
  if (!row) return undefined;
  return row.deducted ? Math.max(0, S - THROAT_DEDUCTION[system]) : S;
}

// ------------------------------------------------------------------ Table J2.2

/** Coefficients k of Table J2.2, effective throat = k·R, by process and flare groove. */
export const TABLE_J2_2: Readonly<Partial<Record<WeldProcess, Readonly<Record<FlareGroove, number>>>>> = Object.freeze({
  GMAW: { 'flare-bevel': 5 / 8, 'flare-V': 3 / 4 },
  'FCAW-G': { 'flare-bevel': 5 / 8, 'flare-V': 3 / 4 },
  SMAW: { 'flare-bevel': 5 / 16, 'flare-V': 5 / 8 },
  'FCAW-S': { 'flare-bevel': 5 / 16, 'flare-V': 5 / 8 },
  SAW: { 'flare-bevel': 5 / 16, 'flare-V': 1 / 2 },
});

/**
 * Effective throat of a flare groove weld filled flush, from the radius R of the joint
 * surface: GMAW and FCAW-G 5/8·R (bevel), 3/4·R (V); SMAW and FCAW-S 5/16·R, 5/8·R; SAW
 * 5/16·R, 1/2·R. Undefined for plain FCAW: the table needs to know the shielding.
 * @cite AISC 360-22 Table J2.2
 */
export function teFlare(R: number, weldProcess: WeldProcess, groove: FlareGroove): number | undefined {
  const k = TABLE_J2_2[weldProcess];
  return k === undefined ? undefined : k[groove] * R;
}

/**
 * Radius of the joint surface of an HSS corner when none is given: 2·t, t the HSS wall.
 * @cite AISC 360-22 Table J2.2
 */
export function RHss(t: number): number {
  return 2 * t;
}

/**
 * Below this radius a flare bevel groove is to be a reinforcing fillet on a joint filled flush,
 * not a flare bevel groove weld: 3/8 in (10 mm) (Table J2.2 footnote, from memory).
 * @cite AISC 360-22 Table J2.2
 */
export const FLARE_BEVEL_RADIUS_MIN: Readonly<Record<UnitSystemId, number>> = Object.freeze({ imperial: 0.375, metric: 10 });

// ------------------------------------------------------------------ Table J2.3

/** Table J2.3 rows: thinner part up to `upTo` (inclusive) needs an effective throat of at least `throat`. */
export const TABLE_J2_3: Readonly<Record<UnitSystemId, ReadonlyArray<{ readonly upTo: number; readonly throat: number }>>> = Object.freeze({
  imperial: [
    { upTo: 0.25, throat: 0.125 },
    { upTo: 0.5, throat: 0.1875 },
    { upTo: 0.75, throat: 0.25 },
    { upTo: 1.5, throat: 0.3125 },
    { upTo: 2.25, throat: 0.375 },
    { upTo: 6, throat: 0.5 },
    { upTo: Number.POSITIVE_INFINITY, throat: 0.625 },
  ],
  metric: [
    { upTo: 6, throat: 3 },
    { upTo: 13, throat: 5 },
    { upTo: 19, throat: 6 },
    { upTo: 38, throat: 8 },
    { upTo: 57, throat: 10 },
    { upTo: 150, throat: 13 },
    { upTo: Number.POSITIVE_INFINITY, throat: 16 },
  ],
});

/**
 * Minimum effective throat of a PJP groove weld, by the thickness of the thinner part joined.
 * @cite AISC 360-22 Table J2.3
 */
export function teMin(tThinner: number, system: UnitSystemId): number {
  const rows = TABLE_J2_3[system];
  for (const row of rows) if (tThinner <= row.upTo) return row.throat;
  return rows[rows.length - 1]!.throat;
}

// ------------------------------------------------------------------ CJP

/**
 * Effective throat of a CJP groove weld: the thickness of the thinner part joined.
 * @cite AISC 360-22 §J2.1a
 */
export function teCjp(thicknesses: readonly number[]): number {
  return Math.min(...thicknesses);
}

// ------------------------------------------------------------------ Table J2.5

/** Factors of the PJP weld metal loaded normal to its axis (tension or compression). @cite AISC 360-22 Table J2.5 */
export const PJP_WELD_NORMAL: Factors = Object.freeze({ phi: 0.8, omega: 1.88 });
/** Factors of base metal in compression (Fy). @cite AISC 360-22 Eq. J4-6 */
export const COMPRESSION_YIELD: Factors = Object.freeze({ phi: 0.9, omega: 1.67 });

/** Which stress a base-metal entry of Table J2.5 uses. */
export type BaseMetalRule = 'Fu' | 'Fy' | 'J4-shear';

export interface PjpStrengthRow {
  /** Weld metal: Fnw = factor·FEXX with its factors, or null where the table says it need not be checked. */
  readonly weld: { readonly fexxFactor: number; readonly factors: Factors } | null;
  /** Base metal: the nominal stress used, or null where the table says it need not be checked. */
  readonly base: { readonly rule: BaseMetalRule; readonly factors: Factors | null } | null;
  /** The table's wording where a case is exempt, in our words. */
  readonly exemptReason: string | null;
}

/**
 * The PJP rows of Table J2.5 (flare groove welds included), by load on the weld.
 * @cite AISC 360-22 Table J2.5
 */
export const TABLE_J2_5_PJP: Readonly<Record<GrooveLoadCase, PjpStrengthRow>> = Object.freeze({
  'tension-normal': { weld: { fexxFactor: 0.6, factors: PJP_WELD_NORMAL }, base: { rule: 'Fu', factors: FACTORS.tensionRupture }, exemptReason: null },
  'compression-column-bearing': {
    weld: null,
    base: null,
    exemptReason: 'Compression of a column on a base plate or at a column splice finished to bear (§J1.4a) need not be considered in the design of the welds joining the parts.',
  },
  'compression-member-bearing': { weld: { fexxFactor: 0.6, factors: PJP_WELD_NORMAL }, base: { rule: 'Fy', factors: COMPRESSION_YIELD }, exemptReason: null },
  'compression-not-bearing': { weld: { fexxFactor: 0.9, factors: PJP_WELD_NORMAL }, base: { rule: 'Fy', factors: COMPRESSION_YIELD }, exemptReason: null },
  parallel: {
    weld: null,
    base: null,
    exemptReason: 'Tension or compression in parts joined parallel to a weld need not be considered in the design of the welds joining the parts.',
  },
  shear: { weld: { fexxFactor: 0.6, factors: FACTORS.weldShear }, base: { rule: 'J4-shear', factors: null }, exemptReason: null },
});

/**
 * Nominal stress of PJP weld metal for a load case: 0.60·FEXX, or 0.90·FEXX in compression
 * not finished to bear; undefined where the table says the weld need not be checked.
 * @cite AISC 360-22 Table J2.5
 */
export function FnwPjp(FEXX: number, loadCase: GrooveLoadCase): number | undefined {
  const w = TABLE_J2_5_PJP[loadCase].weld;
  return w === null ? undefined : w.fexxFactor * FEXX;
}

/**
 * Nominal strength of the base metal, Rn = FnBM·ABM, in the system's force unit.
 * @cite AISC 360-22 Eq. J2-2
 */
export function RnBaseMetal(FnBM: number, ABM: number, units: UnitSystem): number {
  return FnBM * ABM * units.stressArea;
}

/**
 * Nominal strength of groove weld metal, Rn = Fnw·Awe, in the system's force unit.
 * @cite AISC 360-22 Eq. J2-3
 */
export function RnGrooveWeld(Fnw: number, Awe: number, units: UnitSystem): number {
  return Fnw * Awe * units.stressArea;
}

/**
 * Compressive strength of a connecting element with Lc/r <= 25, Pn = Fy·Ag.
 * @cite AISC 360-22 Eq. J4-6
 */
export function RnCompressionYield(Fy: number, Ag: number, units: UnitSystem): number {
  return Fy * Ag * units.stressArea;
}

/** The CJP filler-metal rules of Table J2.5, by load on the weld. */
export type CjpFillerRule = 'matching' | 'one-level-below-permitted' | 'below-matching-permitted';

/**
 * CJP filler metal by load case: matching for tension normal to the axis and for shear; equal
 * to or one strength level below matching for compression normal to the axis; equal to or
 * below matching for tension or compression parallel to the axis.
 * @cite AISC 360-22 Table J2.5
 */
export function cjpFillerRule(loadCase: GrooveLoadCase): CjpFillerRule {
  switch (loadCase) {
    case 'tension-normal':
    case 'shear':
      return 'matching';
    case 'parallel':
      return 'below-matching-permitted';
    default:
      return 'one-level-below-permitted';
  }
}

/** One filler-metal strength level: 10 ksi (70 MPa). @cite AISC 360-22 Table J2.5 */
export const FILLER_STRENGTH_LEVEL: Readonly<Record<UnitSystemId, number>> = Object.freeze({ imperial: 10, metric: 70 });
