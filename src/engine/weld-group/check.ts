/**
 * Eccentrically loaded fillet weld groups (AISC Manual Part 8 with AISC 360-22 §J2.4 and §J4):
 * the weld metal by the instantaneous centre method (in-plane eccentric loads), by the
 * Specification's concentric rules (loads through the centroid) or by the elastic method (loads
 * out of the weld plane, or on request); the elastic result beside the others; the base metal
 * along each segment of each connected part; the detailing limits; and the smallest standard
 * weld size for the load. Pure: numbers in, result out, in the request's own unit system.
 */
import { EngineError } from '../errors.js';
import { electrodeMatch, resolveElectrode, resolveSteel, type ElectrodeSpec, type SteelSpec } from '../materials.js';
import { RnShearRupture, RnShearYield } from '../provisions/base-metal.js';
import { DETAILING, lMin, wMaxEdge, wMin } from '../provisions/detailing.js';
import { shortWeldEffectiveSize, te } from '../provisions/fillet.js';
import { FACTORS, availableStrength, type Method } from '../provisions/resistance.js';
import { limit, strengthCheck, summarise, warn, type Check, type EngineResult, type Limit, type Warning } from '../result.js';
import { KN_PER_KIP, MM_PER_IN, convertStress, unitSystem, type UnitSystem, type UnitSystemId } from '../units.js';
import { concentricStrength, type ConcentricRule } from './concentric.js';
import { DEFAULT_ELEMENTS_PER_SEGMENT, MAX_ELEMENTS, MIN_ELEMENTS_PER_SEGMENT, discretise, elementCounts, type Mesh } from './discretise.js';
import { elasticCapacity, type ElasticResult } from './elastic.js';
import { groupProperties, segmentLength, shapeReferenceLength, shapeSegments, validateSegments, type GroupProperties, type Segment, type ShapeSpec, type Vec2 } from './geometry.js';
import { solveIcr, type IcrSolution } from './icr-solver.js';

export type Analysis = 'icr' | 'elastic';

export interface WeldGroupLoad {
  /** Direction of the force (any length): x, y in the plane of the welds, z normal to it. */
  readonly direction: readonly [number, number, number];
  /** The required strength: the force's magnitude (0: capacities only). */
  readonly magnitude: number;
  /** A point on the load's line in the plane (absolute coordinates), or null when `eccentricity` is given. */
  readonly at: Vec2 | null;
  /** Signed distance of the in-plane load line from the centroid (moment P·e, counter-clockwise positive), when `at` is not given. */
  readonly eccentricity: number | null;
  /** Distance of the point of application from the plane of the welds (out-of-plane eccentricity). */
  readonly standoff: number;
}

export interface WeldGroupPart {
  readonly thickness: number;
  readonly steel: SteelSpec;
  /** Indexes of the segments that run along this part; null: all. */
  readonly segments: readonly number[] | null;
  /** The welds run along an edge of this part (maximum-size rule). */
  readonly edge: boolean;
}

export interface WeldGroupRequest {
  readonly method: Method;
  readonly units: UnitSystemId;
  readonly electrode: ElectrodeSpec;
  /** Fillet leg size, one for the group; null: size the weld for the load. */
  readonly size: number | null;
  /** The segments, or null when `shape` is given. */
  readonly segments: readonly Segment[] | null;
  readonly shape: ShapeSpec | null;
  readonly load: WeldGroupLoad;
  readonly parts: readonly WeldGroupPart[];
  /** Which method governs the weld check for an eccentric in-plane load. */
  readonly analysis: Analysis;
  /** Total number of elements; null: DEFAULT_ELEMENTS_PER_SEGMENT per segment. */
  readonly elements: number | null;
  /** Length l of C = Pn/(D·l); null: the shape's main lines, or the longest segment. */
  readonly referenceLength: number | null;
  /** Solve again with half the elements to estimate the discretisation error. */
  readonly estimateError: boolean;
  /** The caller's clock (ms) and the time allowed for the whole analysis; the engine never reads a clock itself. */
  readonly clock?: { readonly now: () => number; readonly limitMs: number };
}

export type GoverningMethod = 'icr' | 'concentric-rule' | 'elastic' | 'elastic-out-of-plane';

export interface WeldGroupValues {
  /** Which method gave the weld metal check. */
  method: GoverningMethod;
  concentricRule: ConcentricRule | null;
  fexx: number;
  size: number;
  throat: number;
  totalLength: number;
  /** Required strength: the magnitude of the load. */
  demand: number;
  /** Unit direction of the load (x, y in the weld plane, z normal to it). */
  direction: [number, number, number];
  centroid: [number, number];
  /** A point on the load's line in the plane. */
  loadPoint: [number, number];
  /** Signed distance of the in-plane load line from the centroid. */
  eccentricity: number;
  standoff: number;
  /** Nominal and available weld-metal capacity for the load's direction and line, by `method`. */
  capacityNominal: number;
  capacityAvailable: number;
  /** ICR results (null when the ICR method was not used). */
  icrCapacityNominal: number | null;
  centre: [number, number] | null;
  centreDistance: number | null;
  critical: { segment: number; element: number; point: [number, number]; radius: number | null; deformation: number; angle: number } | null;
  residuals: { fx: number; fy: number; moment: number; relative: number } | null;
  iterations: number | null;
  elements: number;
  discretisation: { elementsCoarse: number; capacityCoarse: number; relativeChange: number } | null;
  coefficient: { C: number; C1: number; CForE70: number; referenceLength: number; sixteenths: number; basis: GoverningMethod; scaling: string } | null;
  concentricCapacityNominal: number | null;
  elastic: {
    capacityNominal: number;
    capacityNominalDirectional: number | null;
    capacityAvailable: number;
    critical: { segment: number; point: [number, number] };
    outOfPlane: boolean;
  };
  sizing: { minimumSize: number; standardSize: number; sizeStep: number; method: GoverningMethod } | null;
  segments: Array<{ from: [number, number]; to: [number, number]; length: number; effectiveSize: number; throat: number; forcePerLength: number }>;
  parts: Array<{ thickness: number; fy: number; fu: number; segments: number[]; governingSegment: number | null; shearYieldNominal: number | null; shearRuptureNominal: number | null }>;
}

/** What the figure needs beyond the values: element positions and forces at capacity. */
export interface WeldGroupFigure {
  segments: Array<{ from: [number, number]; to: [number, number] }>;
  elements: Array<{ x: number; y: number; fx: number; fy: number }>;
}

export interface WeldGroupAnswer {
  result: EngineResult<WeldGroupValues>;
  /** The figure's data, made when asked for (only a drawing needs it: a JSON answer does not). */
  figure: () => WeldGroupFigure;
}

/** Largest fillet the sizing tries (in the system's length unit). */
const SIZE_CEILING: Readonly<Record<UnitSystemId, number>> = { imperial: 2, metric: 50 };
/** Most standard sizes the sizing verifies above its first estimate (each may be a solve). */
const MAX_SIZING_STEPS = 48;
/** Smallest fillet the sizing starts from when no part is given: Table J2.4's smallest row. */
const SIZE_FLOOR: Readonly<Record<UnitSystemId, number>> = { imperial: 0.125, metric: 3 };

/** Everything that depends on the weld size. */
interface Sized {
  size: number;
  sizes: number[];
  throats: number[];
  props: GroupProperties;
}

function sized(segments: readonly Segment[], w: number): Sized {
  const sizes = segments.map((s) => shortWeldEffectiveSize(w, segmentLength(s)));
  const throats = sizes.map((x) => te(x, x));
  return { size: w, sizes, throats, props: groupProperties(segments, throats) };
}

export function analyseWeldGroup(req: WeldGroupRequest): WeldGroupAnswer {
  const units = unitSystem(req.units);
  const sys = req.units;
  const det = DETAILING[sys];
  const electrode = resolveElectrode(req.electrode, sys, '/electrode');
  const FEXX = electrode.fexx;

  // ---- geometry ----
  const segments: Segment[] = req.shape ? shapeSegments(req.shape) : [...(req.segments ?? [])];
  const pointerOf = (i: number) => (req.shape ? '/shape' : `/segments/${i}`);
  if (segments.length === 0) throw new EngineError('GEOMETRY_MEANINGLESS', 'The group has no segments.', '/segments');
  validateSegments(segments, pointerOf);
  const lengths = segments.map(segmentLength);
  const totalLength = lengths.reduce((a, b) => a + b, 0);
  const parts = req.parts.map((p, i) => {
    const steel = resolveSteel(p.steel, p.thickness, sys, `/parts/${i}/steel`);
    const list = p.segments ?? segments.map((_, j) => j);
    list.forEach((j, k) => {
      if (j >= segments.length) throw new EngineError('GEOMETRY_MEANINGLESS', `parts[${i}].segments[${k}] = ${j} names no segment (the group has ${segments.length}).`, `/parts/${i}/segments/${k}`);
    });
    return { ...p, steel, list: [...new Set(list)].sort((a, b) => a - b) };
  });

  // ---- load ----
  const { standoff } = req.load;
  const demand = req.load.magnitude;
  // scaled by the largest component first, so that tiny (even subnormal) components keep their direction
  const big = Math.max(...req.load.direction.map(Math.abs));
  if (!(big > 0) || !Number.isFinite(big)) {
    throw new EngineError('WELD_GROUP_LOAD_WITHOUT_DIRECTION', 'Every force component is zero: give the load\'s components, or a magnitude and an angle.', '/load');
  }
  const scaled = req.load.direction.map((c) => c / big);
  const dn = Math.hypot(scaled[0]!, scaled[1]!, scaled[2]!);
  const dir: [number, number, number] = [scaled[0]! / dn, scaled[1]! / dn, scaled[2]! / dn];
  const fz = dir[2] * demand;
  const inPlane = Math.hypot(dir[0], dir[1]);
  const dxy: [number, number] = inPlane > 1e-15 ? [dir[0] / inPlane, dir[1] / inPlane] : [1, 0];

  // ---- size: given, or a trial one to scale from ----
  const wGiven = req.size;
  const w0 = wGiven ?? Math.max(SIZE_FLOOR[sys], det.sizeStep * 4);
  let S = sized(segments, w0);
  const [cx, cy] = S.props.centroid;
  const scale = Math.max(S.props.radius, ...segments.flatMap((s) => [Math.abs(s.from[0] - cx), Math.abs(s.from[1] - cy), Math.abs(s.to[0] - cx), Math.abs(s.to[1] - cy)]));
  const loadPoint: [number, number] = req.load.at
    ? [req.load.at[0], req.load.at[1]]
    : [cx + (req.load.eccentricity ?? 0) * dxy[1], cy - (req.load.eccentricity ?? 0) * dxy[0]];
  // in-plane arm: moment of the unit in-plane direction about the centroid
  const e = (loadPoint[0] - cx) * dxy[1] - (loadPoint[1] - cy) * dxy[0];
  const outOfPlane = dir[2] !== 0 || (standoff !== 0 && inPlane > 0);
  const concentric = !outOfPlane && Math.abs(e) <= 1e-9 * scale;
  let method: GoverningMethod;
  if (outOfPlane) method = 'elastic-out-of-plane';
  else if (concentric) method = 'concentric-rule';
  else method = req.analysis === 'elastic' ? 'elastic' : 'icr';
  const wantIcr = !outOfPlane && !concentric;

  // ---- the methods at a size ----
  const counts = elementCounts(lengths, Math.min(MAX_ELEMENTS, req.elements ?? DEFAULT_ELEMENTS_PER_SEGMENT * segments.length));
  const meshAt = (s: Sized, c: readonly number[]): Mesh => discretise(segments, s.sizes, s.throats, c, s.props, FEXX, units);
  const clock = req.clock;
  const deadline = clock ? clock.now() + clock.limitMs : Number.POSITIVE_INFINITY;
  const icrOptions = (start?: readonly [number, number, number]) => ({
    ...(start ? { start } : {}),
    ...(clock ? { now: clock.now, timeLimitMs: Math.max(0, deadline - clock.now()) } : {}),
  });
  const elasticAt = (s: Sized): ElasticResult => {
    const [px, py] = [loadPoint[0] - s.props.centroid[0], loadPoint[1] - s.props.centroid[1]];
    return elasticCapacity(segments, s.throats, s.props, { f: dir, arm: [px, py, standoff] }, FEXX, units);
  };
  const eAt = (s: Sized): number => (loadPoint[0] - s.props.centroid[0]) * dxy[1] - (loadPoint[1] - s.props.centroid[1]) * dxy[0];
  let lastMotion: [number, number, number] | undefined;
  const solved = new Map<number, { mesh: Mesh; sol: IcrSolution }>();
  const icrAt = (s: Sized, c: readonly number[] = counts): { mesh: Mesh; sol: IcrSolution } => {
    const cached = c === counts ? solved.get(s.size) : undefined;
    if (cached) return cached;
    const mesh = meshAt(s, c);
    const sol = solveIcr(mesh, { dx: dxy[0], dy: dxy[1], e: eAt(s) }, icrOptions(lastMotion));
    lastMotion = sol.motion;
    if (c === counts) solved.set(s.size, { mesh, sol });
    return { mesh, sol };
  };
  /**
   * Where no segment is shorter than 4w, every element's throat is proportional to w, and so are
   * the element law's deformation limits (Δu and Δm are multiples of w): the instantaneous centre
   * stays where it is and the capacity is proportional to w, as it is under the concentric rules
   * and the elastic method. The sizing search therefore scales its trial sizes from the first
   * such capacity instead of solving again; the reported values come from solves at the final size.
   */
  let proportional: { size: number; nominal: number } | null = null;
  const fullSizes = (s: Sized): boolean => {
    for (const x of s.sizes) if (x !== s.size) return false;
    return true;
  };
  /** Nominal weld capacity for the load by the governing method (ICR in-plane capacity scales to the full load's magnitude: the load is in-plane there). */
  const governingNominal = (s: Sized): number => {
    const full = fullSizes(s);
    if (full && proportional) return proportional.nominal * (s.size / proportional.size);
    let nominal: number;
    switch (method) {
      case 'icr':
        nominal = icrAt(s).sol.capacity;
        break;
      case 'concentric-rule':
        nominal = concentricStrength(segments, s.sizes, s.throats, dxy[0], dxy[1], FEXX, units).nominal;
        break;
      default:
        nominal = elasticAt(s).capacity;
    }
    if (full) proportional = { size: s.size, nominal };
    return nominal;
  };

  // ---- sizing (the inverse): the smallest standard size whose strength covers the load ----
  const warnings: Warning[] = [];
  const tThin = parts.length ? Math.min(...parts.map((p) => p.thickness)) : null;
  let sizing: WeldGroupValues['sizing'] = null;
  if (wGiven === null && !(demand > 0)) {
    throw new EngineError('WELD_GROUP_SIZE_OUT_OF_RANGE', 'No weld size and no load to size it for: give size, or the load\'s magnitude.', '/size');
  }
  if (demand > 0) {
    const avail0 = availableStrength(req.method, governingNominal(S), FACTORS.weldShear);
    const minimumSize = (w0 * demand) / avail0; // capacity is proportional to the size while no segment is shorter than 4·w
    const floor = tThin !== null ? wMin(tThin, sys) : SIZE_FLOOR[sys];
    let ws = Math.max(floor, Math.ceil(minimumSize / det.sizeStep - 1e-9) * det.sizeStep);
    let found: number | null = null;
    for (let k = 0; k < MAX_SIZING_STEPS && ws <= SIZE_CEILING[sys] + 1e-12; k++, ws += det.sizeStep) {
      const avail = availableStrength(req.method, governingNominal(sized(segments, ws)), FACTORS.weldShear);
      if (avail >= demand * (1 - 1e-12)) {
        found = ws;
        break;
      }
    }
    if (found !== null) sizing = { minimumSize, standardSize: found, sizeStep: det.sizeStep, method };
    else if (wGiven === null) {
      throw new EngineError('WELD_GROUP_SIZE_OUT_OF_RANGE', `No fillet up to ${SIZE_CEILING[sys]} ${units.length} carries ${round(demand)} ${units.force} on this group (the weld metal alone would need about ${round(minimumSize)} ${units.length}).`, '/size');
    }
  }
  const w = wGiven ?? sizing!.standardSize;
  if (wGiven === null) warnings.push(warn('WELD_GROUP_SIZE_CHOSEN', `No size given: ${round(w)} ${units.length} is the smallest standard size whose ${method} strength covers ${round(demand)} ${units.force}.`));
  S = sized(segments, w);
  const props = S.props;

  // ---- the methods at the final size ----
  const elastic = elasticAt(S);
  const conc = concentric ? concentricStrength(segments, S.sizes, S.throats, dxy[0], dxy[1], FEXX, units) : null;
  let icr: { mesh: Mesh; sol: IcrSolution } | null = null;
  if (wantIcr) {
    try {
      icr = icrAt(S);
    } catch (err) {
      if (method === 'icr') throw err; // the ICR result is only beside the elastic one: report without it
    }
  }
  let discretisation: WeldGroupValues['discretisation'] = null;
  if (icr && req.estimateError) {
    const coarse = counts.map((c) => Math.max(MIN_ELEMENTS_PER_SEGMENT, Math.round(c / 2)));
    try {
      const c = icrAt(S, coarse);
      discretisation = {
        elementsCoarse: c.mesh.n,
        capacityCoarse: c.sol.capacity,
        relativeChange: Math.abs(c.sol.capacity - icr.sol.capacity) / icr.sol.capacity,
      };
      if (discretisation.relativeChange > 0.005) {
        warnings.push(warn('WELD_GROUP_DISCRETISATION_COARSE', `With ${c.mesh.n} elements instead of ${icr.mesh.n} the capacity changes by ${(100 * discretisation.relativeChange).toFixed(2)} %.`));
      }
    } catch {
      discretisation = null;
    }
  }

  let nominal: number;
  let checkCode: 'WELD_GROUP_ICR' | 'WELD_GROUP_ELASTIC' | 'FILLET_WELD_METAL';
  let equation: string;
  // force per unit length on each segment per unit load, under the governing method (for the base metal)
  let perLength: number[];
  switch (method) {
    case 'icr': {
      const { mesh, sol } = icr!;
      nominal = sol.capacity;
      checkCode = 'WELD_GROUP_ICR';
      equation = 'Eq. J2-4, J2-5';
      perLength = segments.map(() => 0);
      for (let i = 0; i < mesh.n; i++) {
        const j = mesh.seg[i]!;
        const fx = sol.forces[2 * i]!;
        const fy = sol.forces[2 * i + 1]!;
        // finite, moderate forces: sqrt of the sum of squares (Math.hypot guards against overflow at several times the cost)
        const q = Math.sqrt(fx * fx + fy * fy) / mesh.len[i]! / nominal;
        if (q > perLength[j]!) perLength[j] = q;
      }
      break;
    }
    case 'concentric-rule':
      nominal = conc!.nominal;
      checkCode = 'FILLET_WELD_METAL';
      equation = conc!.equation;
      perLength = conc!.perLength.map((p) => p / nominal);
      warnings.push(warn('WELD_GROUP_CONCENTRIC_RULE', `The load passes through the centroid: the weld strength follows ${conc!.equation} (${conc!.rule}) instead of the instantaneous centre method.`));
      if (conc!.rule === 'no-increase') warnings.push(warn('DIRECTIONAL_INCREASE_NOT_APPLIED', `The weld strength was taken without the directional increase: ${conc!.note}.`));
      break;
    default:
      nominal = elastic.capacity;
      checkCode = 'WELD_GROUP_ELASTIC';
      equation = 'Eq. J2-4';
      perLength = elastic.perLength;
      if (outOfPlane) warnings.push(warn('WELD_GROUP_OUT_OF_PLANE_ELASTIC', `The load has a component normal to the weld plane (fz = ${round(fz)} ${units.force}) or acts ${round(standoff)} ${units.length} from it: the elastic method with bending governs.`));
  }
  const checks: Check[] = [strengthCheck(checkCode, equation, req.method, nominal, FACTORS.weldShear, demand)];
  if (icr && icr.sol.capacity < elastic.capacity * (1 - 1e-9)) {
    warnings.push(warn('WELD_GROUP_ICR_BELOW_ELASTIC', `Instantaneous centre ${round(icr.sol.capacity)} ${units.force} < elastic ${round(elastic.capacity)} ${units.force} (nominal, no directional increase).`));
  }

  // ---- base metal along the segments of each part ----
  const partValues = parts.map((p, pi) => {
    let yieldNominal = Number.POSITIVE_INFINITY;
    let ruptureNominal = Number.POSITIVE_INFINITY;
    let governingSegment: number | null = null;
    for (const j of p.list) {
      const q = perLength[j]!;
      if (!(q > 0)) continue;
      // strength of a unit length of the shear plane along the weld, over the force per unit length per unit load
      const ry = RnShearYield(p.steel.fy, p.thickness, units) / q;
      const rr = RnShearRupture(p.steel.fu, p.thickness, units) / q;
      if (rr < ruptureNominal) governingSegment = j;
      yieldNominal = Math.min(yieldNominal, ry);
      ruptureNominal = Math.min(ruptureNominal, rr);
    }
    const ok = Number.isFinite(yieldNominal) && Number.isFinite(ruptureNominal);
    if (ok) {
      checks.push(strengthCheck('BASE_METAL_SHEAR_YIELD', 'Eq. J4-3', req.method, yieldNominal, FACTORS.shearYield, demand, pi));
      checks.push(strengthCheck('BASE_METAL_SHEAR_RUPTURE', 'Eq. J4-4', req.method, ruptureNominal, FACTORS.shearRupture, demand, pi));
    }
    return {
      thickness: p.thickness,
      fy: p.steel.fy,
      fu: p.steel.fu,
      segments: p.list,
      governingSegment,
      shearYieldNominal: ok ? yieldNominal : null,
      shearRuptureNominal: ok ? ruptureNominal : null,
    };
  });

  // ---- detailing limits ----
  const limits: Limit[] = [];
  segments.forEach((_, j) => {
    const l = lengths[j]!;
    const short = l < lMin(w) - 1e-12;
    limits.push(limit('FILLET_MIN_LENGTH', 'min', lMin(w), l, { weld: j }, short ? { pass: true, note: `Shorter than 4w: strength uses an effective size of ${round(S.sizes[j]!)} (length/4).` } : undefined));
    if (short) warnings.push(warn('FILLET_SHORT_EFFECTIVE_SIZE', `segments[${j}] is ${round(l)} long, less than 4 × ${round(w)}; its effective size is taken as ${round(S.sizes[j]!)}.`));
  });
  if (tThin !== null) limits.push(limit('FILLET_MIN_SIZE', 'min', wMin(tThin, sys), w));
  parts.forEach((p, pi) => {
    if (p.edge) limits.push(limit('FILLET_MAX_SIZE_EDGE', 'max', wMaxEdge(p.thickness, sys), w, { part: pi }));
  });

  // ---- advice ----
  if (w > det.singlePassMax + 1e-12) warnings.push(warn('FILLET_MULTI_PASS', `A ${round(w)} ${units.length} fillet usually takes more than one pass.`));
  if (Math.abs(w / det.sizeStep - Math.round(w / det.sizeStep)) > 1e-6) warnings.push(warn('FILLET_SIZE_NOT_STANDARD', `The size ${round(w)} ${units.length} is not a multiple of ${det.sizeStep} ${units.length}.`));
  if (parts.length) {
    const match = electrodeMatch(FEXX, parts.map((p) => p.steel.fu), sys);
    if (match === 'under') warnings.push(warn('ELECTRODE_UNDERMATCHED', `FEXX = ${round(FEXX)} ${units.stress} is below matching filler metal for Fu = ${round(Math.max(...parts.map((p) => p.steel.fu)))} ${units.stress}.`));
    if (match === 'over') warnings.push(warn('ELECTRODE_OVERMATCHED', `FEXX = ${round(FEXX)} ${units.stress} is well above Fu = ${round(Math.min(...parts.map((p) => p.steel.fu)))} ${units.stress} of the weakest part.`));
  }

  // ---- values ----
  const refLength = req.referenceLength ?? (req.shape ? shapeReferenceLength(req.shape) : Math.max(...lengths));
  const coefficient = coefficientC(nominal, w, refLength, FEXX, units, method);
  const sol = icr?.sol ?? null;
  const values: WeldGroupValues = {
    method,
    concentricRule: conc ? conc.rule : null,
    fexx: FEXX,
    size: w,
    throat: te(w, w),
    totalLength,
    demand,
    direction: dir,
    centroid: [props.centroid[0], props.centroid[1]],
    loadPoint,
    eccentricity: eAt(S),
    standoff,
    capacityNominal: nominal,
    capacityAvailable: availableStrength(req.method, nominal, FACTORS.weldShear),
    icrCapacityNominal: sol ? sol.capacity : null,
    centre: sol ? sol.centre : null,
    centreDistance: sol ? sol.centreDistance : null,
    critical: sol
      ? {
          segment: sol.critical.segment,
          element: sol.critical.element,
          point: [sol.critical.point[0], sol.critical.point[1]],
          radius: sol.critical.radius,
          deformation: sol.critical.deformation,
          angle: sol.critical.angle,
        }
      : null,
    residuals: sol ? { fx: sol.residual.fx, fy: sol.residual.fy, moment: sol.residual.moment, relative: sol.residual.relative } : null,
    iterations: sol ? sol.iterations : null,
    elements: icr ? icr.mesh.n : 0,
    discretisation,
    coefficient,
    concentricCapacityNominal: conc ? conc.nominal : null,
    elastic: {
      capacityNominal: elastic.capacity,
      capacityNominalDirectional: elastic.capacityDirectional,
      capacityAvailable: availableStrength(req.method, elastic.capacity, FACTORS.weldShear),
      critical: { segment: elastic.critical.segment, point: [elastic.critical.point[0], elastic.critical.point[1]] },
      outOfPlane: elastic.outOfPlane,
    },
    sizing,
    segments: segments.map((s, j) => ({
      from: [s.from[0], s.from[1]],
      to: [s.to[0], s.to[1]],
      length: lengths[j]!,
      effectiveSize: S.sizes[j]!,
      throat: S.throats[j]!,
      forcePerLength: perLength[j]! * demand,
    })),
    parts: partValues,
  };
  if (demand === 0) warnings.push(warn('NO_DEMAND_GIVEN', 'The load has no magnitude: the answer reports capacities only.'));
  const result = summarise(checks, limits, warnings, values);
  if (result.governing.code !== checkCode && demand > 0) {
    result.warnings.push(warn('BASE_METAL_GOVERNS', `${result.governing.code} of parts[${result.governing.part ?? 0}] governs over the weld metal.`));
  }

  const figure = (): WeldGroupFigure => {
    const f: WeldGroupFigure = { segments: values.segments.map((s) => ({ from: s.from, to: s.to })), elements: [] };
    if (icr) {
      const { mesh, sol: so } = icr;
      for (let i = 0; i < mesh.n; i++) f.elements.push({ x: mesh.x[i]! + mesh.cx, y: mesh.y[i]! + mesh.cy, fx: so.forces[2 * i]!, fy: so.forces[2 * i + 1]! });
    }
    return f;
  };
  return { result, figure };
}

/**
 * The Manual's coefficient C = Pn/(D·l) in its own units (kip, in, sixteenths of an inch) for
 * the electrode used, whatever the request's units, and C1 = FEXX/70 (ksi). The Specification's
 * strength is linear in FEXX, so C/C1 is the E70 value; the Manual's tables scale other electrodes
 * by a tabulated C1 which, from memory, is not exactly FEXX/70 in every edition.
 * @cite AISC Manual Part 8
 */
export function coefficientC(Pn: number, w: number, l: number, FEXX: number, units: UnitSystem, basis: GoverningMethod): WeldGroupValues['coefficient'] {
  const metric = units.id === 'metric';
  const PnKip = metric ? Pn / KN_PER_KIP : Pn;
  const wIn = metric ? w / MM_PER_IN : w;
  const lIn = metric ? l / MM_PER_IN : l;
  const D = wIn * 16;
  if (!(D > 0) || !(lIn > 0)) return null;
  const C = PnKip / (D * lIn);
  const C1 = convertStress(FEXX, units.id, 'imperial') / 70;
  return { C, C1, CForE70: C / C1, referenceLength: l, sixteenths: D, basis, scaling: 'C for the electrode used; C1 = FEXX/70 (the Specification is linear in FEXX)' };
}

function round(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
