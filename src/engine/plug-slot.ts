/**
 * Plug and slot weld check (AISC 360-22 §J2.3): weld metal shear on the nominal area of the
 * holes or slots in the faying plane (Table J2.5), the base metal of each lapped part (§J4.2),
 * every geometric limit of §J2.3b as a limit with its required and provided values, and advice.
 * Pure: numbers in, result out, in the request's own unit system.
 *
 * Base-metal model (our reading of Table J2.5, "base metal: governed by §J4" for plug and slot
 * welds in shear parallel to the faying surface, with §J2.4(a), which names rupture as the
 * base-metal limit state of a welded joint). The force passes from the part with the holes
 * into the weld through the wall of each hole, across the faying plane through the weld metal,
 * and into the other part through the weld's fused face on that part's surface:
 * - the part WITH the holes shears around the perimeter of each hole, through the depth the
 *   weld is fused to the wall (the depth of fill: the fill and not the full thickness, since
 *   the weld does not reach above it). This is the family's usual plane of a part along a weld
 *   line (src/engine/base-metal.ts), the line being the hole's perimeter: shear yielding
 *   (Eq. J4-3) and shear rupture (Eq. J4-4) on Agv = Anv = count × perimeter × fill. A uniform
 *   traction of 0.60·Fy (or 0.60·Fu) in the direction of the load over the whole wall is
 *   within the steel's strength at every point of it, so this is a lower bound of what the
 *   ring of steel round each weld can pass on;
 * - the part WITHOUT the holes takes the force on the weld's fused face in the faying plane,
 *   whose area is the welds' effective area: shear rupture (Eq. J4-4, FnBM = 0.60·Fu) on
 *   Anv = count × Awe. It shares the plane with the weld metal, so with phi 0.75 on both the
 *   lower of 0.60·Fu and 0.60·FEXX governs: an E70 plug on A36 (Fu 58 ksi) or A572 Grade 50
 *   (Fu 65 ksi) is governed by this face. Shear yielding is not checked on a fused face: §J2.4(a)
 *   names rupture for the base metal of welded joints, and the steel under the weld is confined
 *   on every side.
 * Tear-out of the holed part towards an edge, block shear and the members themselves are
 * outside this check (see the notice).
 */
import { partChecks } from './base-metal.js';
import { EngineError } from './errors.js';
import { electrodeMatch, resolveElectrode, resolveSteel, type ElectrodeSpec, type SteelSpec } from './materials.js';
import { RnShearRupture } from './provisions/base-metal.js';
import { Fnw, RnWeld } from './provisions/fillet.js';
import {
  AwePlug,
  AweSlot,
  dMaxPlug,
  dMinPlug,
  fillMin,
  lMaxSlot,
  perimeterPlug,
  perimeterSlot,
  rMinSlotEnd,
  sMinPlug,
  sMinSlotAcross,
  sMinSlotAlong,
  slotStraightLength,
  wMaxSlot,
  wMinSlot,
  type SlotEnd,
} from './provisions/plug-slot.js';
import { FACTORS, type Method } from './provisions/resistance.js';
import { limit, strengthCheck, summarise, warn, type Check, type EngineResult, type Limit, type Warning } from './result.js';
import { unitSystem, type UnitSystemId } from './units.js';

export type { SlotEnd } from './provisions/plug-slot.js';

export interface PlugGeometry {
  shape: 'plug';
  /** Hole diameter at the faying surface. */
  diameter: number;
}

export interface SlotGeometry {
  shape: 'slot';
  /** Overall length of the slot, end to end (to the part's edge for an end that runs out to it). */
  length: number;
  width: number;
  /** Shape of each end. */
  ends: [SlotEnd, SlotEnd];
  /** Corner radius of ends with rounded corners; null when no end has them. */
  radius: number | null;
}

export type HolePattern = (PlugGeometry | SlotGeometry) & {
  /** Number of identical plugs or slots. */
  count: number;
  /** Centre-to-centre spacing along a line (along the slots' length for slots); null when not given. */
  spacing: number | null;
  /** Centre-to-centre spacing across: between lines of slots, or between rows of plugs; null when not given. */
  spacingAcross: number | null;
};

export interface PlugSlotPart {
  thickness: number;
  steel: SteelSpec;
  /** This part contains the holes or slots. */
  hasHole: boolean;
}

export interface PlugSlotRequest {
  method: Method;
  units: UnitSystemId;
  electrode: ElectrodeSpec;
  hole: HolePattern;
  /** Depth of fill (the thickness of the weld); null: the least depth the rule allows. */
  fill: number | null;
  /** The two lapped parts; exactly one has the holes. */
  parts: PlugSlotPart[];
  /** Required shear strength of the whole pattern in the faying plane; null when not given. */
  demand: number | null;
  /** Force normal to the faying surface the caller expects the welds to carry; null or 0 for none. */
  tension: number | null;
}

export interface PlugSlotPartValues {
  thickness: number;
  fy: number;
  fu: number;
  /** Where the part meets the weld: the wall of the holes, or the faying surface. */
  plane: 'hole-wall' | 'faying-surface';
  /** Shear area of that plane for the whole pattern. */
  area: number;
}

export interface PlugSlotValues {
  shape: 'plug' | 'slot';
  fexx: number;
  count: number;
  /** Index into parts[] of the part with the holes. */
  holePart: number;
  /** Thickness t of the part with the holes (the t of the limits). */
  thickness: number;
  fill: number;
  fillGiven: boolean;
  fillRequired: number;
  /** Effective area of one plug or slot in the faying plane. */
  area: number;
  /** Effective area of the whole pattern, count × area. */
  effectiveArea: number;
  /** Perimeter of the wall of one hole or slot. */
  perimeter: number;
  /** The range of sizes the limits allow for this part and fill. */
  allowed: { dimension: 'diameter' | 'width'; min: number; max: number; lengthMax?: number };
  /** Least centre-to-centre spacings the limits ask for. */
  spacingRequired: { along: number; across: number };
  weldMetalNominal: number;
  parts: PlugSlotPartValues[];
}

const TOL = 1e-9;

export function checkPlugSlot(req: PlugSlotRequest): EngineResult<PlugSlotValues> {
  const units = unitSystem(req.units);
  const sys = req.units;
  const electrode = resolveElectrode(req.electrode, sys, '/electrode');
  const FEXX = electrode.fexx;
  const hole = req.hole;

  const holed = req.parts.map((p, i) => (p.hasHole ? i : -1)).filter((i) => i >= 0);
  if (req.parts.length !== 2 || holed.length !== 1) {
    throw new EngineError('GEOMETRY_MEANINGLESS', 'A plug or slot weld joins two lapped parts, exactly one of which contains the holes or slots.', '/parts');
  }
  const holePart = holed[0]!;
  const parts = req.parts.map((p, i) => Object.assign({}, p, { steel: resolveSteel(p.steel, p.thickness, sys, `/parts/${i}/steel`) }));
  const t = parts[holePart]!.thickness;

  // ---- depth of fill ----
  const fillRule = fillMin(t, sys);
  const fill = req.fill ?? fillRule.depth;
  if (fill > t * (1 + TOL)) {
    throw new EngineError('GEOMETRY_MEANINGLESS', `The depth of fill (${fill}) is more than the thickness of the part with the holes (${t}).`, '/fill');
  }

  // ---- geometry of one hole or slot ----
  let area: number;
  let perimeter: number;
  let along: number;
  let across: number;
  if (hole.shape === 'plug') {
    area = AwePlug(hole.diameter);
    perimeter = perimeterPlug(hole.diameter);
    along = hole.diameter;
    across = hole.diameter;
  } else {
    const rounded = hole.ends.includes('rounded');
    const r = rounded ? hole.radius ?? 0 : 0;
    if (rounded && (r <= 0 || r > hole.width / 2 + TOL * hole.width)) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `A corner radius of ${r} does not fit a slot ${hole.width} wide (at most half the width).`, '/hole/radius');
    }
    if (slotStraightLength(hole.length, hole.width, hole.ends, r) < -TOL * hole.length) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `A slot ${hole.length} long is too short for ends of that shape on a width of ${hole.width}.`, '/hole/length');
    }
    area = AweSlot(hole.length, hole.width, hole.ends, r);
    perimeter = Math.max(0, perimeterSlot(hole.length, hole.width, hole.ends, r));
    along = hole.length;
    across = hole.width;
  }
  if (hole.count > 1) {
    if (hole.spacing === null && hole.spacingAcross === null) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `A pattern of ${hole.count} needs the spacing of its holes or slots.`, '/hole/spacing');
    }
    if (hole.spacing !== null && hole.spacing < along * (1 - TOL)) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `Holes or slots ${along} long spaced ${hole.spacing} apart would overlap.`, '/hole/spacing');
    }
    if (hole.spacingAcross !== null && hole.spacingAcross < across * (1 - TOL)) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `Holes or slots ${across} wide spaced ${hole.spacingAcross} apart across would overlap.`, '/hole/spacingAcross');
    }
  }
  const effectiveArea = hole.count * area;
  const demand = req.demand ?? 0;
  const warnings: Warning[] = [];
  const limits: Limit[] = [];
  const at = { part: holePart };

  // ---- strength: weld metal, then the base metal of each part ----
  const weldMetalNominal = RnWeld(Fnw(FEXX), effectiveArea, units);
  const checks: Check[] = [strengthCheck('PLUG_SLOT_WELD_METAL', 'Eq. J2-3', req.method, weldMetalNominal, FACTORS.weldShear, demand)];
  const partValues: PlugSlotPartValues[] = parts.map((p, i) => {
    const { fy, fu } = p.steel;
    if (i === holePart) {
      const r = partChecks(req.method, units, { thickness: fill, steel: p.steel, faces: 1, loading: 'shear' }, hole.count * perimeter, demand, i);
      checks.push(...r.checks);
      return { thickness: p.thickness, fy, fu, plane: 'hole-wall', area: r.values.area };
    }
    checks.push(strengthCheck('BASE_METAL_SHEAR_RUPTURE', 'Eq. J4-4', req.method, RnShearRupture(fu, effectiveArea, units), FACTORS.shearRupture, demand, i));
    return { thickness: p.thickness, fy, fu, plane: 'faying-surface', area: effectiveArea };
  });

  // ---- geometric limits ----
  const fillLimit = limit('PLUG_SLOT_FILL_DEPTH', 'min', fillRule.depth, fill, at);
  fillLimit.note = fillRule.full ? 'Part up to 5/8 in (16 mm): the fill equals its thickness.' : 'Part over 5/8 in (16 mm): at least half its thickness and at least 5/8 in (16 mm).';
  limits.push(fillLimit);
  if (req.fill === null) {
    warnings.push(warn('PLUG_SLOT_FILL_ASSUMED', `No fill given: the depth of fill was taken as ${fmt(fill)} ${units.length}, the least the rule allows for a ${fmt(t)} ${units.length} part${fillRule.full ? ' (the full thickness)' : ''}.`));
  }
  let allowed: PlugSlotValues['allowed'];
  let spacingRequired: PlugSlotValues['spacingRequired'];
  if (hole.shape === 'plug') {
    const dMin = dMinPlug(t, sys);
    const dMax = dMaxPlug(t, fill, sys);
    allowed = { dimension: 'diameter', min: dMin, max: dMax };
    limits.push(limit('PLUG_HOLE_DIAMETER_MIN', 'min', dMin, hole.diameter, at));
    limits.push(limit('PLUG_HOLE_DIAMETER_MAX', 'max', dMax, hole.diameter, at));
    const sMin = sMinPlug(hole.diameter);
    spacingRequired = { along: sMin, across: sMin };
    if (hole.count > 1) {
      if (hole.spacing !== null) limits.push(noted(limit('PLUG_SPACING', 'min', sMin, hole.spacing, at), 'Spacing along a row (hole.spacing).'));
      if (hole.spacingAcross !== null) limits.push(noted(limit('PLUG_SPACING', 'min', sMin, hole.spacingAcross, at), 'Spacing between rows (hole.spacingAcross).'));
    }
  } else {
    const wMin = wMinSlot(t, sys);
    const wMax = wMaxSlot(fill);
    const lMax = lMaxSlot(fill);
    allowed = { dimension: 'width', min: wMin, max: wMax, lengthMax: lMax };
    limits.push(limit('SLOT_WIDTH_MIN', 'min', wMin, hole.width, at));
    limits.push(limit('SLOT_WIDTH_MAX', 'max', wMax, hole.width, at));
    if (wMin > wMax * (1 + TOL)) {
      warnings.push(warn('SLOT_NO_COMPLIANT_WIDTH', `The least slot width ${fmt(wMin)} ${units.length} for a ${fmt(t)} ${units.length} part exceeds the largest, 2-1/4 × the fill = ${fmt(wMax)} ${units.length}.`));
    }
    limits.push(limit('SLOT_LENGTH_MAX', 'max', lMax, hole.length, at));
    if (hole.ends.includes('rounded')) limits.push(limit('SLOT_END_RADIUS', 'min', rMinSlotEnd(t), hole.radius ?? 0, at));
    spacingRequired = { along: sMinSlotAlong(hole.length), across: sMinSlotAcross(hole.width) };
    if (hole.count > 1) {
      if (hole.spacing !== null) limits.push(limit('SLOT_SPACING_ALONG', 'min', spacingRequired.along, hole.spacing, at));
      if (hole.spacingAcross !== null) limits.push(limit('SLOT_SPACING_ACROSS', 'min', spacingRequired.across, hole.spacingAcross, at));
    }
  }

  // ---- advice ----
  if (req.tension !== null && req.tension > 0) {
    warnings.push(warn('PLUG_SLOT_TENSION', `A force of ${fmt(req.tension)} ${units.force} normal to the faying surface was given; plug and slot welds are for shear in the faying plane, and no tension strength is reported for them.`));
  }
  const fuParts = parts.map((p) => p.steel.fu);
  const match = electrodeMatch(FEXX, fuParts, sys);
  if (match === 'under') warnings.push(warn('ELECTRODE_UNDERMATCHED', `FEXX = ${fmt(FEXX)} ${units.stress} is below matching filler metal for Fu = ${fmt(Math.max(...fuParts))} ${units.stress}.`));
  if (match === 'over') warnings.push(warn('ELECTRODE_OVERMATCHED', `FEXX = ${fmt(FEXX)} ${units.stress} is well above Fu = ${fmt(Math.min(...fuParts))} ${units.stress} of the weakest part.`));
  if (req.demand === null) warnings.push(warn('NO_DEMAND_GIVEN', 'No load.force given: the answer reports available strengths only.'));

  const values: PlugSlotValues = {
    shape: hole.shape,
    fexx: FEXX,
    count: hole.count,
    holePart,
    thickness: t,
    fill,
    fillGiven: req.fill !== null,
    fillRequired: fillRule.depth,
    area,
    effectiveArea,
    perimeter,
    allowed,
    spacingRequired,
    weldMetalNominal,
    parts: partValues,
  };
  const result = summarise(checks, limits, warnings, values);
  if (result.governing.code !== 'PLUG_SLOT_WELD_METAL' && demand > 0) {
    result.warnings.push(warn('BASE_METAL_GOVERNS', `${result.governing.code} of parts[${result.governing.part ?? 0}] (${result.governing.part === holePart ? 'the wall of the holes' : 'the faying surface'}) governs over the weld metal.`));
  }
  return result;
}

function noted(l: Limit, note: string): Limit {
  l.note = note;
  return l;
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
