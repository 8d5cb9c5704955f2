/**
 * Economical fillet weld sizing: the cheapest compliant fillet (size, length per line, continuous
 * or intermittent) for a demand, with ranked alternatives, or what blocks every weld and which
 * change unblocks it. Pure.
 *
 * The search does not restate a single rule of the Specification: every candidate is judged by
 * `checkFillet` (strength of weld and base metal, detailing limits), and the size range comes
 * from the detailing provisions (Table J2.4 minimum, §J2.2b edge maximum).
 *
 * The grid (exhaustive; stated in the answer's values.search):
 * - sizes: every multiple of the size step (default 1/16 in, 1 mm) from the Table J2.4 minimum
 *   for the thinner part to the smallest of: the edge maximum of each edge part, the `maxSize`
 *   preference (default 1 in, 25 mm), and with `singlePass` the largest single-pass size;
 * - continuous lengths: the fixed length, or every multiple of the length step (default 1/4 in,
 *   5 mm) up to the maximum, and the maximum itself;
 * - intermittent layouts (when allowed), on the available line length (the fixed length or the
 *   maximum): every segment length in the length step from max(4w, 1-1/2 in (38 mm), minSegment)
 *   and every number of segments n >= 2 that fits with a gap, spread over the line at the largest
 *   pitch in the length step that fits.
 *
 * Ranking: weld metal volume (legs²/2 × total length of all lines), then estimated passes, then
 * utilization (lower first: more strength for the same metal), then continuous before
 * intermittent, smaller size, shorter length.
 *
 * Pruning, each provably safe:
 * - for one size, lengths are tried shortest first and the first compliant one ends that size's
 *   continuous search: every longer length has more weld metal and the same passes, so it ranks
 *   below it (dominance: no monotonicity assumed). The same for the number of intermittent
 *   segments of one size and segment length;
 * - intermittent layouts of a size are skipped when the continuous weld over the whole available
 *   line fails and no end-loaded reduction can apply: their total length is shorter, so every
 *   weld metal and base metal strength is lower (Eq. J2-4 and J2-6 grow with the effective
 *   length, §J4 with the gross length) and no detailing limit of the continuous weld can fail.
 */
import { checkFillet, type FilletLine, type FilletPart, type FilletRequest, type FilletValues } from './fillet.js';
import type { CheckCode, WarningCode } from './codes.js';
import { EngineError } from './errors.js';
import { ELECTRODES, electrodeMatch, resolveElectrode, resolveSteel, type ElectrodeSpec } from './materials.js';
import { DETAILING, lMinIntermittent, wMaxEdge, wMin } from './provisions/detailing.js';
import type { Method } from './provisions/resistance.js';
import { warn, type EngineResult, type Warning } from './result.js';
import { unitSystem, type UnitSystemId } from './units.js';

/** Most candidates one request may search (the full grid, before any pruning). */
export const MAX_CANDIDATES = 20000;

export const SIZING_DEFAULTS = Object.freeze({
  /** Step of searched lengths and pitches (common practice, no source). */
  lengthStep: { imperial: 0.25, metric: 5 } as Readonly<Record<UnitSystemId, number>>,
  /** Largest size searched when the request names none and no edge limits it. */
  maxSize: { imperial: 1, metric: 25 } as Readonly<Record<UnitSystemId, number>>,
  /** Largest size tried when looking for a "larger size" way out of a blocked search. */
  absoluteMaxSize: { imperial: 2, metric: 50 } as Readonly<Record<UnitSystemId, number>>,
  alternatives: 8,
});

export interface SizingPreferences {
  /** Largest size to consider. */
  maxSize?: number | null;
  /** Consider only sizes usually made in one pass (up to 5/16 in, 8 mm). */
  singlePass?: boolean;
  sizeStep?: number;
  lengthStep?: number;
  /** Also search intermittent layouts. */
  intermittent?: boolean;
  /** Shortest intermittent segment to consider (besides the §J2.2b minimum). */
  minSegment?: number | null;
  /** How many alternatives to return besides the recommendation. */
  alternatives?: number;
}

export interface SizingRequest {
  method: Method;
  units: UnitSystemId;
  /** An electrode, or 'match' for the matching classification of the strongest part. */
  electrode: ElectrodeSpec | 'match';
  /** Required strength of the whole joint (factored for LRFD, service for ASD). */
  demand: number;
  /** Angle between the load and the sized lines, degrees (0 longitudinal, 90 transverse). */
  angle: number;
  /** Number of identical sized lines. */
  lines: number;
  /** Available length of each sized line: the weld must be this long, or at most this long. */
  length: { mode: 'fixed' | 'max'; value: number };
  /** Transverse lines of given length, welded with the same size (a mixed group, Eq. J2-6). */
  transverse: { lines: number; length: number } | null;
  /** The sized lines are longitudinal welds at the end of an axially loaded member. */
  endLoaded: boolean;
  parts: FilletPart[];
  directionalIncrease: boolean;
  preferences?: SizingPreferences;
}

export type Layout = 'continuous' | 'intermittent';

export interface SizedWeld {
  /** 1 for the recommendation, 2... for the alternatives in order; 0 for a weld that does not comply. */
  rank: number;
  size: number;
  /** Length of one line (continuous) or of one segment (intermittent), as /v1/fillet/check takes it. */
  length: number;
  layout: Layout;
  /** Segments per line (1 when continuous). */
  segments: number;
  /** Centre-to-centre spacing of segments; null when continuous. */
  pitch: number | null;
  /** Length of line the weld occupies, from the start of the first segment to the end of the last. */
  span: number;
  lines: number;
  /** Deposited length of all lines, transverse ones included. */
  totalLength: number;
  /** Weld metal volume, legs²/2 × totalLength. */
  volume: number;
  passes: number;
  utilization: number;
  governing: CheckCode;
  governingPart: number | null;
}

/** A weld line as POST /v1/fillet/check takes it. */
export interface CheckWeld {
  size: number;
  length: number;
  angle: number;
  count: number;
  endLoaded: boolean;
  intermittent?: { segments: number; pitch: number };
}

export interface RecommendedWeld extends SizedWeld {
  electrode: { name: string | null; fexx: number; chosen: boolean };
  /** The recommended weld lines, ready for POST /v1/fillet/check. */
  welds: CheckWeld[];
}

export type BlockingCode = 'SIZING_SIZE_LIMITS_CROSS' | 'SIZING_BASE_METAL_TOO_THIN' | 'SIZING_LENGTH_UNAVAILABLE' | 'SIZING_NO_COMPLIANT_WELD';
export type UnblockChange = 'thicker-part' | 'longer-weld' | 'stronger-electrode' | 'larger-size' | 'size-step';

export interface Unblock {
  change: UnblockChange;
  message: string;
  /** The part to change (thicker-part). */
  part: number | null;
  /** The new value: thickness, length per line, FEXX, largest size or size step. */
  value: number;
  /** The electrode to use (stronger-electrode). */
  electrode: string | null;
  /** The weld the search recommends with this change alone; null when another block remains. */
  result: { size: number; length: number; layout: Layout; segments: number; pitch: number | null } | null;
}

export interface Blocking {
  code: BlockingCode;
  message: string;
  unblock: Unblock[];
}

export type SizeMaxBy = 'maxSize' | 'edge' | 'singlePass';

export interface SearchValues {
  /** Minimum size for the thinner part (Table J2.4). */
  sizeMinRule: number;
  /** Largest size allowed, and what set it. */
  sizeMaxRule: number;
  sizeMaxBy: SizeMaxBy;
  sizeStep: number;
  /** Number of sizes searched. */
  sizeCount: number;
  lengthStep: number;
  lengthMode: 'fixed' | 'max';
  /** The available length of each sized line. */
  span: number;
  intermittent: boolean;
  /** Candidates in the grid. */
  gridSize: number;
  /** Candidates checked (the rest were pruned as provably not better). */
  evaluated: number;
}

export interface SizingValues {
  recommended: RecommendedWeld | null;
  alternatives: SizedWeld[];
  /** When nothing complies: the strongest weld searched, whose checks the answer shows. */
  closest: SizedWeld | null;
  blocking: Blocking | null;
  search: SearchValues;
  /** The fillet check's own values for the weld shown. */
  check: FilletValues;
}

// ---------------------------------------------------------------- preparation

interface Candidate {
  size: number;
  layout: Layout;
  length: number;
  segments: number;
  pitch: number | null;
}

interface Evaluated extends Candidate {
  result: EngineResult<FilletValues>;
  pass: boolean;
  volume: number;
  passes: number;
  span: number;
  totalLength: number;
}

interface Ctx {
  req: SizingRequest;
  sys: UnitSystemId;
  electrode: { spec: ElectrodeSpec; name: string | null; fexx: number; chosen: boolean };
  span: number;
  sizeStep: number;
  lengthStep: number;
  lo: number;
  hi: number;
  hiBy: SizeMaxBy;
  sizes: number[];
  lengths: number[];
  intermittent: boolean;
  minSegment: number;
  gridSize: number;
  evaluated: number;
  alternatives: number;
}

const EPS = 1e-9;

function positive(x: number, what: string, pointer: string): void {
  if (!(Number.isFinite(x) && x > 0)) throw new EngineError('GEOMETRY_MEANINGLESS', `${what} must be a positive number (got ${x}).`, pointer);
}

/**
 * Estimated passes of a fillet of size w: one up to the largest single-pass size (5/16 in, 8 mm),
 * above it the deposit area w²/2 over the area of that single-pass fillet, rounded up (common
 * practice, no source: an estimate for ranking, not a welding procedure).
 */
export function estimatedPasses(w: number, system: UnitSystemId): number {
  const single = DETAILING[system].singlePassMax;
  if (w <= single * (1 + EPS)) return 1;
  return Math.ceil((w / single) ** 2 - EPS);
}

/** Weakest catalogue electrode of the unit system that is not under-matched for the strongest part. */
export function matchingElectrode(fuParts: readonly number[], system: UnitSystemId): { name: string; fexx: number } {
  const list = ELECTRODES.filter((e) => e.native === system).sort((a, b) => a.fexx - b.fexx);
  const pick = list.find((e) => electrodeMatch(e.fexx, fuParts, system) !== 'under') ?? list[list.length - 1]!;
  return { name: pick.name, fexx: pick.fexx };
}

function prepare(req: SizingRequest): Ctx {
  const sys = req.units;
  const det = DETAILING[sys];
  const prefs = req.preferences ?? {};
  positive(req.demand, 'load.force', '/load/force');
  positive(req.length.value, 'The available length', `/length/${req.length.mode}`);
  if (!(Number.isInteger(req.lines) && req.lines >= 1)) throw new EngineError('GEOMETRY_MEANINGLESS', `lines must be a whole number of at least 1 (got ${req.lines}).`, '/lines');
  if (req.parts.length === 0) throw new EngineError('GEOMETRY_MEANINGLESS', 'At least one connected part is needed.', '/parts');
  req.parts.forEach((p, i) => positive(p.thickness, `parts[${i}].thickness`, `/parts/${i}/thickness`));
  const sizeStep = prefs.sizeStep ?? det.sizeStep;
  const lengthStep = prefs.lengthStep ?? SIZING_DEFAULTS.lengthStep[sys];
  positive(sizeStep, 'preferences.sizeStep', '/preferences/sizeStep');
  positive(lengthStep, 'preferences.lengthStep', '/preferences/lengthStep');

  // Materials: resolved here for the electrode match (checkFillet resolves them again per candidate).
  const fus = req.parts.map((p, i) => resolveSteel(p.steel, p.thickness, sys, `/parts/${i}/steel`).fu);
  let electrode: Ctx['electrode'];
  if (req.electrode === 'match') {
    const m = matchingElectrode(fus, sys);
    electrode = { spec: m.name, name: m.name, fexx: m.fexx, chosen: true };
  } else {
    const e = resolveElectrode(req.electrode, sys, '/electrode');
    electrode = { spec: req.electrode, name: e.name, fexx: e.fexx, chosen: false };
  }

  // Size range: Table J2.4 minimum up to the tightest of the upper bounds.
  const tThin = Math.min(...req.parts.map((p) => p.thickness));
  const lo = wMin(tThin, sys);
  const bounds: Array<{ value: number; by: SizeMaxBy }> = [{ value: prefs.maxSize ?? SIZING_DEFAULTS.maxSize[sys], by: 'maxSize' }];
  req.parts.forEach((p) => {
    if (p.edge) bounds.push({ value: wMaxEdge(p.thickness, sys), by: 'edge' });
  });
  if (prefs.singlePass) bounds.push({ value: det.singlePassMax, by: 'singlePass' });
  const tightest = bounds.reduce((a, b) => (b.value < a.value ? b : a));
  const hi = tightest.value;

  const kLo = Math.ceil(lo / sizeStep - EPS);
  const kHi = Math.floor(hi / sizeStep + EPS);
  const sizeCount = Math.max(0, kHi - kLo + 1);
  const tooLarge = (what: string, pointer: string): EngineError =>
    new EngineError('SIZING_SEARCH_TOO_LARGE', `The search would check more than ${MAX_CANDIDATES} candidates (${what}); narrow it.`, pointer);
  if (sizeCount > MAX_CANDIDATES) throw tooLarge(`${sizeCount} sizes`, prefs.sizeStep !== undefined ? '/preferences/sizeStep' : '/preferences/maxSize');
  const sizes = Array.from({ length: sizeCount }, (_, i) => (kLo + i) * sizeStep);

  const span = req.length.value;
  let lengths: number[];
  if (req.length.mode === 'fixed') {
    lengths = [span];
  } else {
    const kMax = Math.floor(span / lengthStep + EPS);
    if (kMax * Math.max(1, sizeCount) > MAX_CANDIDATES) throw tooLarge(`${kMax} lengths for each of ${sizeCount} sizes`, '/preferences/lengthStep');
    lengths = Array.from({ length: kMax }, (_, i) => (i + 1) * lengthStep);
    const last = lengths[lengths.length - 1];
    if (last === undefined || Math.abs(last - span) > EPS * span) lengths.push(span);
  }

  const intermittent = prefs.intermittent ?? false;
  const minSegment = prefs.minSegment ?? 0;
  let gridSize = sizeCount * lengths.length;
  if (intermittent) {
    for (const w of sizes) {
      for (const s of segmentLengths(w, sys, minSegment, span, lengthStep)) {
        gridSize += maxSegments(span, s, lengthStep) - 1;
        if (gridSize > MAX_CANDIDATES) throw tooLarge('intermittent layouts', '/preferences/lengthStep');
      }
    }
  }
  if (gridSize > MAX_CANDIDATES) throw tooLarge(`${gridSize} candidates`, '/preferences/lengthStep');

  return {
    req,
    sys,
    electrode,
    span,
    sizeStep,
    lengthStep,
    lo,
    hi,
    hiBy: tightest.by,
    sizes,
    lengths,
    intermittent,
    minSegment,
    gridSize,
    evaluated: 0,
    alternatives: prefs.alternatives ?? SIZING_DEFAULTS.alternatives,
  };
}

/** Segment lengths on the length step from the intermittent minimum, short enough for two segments with a gap. */
function* segmentLengths(w: number, sys: UnitSystemId, minSegment: number, span: number, step: number): Generator<number> {
  const sMin = Math.max(lMinIntermittent(w, sys), minSegment);
  const kFirst = Math.max(1, Math.ceil(sMin / step - EPS));
  // n = 2 needs a pitch of at least s + step: s + (s + step) <= span.
  const kLast = Math.floor((span - step) / 2 / step + EPS);
  for (let k = kFirst; k <= kLast; k++) yield k * step;
}

/** Most segments of length s that fit on the span with a pitch of at least s + step. */
function maxSegments(span: number, s: number, step: number): number {
  return Math.floor((span - s) / (s + step) + EPS) + 1;
}

/** Largest pitch on the step for n segments of length s over the span. */
function pitchFor(span: number, s: number, n: number, step: number): number {
  return Math.floor((span - s) / ((n - 1) * step) + EPS) * step;
}

// ---------------------------------------------------------------- evaluation

function filletRequest(ctx: Ctx, c: Candidate): FilletRequest {
  const r = ctx.req;
  const welds: FilletLine[] = [
    {
      legs: [c.size, c.size],
      length: c.length,
      angle: r.angle,
      count: r.lines,
      endLoaded: r.endLoaded,
      builtOut: false,
      intermittent: c.layout === 'intermittent' ? { segments: c.segments, pitch: c.pitch! } : null,
    },
  ];
  if (r.transverse) {
    welds.push({ legs: [c.size, c.size], length: r.transverse.length, angle: 90, count: r.transverse.lines, endLoaded: false, builtOut: false, intermittent: null });
  }
  return {
    method: r.method,
    units: r.units,
    electrode: ctx.electrode.spec,
    welds,
    parts: r.parts,
    demand: r.demand,
    directionalIncrease: r.directionalIncrease,
    lap: null,
    flatBarWidth: null,
  };
}

function evaluate(ctx: Ctx, c: Candidate): Evaluated {
  ctx.evaluated++;
  const result = checkFillet(filletRequest(ctx, c));
  const r = ctx.req;
  const perLine = c.layout === 'continuous' ? c.length : c.length * c.segments;
  const totalLength = perLine * r.lines + (r.transverse ? r.transverse.length * r.transverse.lines : 0);
  const span = c.layout === 'continuous' ? c.length : (c.segments - 1) * c.pitch! + c.length;
  return {
    ...c,
    result,
    pass: result.status === 'pass',
    volume: ((c.size * c.size) / 2) * totalLength,
    passes: estimatedPasses(c.size, ctx.sys),
    span,
    totalLength,
  };
}

/** Ranking order: volume, passes, utilization, continuous first, smaller size, shorter length, fewer segments. */
export function compareWelds(
  a: Pick<SizedWeld, 'volume' | 'passes' | 'utilization' | 'layout' | 'size' | 'length' | 'segments'>,
  b: Pick<SizedWeld, 'volume' | 'passes' | 'utilization' | 'layout' | 'size' | 'length' | 'segments'>,
): number {
  const dv = a.volume - b.volume;
  if (Math.abs(dv) > EPS * Math.max(a.volume, b.volume)) return dv;
  if (a.passes !== b.passes) return a.passes - b.passes;
  const du = a.utilization - b.utilization;
  if (Math.abs(du) > EPS) return du;
  if (a.layout !== b.layout) return a.layout === 'continuous' ? -1 : 1;
  if (a.size !== b.size) return a.size - b.size;
  if (a.length !== b.length) return a.length - b.length;
  return a.segments - b.segments;
}

const rankKey = (e: Evaluated) => ({ ...e, utilization: e.result.utilization });

/** The exhaustive search: for each size, the cheapest compliant continuous and intermittent welds. */
function search(ctx: Ctx): Evaluated[] {
  const found: Evaluated[] = [];
  const noEndReduction = !ctx.req.endLoaded || ctx.req.angle !== 0;
  for (const w of ctx.sizes) {
    let continuous: Evaluated | null = null;
    for (const L of ctx.lengths) {
      const e = evaluate(ctx, { size: w, layout: 'continuous', length: L, segments: 1, pitch: null });
      if (e.pass) {
        continuous = e;
        break;
      }
    }
    if (continuous) found.push(continuous);
    if (!ctx.intermittent) continue;
    // The continuous weld over the whole line failed: every intermittent layout is weaker.
    if (!continuous && noEndReduction) continue;
    let best: Evaluated | null = null;
    for (const s of segmentLengths(w, ctx.sys, ctx.minSegment, ctx.span, ctx.lengthStep)) {
      const nMax = maxSegments(ctx.span, s, ctx.lengthStep);
      for (let n = 2; n <= nMax; n++) {
        const e = evaluate(ctx, { size: w, layout: 'intermittent', length: s, segments: n, pitch: pitchFor(ctx.span, s, n, ctx.lengthStep) });
        if (e.pass) {
          if (!best || compareWelds(rankKey(e), rankKey(best)) < 0) best = e;
          break;
        }
      }
    }
    if (best) found.push(best);
  }
  return found.sort((a, b) => compareWelds(rankKey(a), rankKey(b)));
}

function sized(e: Evaluated, rank: number, lines: number): SizedWeld {
  return {
    rank,
    size: e.size,
    length: e.length,
    layout: e.layout,
    segments: e.segments,
    pitch: e.pitch,
    span: e.span,
    lines,
    totalLength: e.totalLength,
    volume: e.volume,
    passes: e.passes,
    utilization: e.result.utilization,
    governing: e.result.governing.code,
    governingPart: e.result.governing.part ?? null,
  };
}

function checkWelds(ctx: Ctx, e: Evaluated): CheckWeld[] {
  const r = ctx.req;
  const main: CheckWeld = { size: e.size, length: e.length, angle: r.angle, count: r.lines, endLoaded: r.endLoaded };
  if (e.layout === 'intermittent') main.intermittent = { segments: e.segments, pitch: e.pitch! };
  const out = [main];
  if (r.transverse) out.push({ size: e.size, length: r.transverse.length, angle: 90, count: r.transverse.lines, endLoaded: false });
  return out;
}

// ---------------------------------------------------------------- entry point

/** Sizes a fillet weld: the recommendation's full check, ranked alternatives, or the blocking reason. */
export function sizeFillet(req: SizingRequest): EngineResult<SizingValues> {
  const ctx = prepare(req);
  const found = search(ctx);
  const u = unitSystem(ctx.sys);
  const extra: Warning[] = [];
  if (ctx.electrode.chosen) {
    extra.push(warn('SIZING_ELECTRODE_CHOSEN', `${ctx.electrode.name} (FEXX = ${fmt(ctx.electrode.fexx)} ${u.stress}) was chosen as the matching electrode for the strongest part.`));
  }

  const best = found[0];
  if (best) {
    const recommended: RecommendedWeld = {
      ...sized(best, 1, req.lines),
      electrode: { name: ctx.electrode.name, fexx: ctx.electrode.fexx, chosen: ctx.electrode.chosen },
      welds: checkWelds(ctx, best),
    };
    const alternatives = found.slice(1, 1 + ctx.alternatives).map((e, i) => sized(e, i + 2, req.lines));
    if (best.layout === 'intermittent') {
      extra.push(warn('SIZING_INTERMITTENT_SPACING', `The recommended weld is intermittent: ${best.segments} segments of ${fmt(best.length)} ${u.length} at a pitch of ${fmt(best.pitch!)} ${u.length} on each line; check the gap against the member provisions.`));
    }
    return assemble(best, extra, { recommended, alternatives, closest: null, blocking: null, search: searchValues(ctx) });
  }

  const { shown, blocking } = block(ctx);
  const searched = ctx.gridSize > 0 ? `No fillet weld among the ${ctx.gridSize} candidates searched complies` : 'No fillet size lies between the size limits';
  extra.push(warn('SIZING_NO_COMPLIANT_WELD', `${searched}; the checks shown are of a ${fmt(shown.size)} ${u.length} weld ${fmt(shown.length)} ${u.length} long.`));
  if (blocking.code !== 'SIZING_NO_COMPLIANT_WELD') extra.push(warn(blocking.code as WarningCode, blocking.message));
  return assemble(shown, extra, { recommended: null, alternatives: [], closest: sized(shown, 0, req.lines), blocking, search: searchValues(ctx) });
}

function assemble(e: Evaluated, extra: Warning[], values: Omit<SizingValues, 'check'>): EngineResult<SizingValues> {
  const r = e.result;
  return {
    status: r.status,
    utilization: r.utilization,
    governing: r.governing,
    checks: r.checks,
    limits: r.limits,
    warnings: [...r.warnings, ...extra],
    values: { ...values, check: r.values },
  };
}

function searchValues(ctx: Ctx): SearchValues {
  return {
    sizeMinRule: ctx.lo,
    sizeMaxRule: ctx.hi,
    sizeMaxBy: ctx.hiBy,
    sizeStep: ctx.sizeStep,
    sizeCount: ctx.sizes.length,
    lengthStep: ctx.lengthStep,
    lengthMode: ctx.req.length.mode,
    span: ctx.span,
    intermittent: ctx.intermittent,
    gridSize: ctx.gridSize,
    evaluated: ctx.evaluated,
  };
}

// ---------------------------------------------------------------- when nothing complies

/** Re-runs the search with one change; the cheapest compliant weld, or null (also when that search is too large). */
function retry(req: SizingRequest): Unblock['result'] {
  try {
    const found = search(prepare(req));
    const b = found[0];
    return b ? { size: b.size, length: b.length, layout: b.layout, segments: b.segments, pitch: b.pitch } : null;
  } catch (err) {
    if (err instanceof EngineError) return null;
    throw err;
  }
}

function withPart(req: SizingRequest, index: number, thickness: number): SizingRequest {
  return { ...req, parts: req.parts.map((p, i) => (i === index ? { ...p, thickness } : p)) };
}

function withPrefs(req: SizingRequest, prefs: SizingPreferences): SizingRequest {
  return { ...req, preferences: { ...req.preferences, ...prefs } };
}

const MAX_TRIES = 64;

/** What blocks every weld, the weld whose check is shown, and the changes that unblock it. */
function block(ctx: Ctx): { shown: Evaluated; blocking: Blocking } {
  const req = ctx.req;
  const sys = ctx.sys;
  const u = unitSystem(sys);
  const det = DETAILING[sys];
  const L = ctx.span;
  const unit = u.length;

  // ---- no size between the limits ----
  if (ctx.sizes.length === 0) {
    const floored = Math.floor(ctx.hi / ctx.sizeStep + EPS) * ctx.sizeStep;
    const shownSize = floored > 0 ? floored : ctx.hi;
    const shown = evaluate(ctx, { size: shownSize, layout: 'continuous', length: L, segments: 1, pitch: null });
    const loStep = Math.ceil(ctx.lo / ctx.sizeStep - EPS) * ctx.sizeStep;
    const unblock: Unblock[] = [];
    const why: string[] = [];
    req.parts.forEach((p, i) => {
      if (!p.edge || wMaxEdge(p.thickness, sys) >= loStep - EPS) return;
      why.push(`the edge of parts[${i}] (${fmt(p.thickness)} ${unit}) allows at most ${fmt(wMaxEdge(p.thickness, sys))} ${unit}`);
      // Thicker edge part, on the standard increment; the minimum size may grow with it.
      for (let k = 0; k < MAX_TRIES; k++) {
        const t = nextAbove(p.thickness, det.sizeStep) + k * det.sizeStep;
        const tThin = Math.min(...req.parts.map((q, j) => (j === i ? t : q.thickness)));
        const need = Math.ceil(wMin(tThin, sys) / ctx.sizeStep - EPS) * ctx.sizeStep;
        if (wMaxEdge(t, sys) >= need - EPS) {
          unblock.push({
            change: 'thicker-part',
            part: i,
            value: t,
            electrode: null,
            message: `Make parts[${i}] at least ${fmt(t)} ${unit} thick (or have the drawings call for the weld to be built out to full throat along its edge).`,
            result: retry(withPart(req, i, t)),
          });
          break;
        }
      }
    });
    const maxSize = req.preferences?.maxSize;
    if (maxSize != null && maxSize < loStep - EPS) {
      why.push(`preferences.maxSize is ${fmt(maxSize)} ${unit}`);
      unblock.push({
        change: 'larger-size',
        part: null,
        value: loStep,
        electrode: null,
        message: `Allow sizes of at least ${fmt(loStep)} ${unit} (preferences.maxSize).`,
        result: retry(withPrefs(req, { maxSize: null })),
      });
    }
    if (why.length === 0) {
      why.push(`no multiple of the size step ${fmt(ctx.sizeStep)} ${unit} lies between them`);
      unblock.push({
        change: 'size-step',
        part: null,
        value: det.sizeStep,
        electrode: null,
        message: `Use the standard size step of ${fmt(det.sizeStep)} ${unit} (preferences.sizeStep).`,
        result: retry(withPrefs(req, { sizeStep: det.sizeStep })),
      });
    }
    return {
      shown,
      blocking: {
        code: 'SIZING_SIZE_LIMITS_CROSS',
        message: `The minimum fillet size for the thinner part is ${fmt(ctx.lo)} ${unit} (Table J2.4), but the largest size allowed is ${fmt(ctx.hi)} ${unit}: ${why.join('; ')}.`,
        unblock,
      },
    };
  }

  // ---- the strongest weld searched: the largest size, continuous over the whole line ----
  const hi = ctx.sizes[ctx.sizes.length - 1]!;
  const shown = evaluate(ctx, { size: hi, layout: 'continuous', length: L, segments: 1, pitch: null });
  const checks = shown.result.checks;
  const weld = checks.find((c) => c.code === 'FILLET_WELD_METAL');
  const weldFails = weld !== undefined && !weld.pass;
  const baseFails = checks.filter((c) => c.code !== 'FILLET_WELD_METAL' && !c.pass && c.part !== undefined);
  const unblock: Unblock[] = [];

  const longer = longerLength(ctx, hi);
  const longerWeld = (): void => {
    if (longer === null) return;
    const r = retry({ ...req, length: { mode: req.length.mode, value: longer } });
    unblock.push({
      change: 'longer-weld',
      part: null,
      value: longer,
      electrode: null,
      message: `Make each line ${req.length.mode === 'fixed' ? '' : 'up to '}${fmt(longer)} ${unit} long (length.${req.length.mode}).`,
      result: r ?? { size: hi, length: longer, layout: 'continuous', segments: 1, pitch: null },
    });
  };

  if (baseFails.length > 0) {
    const parts = [...new Set(baseFails.map((c) => c.part!))];
    for (const i of parts) {
      const p = req.parts[i]!;
      const ratio = Math.max(...baseFails.filter((c) => c.part === i).map((c) => c.ratio));
      const t = thickerPart(ctx, i, roundUp(p.thickness * ratio, det.sizeStep), hi);
      if (t === null) continue;
      unblock.push({
        change: 'thicker-part',
        part: i,
        value: t,
        electrode: null,
        message: `Make parts[${i}] at least ${fmt(t)} ${unit} thick (or use a stronger steel).`,
        result: retry(withPart(req, i, t)),
      });
    }
    longerWeld();
    const codes = [...new Set(baseFails.map((c) => `${c.code} of parts[${c.part}]`))].join(', ');
    return {
      shown,
      blocking: {
        code: 'SIZING_BASE_METAL_TOO_THIN',
        message:
          `Over the longest line available (${fmt(L)} ${unit}) the base metal fails whatever the fillet size: ${codes}` +
          `${weldFails ? `; the weld metal of the largest size allowed (${fmt(hi)} ${unit}) fails too` : ''}.`,
        unblock,
      },
    };
  }

  if (weldFails) {
    longerWeld();
    // A larger size, when a preference (not a rule) set the largest size.
    if (ctx.hiBy !== 'edge') {
      const cap = Math.min(SIZING_DEFAULTS.absoluteMaxSize[sys], ...req.parts.filter((p) => p.edge).map((p) => wMaxEdge(p.thickness, sys)));
      const kHi = Math.round(hi / ctx.sizeStep);
      for (let k = kHi + 1; k * ctx.sizeStep <= cap + EPS && k - kHi <= MAX_TRIES; k++) {
        const w = k * ctx.sizeStep;
        if (!evaluate(ctx, { size: w, layout: 'continuous', length: L, segments: 1, pitch: null }).pass) continue;
        unblock.push({
          change: 'larger-size',
          part: null,
          value: w,
          electrode: null,
          message: `Allow sizes up to ${fmt(w)} ${unit} (preferences.maxSize${ctx.hiBy === 'singlePass' || w > det.singlePassMax ? ', and multi-pass welds: preferences.singlePass false' : ''}).`,
          result: retry(withPrefs(req, { maxSize: w, singlePass: w > det.singlePassMax ? false : req.preferences?.singlePass ?? false })),
        });
        break;
      }
    }
    // A stronger electrode of the catalogue.
    for (const e of ELECTRODES.filter((x) => x.native === sys && x.fexx > ctx.electrode.fexx + EPS).sort((a, b) => a.fexx - b.fexx)) {
      const trial: Ctx = { ...ctx, electrode: { spec: e.name, name: e.name, fexx: e.fexx, chosen: false } };
      const ok = evaluate(trial, { size: hi, layout: 'continuous', length: L, segments: 1, pitch: null }).pass;
      ctx.evaluated++;
      if (!ok) continue;
      unblock.push({
        change: 'stronger-electrode',
        part: null,
        value: e.fexx,
        electrode: e.name,
        message: `Use ${e.name} electrodes (FEXX = ${fmt(e.fexx)} ${u.stress}); check the matching of the filler metal to the parts.`,
        result: retry({ ...req, electrode: e.name }),
      });
      break;
    }
    return {
      shown,
      blocking: {
        code: 'SIZING_LENGTH_UNAVAILABLE',
        message: `The largest fillet size allowed (${fmt(hi)} ${unit}, set by ${describeBound(ctx.hiBy)}) over the longest line available (${fmt(L)} ${unit}) carries ${fmt(weld!.available)} ${u.force}, less than the demand of ${fmt(req.demand)} ${u.force}.`,
        unblock,
      },
    };
  }

  // Not expected: the strongest weld of the grid fails a detailing limit only.
  const failing = shown.result.limits.filter((l) => !l.pass).map((l) => l.code);
  return {
    shown,
    blocking: { code: 'SIZING_NO_COMPLIANT_WELD', message: `The strongest weld searched fails ${failing.join(', ') || 'a check'}.`, unblock },
  };
}

function describeBound(by: SizeMaxBy): string {
  return by === 'edge' ? 'the edge rule of §J2.2b' : by === 'singlePass' ? 'the single-pass preference' : 'the largest size preference';
}

/**
 * Shortest length on the length step (above the available one) at which a continuous weld of
 * size w passes: doubling, then bisection; the answer is a checked pass. null when none up to
 * 2^30 times the available length (an end-loaded weld gains nothing past 300·w).
 */
function longerLength(ctx: Ctx, w: number): number | null {
  const step = ctx.lengthStep;
  const passes = (L: number): boolean => evaluate(ctx, { size: w, layout: 'continuous', length: L, segments: 1, pitch: null }).pass;
  let low = ctx.span;
  let high = roundUp(ctx.span, step) + step;
  let tries = 0;
  while (!passes(high)) {
    if (++tries > 30) return null;
    low = high;
    high = roundUp(high * 2, step);
  }
  // Bisection on the step grid between a failing `low` and a passing `high`.
  let kLow = Math.floor(low / step + EPS);
  let kHigh = Math.round(high / step);
  while (kHigh - kLow > 1) {
    const mid = Math.floor((kLow + kHigh) / 2);
    if (mid * step > low && passes(mid * step)) kHigh = mid;
    else kLow = mid;
  }
  return kHigh * step;
}

/** Thickness on the standard increment, from `start` up, at which part i's base metal passes with the strongest weld; null if none soon. */
function thickerPart(ctx: Ctx, i: number, start: number, w: number): number | null {
  const step = DETAILING[ctx.sys].sizeStep;
  let t = Math.max(start, nextAbove(ctx.req.parts[i]!.thickness, step));
  for (let k = 0; k < MAX_TRIES; k++, t += step) {
    try {
      const trial: Ctx = { ...ctx, req: withPart(ctx.req, i, t) };
      const e = evaluate(trial, { size: w, layout: 'continuous', length: ctx.span, segments: 1, pitch: null });
      ctx.evaluated++;
      if (e.result.checks.every((c) => c.part !== i || c.pass)) return t;
    } catch (err) {
      if (err instanceof EngineError) return null;
      throw err;
    }
  }
  return null;
}

/** The first multiple of the step strictly above x. */
function nextAbove(x: number, step: number): number {
  return (Math.floor(x / step + EPS) + 1) * step;
}

function roundUp(x: number, step: number): number {
  return Math.ceil(x / step - EPS) * step;
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
