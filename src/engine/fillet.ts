/**
 * Fillet weld check: strength of one line or a concentric group of lines (AISC 360-22 §J2.4),
 * the base metal of each connected part (§J4), the detailing limits (§J2.2b, Table J2.4) and
 * advice. Pure: numbers in, result out, in the request's own unit system.
 */
import { partChecks, type Loading } from './base-metal.js';
import { EngineError } from './errors.js';
import { electrodeMatchRange, partSteelPointer, resolveElectrode, resolveSteel, type ElectrodeSpec, type SteelSpec } from './materials.js';
import { DETAILING, lMin, lMinIntermittent, lapMin, tMatch, wMaxEdge, wMin } from './provisions/detailing.js';
import { Fnw, RnMixedGroup, RnWeld, endLoadedLength, kds, shortWeldEffectiveSize, te } from './provisions/fillet.js';
import { FACTORS, type Method } from './provisions/resistance.js';
import { limit, strengthCheck, summarise, warn, type Check, type EngineResult, type Limit, type Warning } from './result.js';
import { unitSystem, type UnitSystemId } from './units.js';

export interface FilletLine {
  /** Leg on parts[0] and leg on parts[1] (equal legs: both the size). */
  legs: [number, number];
  /** Length of one line; of one segment when intermittent. */
  length: number;
  /** Angle between the load and the weld axis, degrees, 0 (longitudinal) to 90 (transverse). */
  angle: number;
  /** Number of identical lines. */
  count: number;
  /** Longitudinal weld at the end of an axially loaded member (length reduction applies). */
  endLoaded: boolean;
  /** The drawings call for the weld to be built out to full throat along an edge. */
  builtOut: boolean;
  intermittent: { segments: number; pitch: number } | null;
}

export interface FilletPart {
  thickness: number;
  steel: SteelSpec;
  /** The welds run along an edge of this part (maximum-size rule). */
  edge: boolean;
  faces: 1 | 2;
  loading: Loading;
}

export interface FilletRequest {
  method: Method;
  units: UnitSystemId;
  electrode: ElectrodeSpec;
  welds: FilletLine[];
  parts: FilletPart[];
  /** Required strength of the whole joint; null when not given. */
  demand: number | null;
  /** Use the directional increase of Eq. J2-5 / J2-6 where the Specification permits it. */
  directionalIncrease: boolean;
  /** Lap of a lap joint, when the joint is one. */
  lap: number | null;
  /** Perpendicular distance between longitudinal welds used alone at the end of a flat bar. */
  flatBarWidth: number | null;
}

export type GroupRule = 'linear' | 'mixed-J2-6a' | 'mixed-J2-6b' | 'no-increase';

export interface FilletLineValues {
  size: number;
  legs: [number, number];
  throat: number;
  effectiveSize: number;
  effectiveThroat: number;
  /** Effective length of all lines of this entry together. */
  effectiveLength: number;
  beta: number;
  kds: number;
  area: number;
  nominal: number;
}

export interface FilletValues {
  fexx: number;
  groupRule: GroupRule;
  /** Effective throat of the first weld entry (the usual single-size case). */
  throat: number;
  /** Total effective length of all lines. */
  effectiveLength: number;
  /** Total effective throat area Awe. */
  area: number;
  weldMetalNominal: number;
  welds: FilletLineValues[];
  parts: Array<{ thickness: number; fy: number; fu: number; planeLength: number; area: number; tMatch: number }>;
}

const same = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));

export function checkFillet(req: FilletRequest): EngineResult<FilletValues> {
  const units = unitSystem(req.units);
  const sys = req.units;
  const det = DETAILING[sys];
  const electrode = resolveElectrode(req.electrode, sys, '/electrode');
  const FEXX = electrode.fexx;
  const parts = req.parts.map((p, i) => ({ thickness: p.thickness, edge: p.edge, faces: p.faces, loading: p.loading, steel: resolveSteel(p.steel, p.thickness, sys, partSteelPointer(i)) }));
  let fuMin = Infinity;
  let fuMax = -Infinity;
  let tThin = Infinity;
  for (const p of parts) {
    fuMin = Math.min(fuMin, p.steel.fu);
    fuMax = Math.max(fuMax, p.steel.fu);
    tThin = Math.min(tThin, p.thickness);
  }
  const demand = req.demand ?? 0;
  const warnings: Warning[] = [];
  const limits: Limit[] = [];

  // ---- geometry of each weld entry ----
  const lines = req.welds.map((w, i) => {
    if (w.intermittent && w.intermittent.segments > 1 && w.intermittent.pitch < w.length) {
      throw new EngineError('INTERMITTENT_PITCH_TOO_SHORT', `welds[${i}]: pitch ${w.intermittent.pitch} is shorter than the segment length ${w.length}.`, `/welds/${i}/intermittent/pitch`);
    }
    const [a, b] = w.legs;
    const size = Math.min(a, b);
    const throat = te(a, b);
    const effectiveSize = shortWeldEffectiveSize(size, w.length);
    const effectiveThroat = throat * (effectiveSize / size);
    // The length reduction of §J2.2b is for longitudinal welds at the end of an axially loaded member.
    const reduced = w.endLoaded && same(w.angle, 0) ? endLoadedLength(w.length, size) : { effective: w.length, beta: 1 };
    const segments = w.intermittent ? w.intermittent.segments : 1;
    const effectiveLength = reduced.effective * segments * w.count;
    const grossLength = w.length * segments * w.count;
    return { input: w, index: i, size, throat, effectiveSize, effectiveThroat, beta: reduced.beta, effectiveLength, grossLength, area: effectiveThroat * effectiveLength };
  });

  // ---- weld metal: which group rule applies ----
  const uniformSize = lines.every((l) => same(l.input.legs[0], lines[0]!.input.legs[0]) && same(l.input.legs[1], lines[0]!.input.legs[1]));
  const angles = lines.map((l) => l.input.angle);
  const oneAngle = angles.every((t) => same(t, angles[0]!));
  const onlyLongTrans = angles.every((t) => same(t, 0) || same(t, 90));
  let groupRule: GroupRule;
  let lineKds: number[];
  let weldNominal: number;
  let equation: string;
  if (!req.directionalIncrease || (oneAngle && same(angles[0]!, 0))) {
    // Longitudinal lines gain nothing from the increase; with the increase switched off no rule uses it.
    groupRule = req.directionalIncrease ? 'linear' : 'no-increase';
    lineKds = lines.map(() => 1);
    weldNominal = lines.reduce((s, l) => s + RnWeld(Fnw(FEXX), l.area, units), 0);
    equation = 'Eq. J2-4';
  } else if (oneAngle && uniformSize) {
    groupRule = 'linear';
    lineKds = lines.map((l) => kds(l.input.angle));
    weldNominal = lines.reduce((s, l, i) => s + RnWeld(Fnw(FEXX, lineKds[i]), l.area, units), 0);
    equation = 'Eq. J2-4, J2-5';
  } else if (onlyLongTrans && uniformSize) {
    lineKds = lines.map(() => 1);
    const Rnwl = lines.filter((l) => same(l.input.angle, 0)).reduce((s, l) => s + RnWeld(Fnw(FEXX), l.area, units), 0);
    const Rnwt = lines.filter((l) => same(l.input.angle, 90)).reduce((s, l) => s + RnWeld(Fnw(FEXX), l.area, units), 0);
    const mixed = RnMixedGroup(Rnwl, Rnwt);
    weldNominal = mixed.Rn;
    groupRule = mixed.option === 'a' ? 'mixed-J2-6a' : 'mixed-J2-6b';
    equation = mixed.option === 'a' ? 'Eq. J2-6a' : 'Eq. J2-6b';
  } else {
    groupRule = 'no-increase';
    lineKds = lines.map(() => 1);
    weldNominal = lines.reduce((s, l) => s + RnWeld(Fnw(FEXX), l.area, units), 0);
    equation = 'Eq. J2-4';
    warnings.push(warn('DIRECTIONAL_INCREASE_NOT_APPLIED', uniformSize
      ? 'The lines are loaded at angles other than 0 and 90 degrees in one group; the weld strength was taken without the directional increase.'
      : 'The lines are not all of one size; the weld strength was taken without the directional increase.'));
  }

  const checks: Check[] = [strengthCheck('FILLET_WELD_METAL', equation, req.method, weldNominal, FACTORS.weldShear, demand)];

  // ---- base metal of each part ----
  let totalGross = 0;
  let maxThroat = -Infinity;
  for (const l of lines) {
    totalGross += l.grossLength;
    maxThroat = Math.max(maxThroat, l.throat);
  }
  const partValues = parts.map((p, i) => {
    const r = partChecks(req.method, units, p, totalGross, demand, i);
    for (const c of r.checks) checks.push(c);
    return { thickness: p.thickness, fy: p.steel.fy, fu: p.steel.fu, planeLength: r.values.planeLength, area: r.values.area, tMatch: tMatch(FEXX, maxThroat, p.steel.fu, p.faces) };
  });

  // ---- detailing limits ----
  for (const l of lines) {
    const w = l.input;
    limits.push(limit('FILLET_MIN_SIZE', 'min', wMin(tThin, sys), l.size, { weld: l.index }));
    parts.forEach((p, pi) => {
      if (!p.edge) return;
      const leg = w.legs[pi === 0 ? 0 : 1];
      const max = wMaxEdge(p.thickness, sys);
      limits.push(limit('FILLET_MAX_SIZE_EDGE', 'max', max, leg, { weld: l.index, part: pi },
        w.builtOut && leg > max ? { pass: true, note: 'Built out to full throat as the drawings call for.' } : undefined));
    });
    const short = w.length < lMin(l.size) - 1e-12;
    limits.push(limit('FILLET_MIN_LENGTH', 'min', lMin(l.size), w.length, { weld: l.index },
      short ? { pass: true, note: `Shorter than 4w: strength uses an effective size of ${l.effectiveSize} (length/4).` } : undefined));
    if (short) warnings.push(warn('FILLET_SHORT_EFFECTIVE_SIZE', `welds[${l.index}] is ${w.length} long, less than 4 × ${l.size}; its effective size is taken as ${l.effectiveSize}.`));
    if (w.intermittent) limits.push(limit('FILLET_INTERMITTENT_SEGMENT', 'min', lMinIntermittent(l.size, sys), w.length, { weld: l.index }));
    if (req.flatBarWidth !== null && same(w.angle, 0)) limits.push(limit('FILLET_FLAT_BAR_WELD_LENGTH', 'min', req.flatBarWidth, w.length, { weld: l.index }));
    if (w.endLoaded && !same(w.angle, 0)) {
      warnings.push(warn('END_LOADED_NOT_LONGITUDINAL', `welds[${l.index}] is marked end-loaded but loaded at ${w.angle} degrees; the length reduction applies to longitudinal welds only and was not applied.`));
    }
    if (w.endLoaded && l.beta < 1) {
      warnings.push(warn('END_LOADED_LENGTH_REDUCED', `welds[${l.index}]: l/w = ${(w.length / l.size).toFixed(1)} > 100, so the effective length is ${(l.beta * w.length).toPrecision(4)} (beta = ${l.beta.toFixed(3)}).`));
    }
    if (l.size > det.singlePassMax + 1e-12) warnings.push(warn('FILLET_MULTI_PASS', `welds[${l.index}]: a ${l.size} ${units.length} fillet usually takes more than one pass.`));
    const offStep = w.legs.some((leg) => Math.abs(leg / det.sizeStep - Math.round(leg / det.sizeStep)) > 1e-6);
    if (offStep) warnings.push(warn('FILLET_SIZE_NOT_STANDARD', `welds[${l.index}]: a leg is not a multiple of ${det.sizeStep} ${units.length}.`));
  }
  if (req.lap !== null) limits.push(limit('FILLET_LAP_LENGTH', 'min', lapMin(tThin, sys), req.lap));

  // ---- advice ----
  const match = electrodeMatchRange(FEXX, fuMin, fuMax, sys);
  if (match === 'under') warnings.push(warn('ELECTRODE_UNDERMATCHED', `FEXX = ${round(FEXX)} ${units.stress} is below matching filler metal for Fu = ${round(fuMax)} ${units.stress}.`));
  if (match === 'over') warnings.push(warn('ELECTRODE_OVERMATCHED', `FEXX = ${round(FEXX)} ${units.stress} is well above Fu = ${round(fuMin)} ${units.stress} of the weakest part.`));
  if (req.demand === null) warnings.push(warn('NO_DEMAND_GIVEN', 'No load.force given: the answer reports available strengths only.'));

  const values: FilletValues = {
    fexx: FEXX,
    groupRule,
    throat: lines[0]!.throat,
    effectiveLength: lines.reduce((s, l) => s + l.effectiveLength, 0),
    area: lines.reduce((s, l) => s + l.area, 0),
    weldMetalNominal: weldNominal,
    welds: lines.map((l, i) => ({
      size: l.size,
      legs: [l.input.legs[0], l.input.legs[1]],
      throat: l.throat,
      effectiveSize: l.effectiveSize,
      effectiveThroat: l.effectiveThroat,
      effectiveLength: l.effectiveLength,
      beta: l.beta,
      kds: lineKds[i]!,
      area: l.area,
      nominal: RnWeld(Fnw(FEXX, lineKds[i]), l.area, units),
    })),
    parts: partValues,
  };
  const result = summarise(checks, limits, warnings, values);
  if (result.governing.code !== 'FILLET_WELD_METAL' && demand > 0) {
    result.warnings.push(warn('BASE_METAL_GOVERNS', `${result.governing.code} of parts[${result.governing.part ?? 0}] governs over the weld metal.`));
  }
  return result;
}

function round(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
