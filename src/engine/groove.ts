/**
 * Groove weld checks (AISC 360-22 §J2.1, §J2.4, Table J2.5).
 *
 * PJP: the effective throat from Table J2.1 (process, position, groove type, groove depth) or
 * Table J2.2 (flare grooves, from the radius of the joint surface), or a throat the request
 * says was qualified by procedure tests; the weld metal and the base metal at the fusion face
 * for the load case of Table J2.5; the minimum throat of Table J2.3 and two geometric limits.
 *
 * CJP: the base metal of the parts on the CJP effective area (thinner part × length) for the
 * load case, and the filler-metal rule of Table J2.5 as a limit.
 *
 * Base-metal area of a PJP groove weld (our reading, documented here because Table J2.5 only
 * says "see J4"): the area of each part at the fusion face along the weld, taken as the
 * effective throat × length, side by side, each side's throat capped at the part's own
 * thickness: ABM = sum over sides of min(te, t) × L. The effective throat rather than the
 * groove depth, because Table J2.1's deduction stands for root metal that is not reliably
 * fused; the cap matters only for flare grooves, whose throat can exceed an HSS wall (for
 * ordinary grooves PJP_THROAT_MAX already keeps the throats within the thinner part). Tension normal to the axis uses Fu on that
 * area (phi 0.75, Omega 2.00), compression Fy (phi 0.90, Omega 1.67), and shear the §J4.2
 * shear yielding and rupture checks of base-metal.ts on the same area.
 *
 * "Need not be checked" rows of Table J2.5 are returned as checks with `applicable: false`,
 * zero numbers and a note, plus a GROOVE_LOAD_CASE_EXEMPT warning, so that they are visible.
 */
import { partChecks } from './base-metal.js';
import { CODES } from './codes.js';
import { EngineError } from './errors.js';
import { MATCHING, electrodeMatch, resolveElectrode, resolveSteel, type ElectrodeSpec, type ResolvedSteel, type SteelSpec } from './materials.js';
import {
  FILLER_STRENGTH_LEVEL,
  FLARE_BEVEL_RADIUS_MIN,
  FnwPjp,
  RHss,
  RnBaseMetal,
  RnCompressionYield,
  RnGrooveWeld,
  COMPRESSION_YIELD,
  TABLE_J2_1,
  TABLE_J2_5_PJP,
  THROAT_DEDUCTION,
  cjpFillerRule,
  isFlare,
  tableJ21Row,
  teCjp,
  teFlare,
  teMin,
  tePjp,
  type CjpFillerRule,
  type GrooveLoadCase,
  type GrooveType,
  type WeldPosition,
  type WeldProcess,
} from './provisions/groove.js';
import type { Method } from './provisions/resistance.js';
import { limit, strengthCheck, summarise, warn, type Check, type EngineResult, type Limit, type Warning } from './result.js';
import { unitSystem, type UnitSystem, type UnitSystemId } from './units.js';

export type GoverningSide = 'weld-metal' | 'base-metal' | 'none';

export interface GroovePart {
  thickness: number;
  steel: SteelSpec;
  /** The part is an HSS wall: with a flare groove and no radius, R = 2t of this part. */
  hss?: boolean;
}

export interface PjpRequest {
  method: Method;
  units: UnitSystemId;
  electrode: ElectrodeSpec;
  groove: {
    type: GrooveType;
    process: WeldProcess;
    /** null when not given: only rows of Table J2.1 that cover all positions can answer. */
    position: WeldPosition | null;
    sides: 1 | 2;
    /** Groove depth S of each side (one entry per side); null for flare grooves. */
    depths: number[] | null;
    /** Radius of the joint surface of a flare groove; null: 2t of the HSS part. */
    radius: number | null;
    /** Effective throat of each side established by procedure qualification tests; null: prequalified. */
    qualifiedThroats: number[] | null;
    /** Index of the part the groove is cut in (depth limit); null: the thinner part. */
    part: number | null;
  };
  /** Length of the weld. */
  length: number;
  load: { case: GrooveLoadCase; cyclic: boolean };
  /** Required strength of the joint; null when not given. */
  demand: number | null;
  parts: GroovePart[];
}

export interface PjpSideValues {
  depth: number | null;
  /** The throat Table J2.1 or J2.2 gives, or null where the tables give none. */
  prequalifiedThroat: number | null;
  /** The deduction of Table J2.1 applied to this side (0 where none). */
  deduction: number;
  /** The effective throat used. */
  throat: number;
}

export interface PjpValues {
  fexx: number;
  loadCase: GrooveLoadCase;
  throatSource: 'Table J2.1' | 'Table J2.2' | 'qualified';
  sides: PjpSideValues[];
  /** Effective throat of the joint, all sides together. */
  throat: number;
  radius: number | null;
  radiusAssumed: boolean;
  length: number;
  /** Effective area Awe = throat × length. */
  area: number;
  /** Fnw for the load case; null where the weld need not be checked. */
  weldStress: number | null;
  weldMetalNominal: number | null;
  thinnerPart: number;
  minThroat: number;
  governingSide: GoverningSide;
  parts: Array<{ thickness: number; fy: number; fu: number; fusionArea: number }>;
}

export interface CjpRequest {
  method: Method;
  units: UnitSystemId;
  electrode: ElectrodeSpec;
  length: number;
  load: { case: GrooveLoadCase };
  demand: number | null;
  parts: GroovePart[];
  joint: 'butt' | 'T' | 'corner';
  backingLeftInPlace: boolean;
}

export interface CjpValues {
  fexx: number;
  loadCase: GrooveLoadCase;
  /** Effective throat: the thinner part joined. */
  throat: number;
  length: number;
  area: number;
  fillerRule: CjpFillerRule;
  /** FEXX that matches the weaker part joined (matchRatio × Fu). */
  matchingFexx: number;
  /** Lowest FEXX the rule accepts for this load case. */
  fillerRequired: number;
  governingSide: GoverningSide;
  parts: Array<{ thickness: number; fy: number; fu: number; area: number }>;
}

// ------------------------------------------------------------------ shared pieces

function resolveParts(parts: GroovePart[], sys: UnitSystemId): Array<GroovePart & { resolved: ResolvedSteel }> {
  return parts.map((p, i) => Object.assign({}, p, { resolved: resolveSteel(p.steel, p.thickness, sys, `/parts/${i}/steel`) }));
}

/** A Table J2.5 row that need not be checked, shown as a check that says so. */
function exemptCheck(code: 'GROOVE_WELD_METAL_EXEMPT' | 'GROOVE_BASE_METAL_EXEMPT', demand: number, note: string): Check {
  const info = CODES[code];
  return { code, title: info.title, clause: info.clause, equation: '', nominal: 0, available: 0, demand, ratio: 0, pass: true, applicable: false, note };
}

function governingSide(result: EngineResult<unknown>): GoverningSide {
  const code = result.governing.code;
  if (code === 'GROOVE_WELD_METAL_EXEMPT' || code === 'GROOVE_BASE_METAL_EXEMPT') return 'none';
  return code === 'PJP_WELD_METAL' ? 'weld-metal' : 'base-metal';
}

function num(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

const PROCESS_WORDS = (ps: readonly string[]): string => ps.join(' or ');
const POSITION_WORDS = (ps: readonly string[]): string => (ps.length === 4 ? 'any position' : `the ${ps.join(' or ')} position`);

/** The prequalified alternatives of Table J2.1 for a groove type, in words. */
function tableJ21Options(groove: GrooveType, units: UnitSystem, sys: UnitSystemId): string {
  const rows = TABLE_J2_1.filter((r) => r.grooves.includes(groove));
  if (rows.length === 0) return 'Table J2.1 has no row for this groove type.';
  return `Table J2.1 gives a ${groove} groove a throat for: ${rows
    .map((r) => `${PROCESS_WORDS(r.processes)} in ${POSITION_WORDS(r.positions)} (${r.deducted ? `S - ${THROAT_DEDUCTION[sys]} ${units.length}` : 'S'})`)
    .join('; ')}.`;
}

// ------------------------------------------------------------------ PJP

export function checkPjp(req: PjpRequest): EngineResult<PjpValues> {
  const units = unitSystem(req.units);
  const sys = req.units;
  const g = req.groove;
  const electrode = resolveElectrode(req.electrode, sys, '/electrode');
  const FEXX = electrode.fexx;
  const parts = resolveParts(req.parts, sys);
  const tThin = Math.min(...parts.map((p) => p.thickness));
  const demand = req.demand ?? 0;
  const warnings: Warning[] = [];
  const limits: Limit[] = [];
  const flare = isFlare(g.type);
  const nSides = g.sides;

  if (g.qualifiedThroats !== null && g.qualifiedThroats.length !== nSides) {
    throw new EngineError('GEOMETRY_MEANINGLESS', `groove: ${g.qualifiedThroats.length} qualified throats for ${nSides} side(s).`, '/groove/qualifiedThroat');
  }

  // ---- effective throat of each side ----
  let radius: number | null = null;
  let radiusAssumed = false;
  const sides: PjpSideValues[] = [];
  let throatSource: PjpValues['throatSource'];
  if (flare) {
    if (g.radius !== null) {
      radius = g.radius;
    } else {
      const hss = parts.filter((p) => p.hss === true);
      if (hss.length === 0) {
        throw new EngineError('GEOMETRY_MEANINGLESS', 'A flare groove needs the radius of the joint surface (groove.radius), or a part marked hss for the 2t default.', '/groove/radius');
      }
      radius = RHss(Math.min(...hss.map((p) => p.thickness)));
      radiusAssumed = true;
      warnings.push(warn('FLARE_RADIUS_ASSUMED', `No groove.radius given: R = 2t = ${num(radius)} ${units.length} of the HSS wall (Table J2.2).`));
    }
    const pre = teFlare(radius, g.process, g.type as 'flare-bevel' | 'flare-V');
    if (pre === undefined && g.qualifiedThroats === null) {
      throw new EngineError(
        'PJP_NO_PREQUALIFIED_THROAT',
        `Table J2.2 gives flare groove throats for GMAW, FCAW-G, SMAW, FCAW-S and SAW; "${g.process}" does not say which row applies. Give FCAW-G or FCAW-S, or groove.qualifiedThroat established by procedure qualification tests.`,
        '/groove/process',
      );
    }
    for (let i = 0; i < nSides; i++) {
      const q = g.qualifiedThroats?.[i];
      sides.push({ depth: null, prequalifiedThroat: pre ?? null, deduction: 0, throat: q ?? pre! });
    }
    throatSource = g.qualifiedThroats !== null ? 'qualified' : 'Table J2.2';
    if (g.type === 'flare-bevel' && radius < FLARE_BEVEL_RADIUS_MIN[sys] - 1e-12) {
      warnings.push(warn('FLARE_BEVEL_RADIUS_SMALL', `R = ${num(radius)} ${units.length} is below ${FLARE_BEVEL_RADIUS_MIN[sys]} ${units.length}: Table J2.2 provides for a reinforcing fillet weld on a joint filled flush only.`));
    }
  } else {
    if (g.depths === null || g.depths.length !== nSides) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `groove: give the groove depth of each of the ${nSides} side(s).`, '/groove/depth');
    }
    const row = tableJ21Row(g.process, g.position, g.type);
    if (row === undefined && g.qualifiedThroats === null) {
      const where = g.position === null ? 'with no position given' : `in the ${g.position} position`;
      throw new EngineError(
        'PJP_NO_PREQUALIFIED_THROAT',
        `Table J2.1 has no prequalified effective throat for a ${g.type} groove by ${g.process} ${where}. ${tableJ21Options(g.type, units, sys)} ` +
          'Give groove.qualifiedThroat established by procedure qualification tests to check this weld as made.',
        '/groove',
      );
    }
    g.depths.forEach((S, i) => {
      const pre = tePjp(S, g.process, g.position, g.type, sys);
      const q = g.qualifiedThroats?.[i];
      sides.push({ depth: S, prequalifiedThroat: pre ?? null, deduction: row?.deducted ? Math.min(S, THROAT_DEDUCTION[sys]) : 0, throat: q ?? pre! });
    });
    throatSource = g.qualifiedThroats !== null ? 'qualified' : 'Table J2.1';
    if (row?.deducted && g.qualifiedThroats === null) {
      const better = TABLE_J2_1.filter((r) => !r.deducted && r.grooves.includes(g.type));
      if (better.length > 0) {
        const gain = sides.reduce((s, x) => s + x.deduction, 0);
        warnings.push(
          warn(
            'PJP_THROAT_DEDUCTION_AVOIDABLE',
            `Table J2.1 takes ${THROAT_DEDUCTION[sys]} ${units.length} off the groove depth of a ${g.type} groove made by ${g.process}${g.position === null ? '' : ` in the ${g.position} position`}; ` +
              `${better.map((r) => `${PROCESS_WORDS(r.processes)} in ${POSITION_WORDS(r.positions)}`).join(', or ')} would give the full depth (+${num(gain)} ${units.length} of throat, Table J2.1).`,
          ),
        );
      }
    }
  }
  sides.forEach((s, i) => {
    if (!(s.throat > 0)) {
      throw new EngineError(
        'PJP_GROOVE_TOO_SHALLOW',
        `Side ${i + 1}: a groove depth of ${num(s.depth ?? 0)} ${units.length} less the ${THROAT_DEDUCTION[sys]} ${units.length} deduction of Table J2.1 leaves no effective throat.`,
        nSides === 1 ? '/groove/depth' : `/groove/depths/${i}`,
      );
    }
  });
  if (g.qualifiedThroats !== null) {
    const pre = sides.map((s) => (s.prequalifiedThroat === null ? 'none' : num(s.prequalifiedThroat))).join(', ');
    warnings.push(warn('QUALIFIED_THROAT_USED', `Effective throat ${sides.map((s) => num(s.throat)).join(' + ')} ${units.length} taken as qualified by procedure tests (§J2.1a); prequalified throat: ${pre}.`));
  }

  const throat = sides.reduce((s, x) => s + x.throat, 0);
  const L = req.length;
  const Awe = throat * L;

  // ---- strength for the load case (Table J2.5) ----
  const row = TABLE_J2_5_PJP[req.load.case];
  const checks: Check[] = [];
  let weldStress: number | null = null;
  let weldNominal: number | null = null;
  const partValues = parts.map((p) => ({ thickness: p.thickness, fy: p.resolved.fy, fu: p.resolved.fu, fusionArea: sides.reduce((a, x) => a + Math.min(x.throat, p.thickness), 0) * L }));
  if (row.weld === null || row.base === null) {
    const reason = row.exemptReason ?? '';
    checks.push(exemptCheck('GROOVE_WELD_METAL_EXEMPT', demand, `Table J2.5: ${reason}`));
    checks.push(exemptCheck('GROOVE_BASE_METAL_EXEMPT', demand, `Table J2.5: ${reason}`));
    warnings.push(warn('GROOVE_LOAD_CASE_EXEMPT', `${req.load.case}: ${reason}`));
  } else {
    weldStress = FnwPjp(FEXX, req.load.case)!;
    weldNominal = RnGrooveWeld(weldStress, Awe, units);
    checks.push(strengthCheck('PJP_WELD_METAL', 'Eq. J2-3', req.method, weldNominal, row.weld.factors, demand));
    const base = row.base;
    parts.forEach((p, i) => {
      const ABM = partValues[i]!.fusionArea;
      if (base.rule === 'Fu') {
        checks.push(strengthCheck('PJP_BASE_METAL_TENSION', 'Eq. J2-2', req.method, RnBaseMetal(p.resolved.fu, ABM, units), base.factors!, demand, i));
      } else if (base.rule === 'Fy') {
        checks.push(strengthCheck('PJP_BASE_METAL_COMPRESSION', 'Eq. J2-2', req.method, RnBaseMetal(p.resolved.fy, ABM, units), base.factors!, demand, i));
      } else {
        // Shear: §J4.2 on the fusion-face area, through the shared base-metal checks.
        const r = partChecks(req.method, units, { thickness: ABM / L, steel: p.resolved, faces: 1, loading: 'shear' }, L, demand, i);
        checks.push(...r.checks);
      }
    });
  }

  // ---- detailing limits ----
  const minThroat = teMin(tThin, sys);
  sides.forEach((s, i) => limits.push(limit('PJP_MIN_THROAT', 'min', minThroat, s.throat, nSides === 2 ? { weld: i } : {})));
  if (!flare) {
    limits.push(limit('PJP_THROAT_MAX', 'max', tThin, throat));
    const pi = g.part ?? parts.findIndex((p) => p.thickness === tThin);
    const prepared = parts[pi];
    if (prepared === undefined) throw new EngineError('GEOMETRY_MEANINGLESS', `groove.part ${pi} names no part.`, '/groove/part');
    const depthSum = (g.depths ?? []).reduce((s, d) => s + d, 0);
    limits.push(limit('GROOVE_DEPTH_MAX', 'max', prepared.thickness, depthSum, { part: pi }));
  }

  // ---- advice ----
  if (req.load.case === 'tension-normal' && req.load.cyclic) {
    warnings.push(warn('PJP_CYCLIC_TENSION', 'A PJP groove weld in tension normal to its axis under cyclic load: the unfused root is a crack-like notch; fatigue is outside these checks. Consider a CJP groove weld.'));
  }
  if (electrodeMatch(FEXX, parts.map((p) => p.resolved.fu), sys) === 'over') {
    warnings.push(warn('ELECTRODE_OVERMATCHED', `FEXX = ${num(FEXX)} ${units.stress} is well above Fu = ${num(Math.min(...parts.map((p) => p.resolved.fu)))} ${units.stress} of the weakest part.`));
  }
  if (req.demand === null) warnings.push(warn('NO_DEMAND_GIVEN', 'No load.force given: the answer reports available strengths only.'));

  const values: PjpValues = {
    fexx: FEXX,
    loadCase: req.load.case,
    throatSource,
    sides,
    throat,
    radius,
    radiusAssumed,
    length: L,
    area: Awe,
    weldStress,
    weldMetalNominal: weldNominal,
    thinnerPart: tThin,
    minThroat,
    governingSide: 'none',
    parts: partValues,
  };
  const result = summarise(checks, limits, warnings, values);
  result.values.governingSide = governingSide(result);
  if (result.values.governingSide === 'base-metal' && demand > 0) {
    result.warnings.push(warn('BASE_METAL_GOVERNS', `${result.governing.code} of parts[${result.governing.part ?? 0}] governs over the weld metal.`));
  }
  return result;
}

// ------------------------------------------------------------------ CJP

export function checkCjp(req: CjpRequest): EngineResult<CjpValues> {
  const units = unitSystem(req.units);
  const sys = req.units;
  const electrode = resolveElectrode(req.electrode, sys, '/electrode');
  const FEXX = electrode.fexx;
  const parts = resolveParts(req.parts, sys);
  const demand = req.demand ?? 0;
  const warnings: Warning[] = [];
  const limits: Limit[] = [];
  const L = req.length;
  const throat = teCjp(parts.map((p) => p.thickness));
  const area = throat * L;
  const loadCase = req.load.case;

  // ---- strength: the base metal controls (Table J2.5), each part on the CJP effective area ----
  const checks: Check[] = [];
  if (loadCase === 'parallel') {
    const reason = TABLE_J2_5_PJP.parallel.exemptReason ?? '';
    checks.push(exemptCheck('GROOVE_BASE_METAL_EXEMPT', demand, `Table J2.5: ${reason}`));
    warnings.push(warn('GROOVE_LOAD_CASE_EXEMPT', `${loadCase}: ${reason}`));
  } else {
    parts.forEach((p, i) => {
      if (loadCase === 'tension-normal' || loadCase === 'shear') {
        const r = partChecks(req.method, units, { thickness: throat, steel: p.resolved, faces: 1, loading: loadCase === 'shear' ? 'shear' : 'tension' }, L, demand, i);
        checks.push(...r.checks);
      } else {
        checks.push(strengthCheck('BASE_METAL_COMPRESSION_YIELD', 'Eq. J4-6', req.method, RnCompressionYield(p.resolved.fy, area, units), COMPRESSION_YIELD, demand, i));
      }
    });
  }

  // ---- filler metal (Table J2.5); matching judged against the weaker part joined ----
  const fuWeaker = Math.min(...parts.map((p) => p.resolved.fu));
  const matchingFexx = MATCHING.matchRatio * fuWeaker;
  const fillerRule = cjpFillerRule(loadCase);
  const fillerRequired = fillerRule === 'matching' ? matchingFexx : fillerRule === 'one-level-below-permitted' ? matchingFexx - FILLER_STRENGTH_LEVEL[sys] : 0;
  limits.push(
    limit('CJP_FILLER_MATCHING', 'min', fillerRequired, FEXX, {},
      fillerRule === 'below-matching-permitted'
        ? { pass: true, note: 'Table J2.5: for tension or compression parallel to the axis, filler metal equal to or below matching is permitted; no minimum applies.' }
        : undefined),
  );
  if (fillerRule === 'one-level-below-permitted') {
    const last = limits[limits.length - 1]!;
    last.note = `Table J2.5: compression normal to the axis permits filler metal one strength level (${FILLER_STRENGTH_LEVEL[sys]} ${units.stress}) below matching.`;
  } else if (fillerRule === 'matching') {
    const last = limits[limits.length - 1]!;
    last.note = `Table J2.5: matching filler metal is required for ${loadCase === 'shear' ? 'shear' : 'tension normal to the axis'}; matching taken as FEXX >= ${MATCHING.matchRatio} × Fu of the weaker part.`;
  }

  // ---- advice ----
  warnings.push(warn('CJP_INSPECTION', 'Specify the inspection of this CJP groove weld: visual, and ultrasonic or radiographic testing where the project specifies it.'));
  if (loadCase === 'tension-normal' && req.backingLeftInPlace && req.joint !== 'butt') {
    warnings.push(warn('CJP_NOTCH_TOUGH_FILLER', `A CJP groove weld in a ${req.joint} joint with backing left in place, in tension normal to its axis, needs notch-tough filler metal (§J2.6).`));
  }
  if (electrodeMatch(FEXX, parts.map((p) => p.resolved.fu), sys) === 'over') {
    warnings.push(warn('ELECTRODE_OVERMATCHED', `FEXX = ${num(FEXX)} ${units.stress} is well above Fu = ${num(fuWeaker)} ${units.stress} of the weakest part.`));
  }
  if (req.demand === null) warnings.push(warn('NO_DEMAND_GIVEN', 'No load.force given: the answer reports available strengths only.'));

  const values: CjpValues = {
    fexx: FEXX,
    loadCase,
    throat,
    length: L,
    area,
    fillerRule,
    matchingFexx,
    fillerRequired,
    governingSide: 'none',
    parts: parts.map((p) => ({ thickness: p.thickness, fy: p.resolved.fy, fu: p.resolved.fu, area })),
  };
  const result = summarise(checks, limits, warnings, values);
  result.values.governingSide = governingSide(result);
  return result;
}
