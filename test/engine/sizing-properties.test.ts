/**
 * Properties of sizeFillet over random demands, parts and preferences (fast-check):
 * - the recommendation, and every alternative, passes checkFillet;
 * - no alternative has less weld metal than the recommendation;
 * - a brute-force walk over the whole grid (built here, independently of the engine, from the
 *   rules it states: Table J2.4 minimum, §J2.2b edge maximum, sizes in 1/16 in or 1 mm, lengths
 *   in 1/4 in or 5 mm and the maximum itself, intermittent segments from max(4w, 1-1/2 in
 *   (38 mm)) spread at the largest pitch on the step) finds nothing with less weld metal;
 * - more demand never needs less weld metal;
 * - when nothing complies, the answer fails, says why, and each way out it reports is a weld
 *   that passes checkFillet with that change.
 *
 * Sources: AISC 360-22 Table J2.4 and §J2.2b (from memory) for the grid bounds below. Volumes
 * compare within 1e-9 relative (floating-point sums of the same lengths).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkFillet, type FilletLine, type FilletPart, type FilletRequest } from '../../src/engine/fillet.js';
import { sizeFillet, type SizedWeld, type SizingRequest } from '../../src/engine/sizing.js';

const REL = 1e-9;

// ---- the rules of the grid, written out here (AISC 360-22 Table J2.4 and §J2.2b, from memory) ----
const TABLE_J2_4 = {
  imperial: [
    [0.25, 0.125],
    [0.5, 0.1875],
    [0.75, 0.25],
    [Infinity, 0.3125],
  ],
  metric: [
    [6, 3],
    [13, 5],
    [19, 6],
    [Infinity, 8],
  ],
} as const;
const SYS = {
  imperial: { sizeStep: 0.0625, lengthStep: 0.25, edgeThin: 0.25, edgeDeduction: 0.0625, segmentMin: 1.5 },
  metric: { sizeStep: 1, lengthStep: 5, edgeThin: 6, edgeDeduction: 2, segmentMin: 38 },
} as const;
type Units = keyof typeof SYS;

function minSize(t: number, u: Units): number {
  return TABLE_J2_4[u].find(([upTo]) => t <= upTo)![1];
}
function edgeMax(t: number, u: Units): number {
  return t < SYS[u].edgeThin ? t : t - SYS[u].edgeDeduction;
}

// ---- random requests ----
const partArb = (u: Units) =>
  fc.record({
    thickness: u === 'imperial' ? fc.constantFrom(0.1875, 0.25, 0.375, 0.5, 0.625, 0.75, 1) : fc.constantFrom(5, 6, 8, 10, 12, 16, 20),
    steel: u === 'imperial' ? fc.constantFrom('A36', 'A992', 'A572-50') : fc.constantFrom('S235', 'S275', 'S355'),
    edge: fc.boolean(),
    faces: fc.constantFrom(1 as const, 2 as const),
    loading: fc.constant('shear' as const),
  });

function requestArb(u: Units, small: boolean): fc.Arbitrary<SizingRequest> {
  const step = SYS[u].lengthStep;
  const span = fc
    .tuple(fc.integer({ min: u === 'imperial' ? 4 : 8, max: small ? (u === 'imperial' ? 32 : 40) : u === 'imperial' ? 64 : 60 }), fc.boolean())
    .map(([k, off]) => k * step + (off ? step * 0.4 : 0));
  return fc.record({
    method: fc.constantFrom('LRFD' as const, 'ASD' as const),
    units: fc.constant(u),
    electrode: u === 'imperial' ? fc.constantFrom('E70', 'E80', 'match') : fc.constantFrom('E49', 'E55', 'match'),
    demand: u === 'imperial' ? fc.double({ min: 1, max: small ? 80 : 200, noNaN: true }) : fc.double({ min: 5, max: small ? 350 : 900, noNaN: true }),
    angle: fc.constantFrom(0, 0, 30, 90),
    lines: fc.integer({ min: 1, max: 3 }),
    length: fc.record({ mode: fc.constantFrom('fixed' as const, 'max' as const), value: span }),
    transverse: fc.option(fc.record({ lines: fc.constant(1), length: fc.constant(u === 'imperial' ? 3 : 75) }), { nil: null }),
    endLoaded: fc.boolean(),
    parts: fc.array(partArb(u), { minLength: 1, maxLength: 2 }),
    directionalIncrease: fc.boolean(),
    preferences: fc.record({
      maxSize: u === 'imperial' ? fc.constantFrom(0.3125, 0.4375, 0.5) : fc.constantFrom(8, 10, 12),
      singlePass: fc.boolean(),
      intermittent: fc.boolean(),
      alternatives: fc.constant(50),
    }),
  });
}

const anyRequest = (small: boolean) => fc.oneof(requestArb('imperial', small), requestArb('metric', small));

// ---- the fillet check of a sized weld, built here ----
function electrodeOf(r: SizingRequest, name: string | null, fexx: number): FilletRequest['electrode'] {
  if (r.electrode !== 'match') return r.electrode;
  return name ?? { fexx };
}

function linesOf(r: SizingRequest, w: Pick<SizedWeld, 'size' | 'length' | 'layout' | 'segments' | 'pitch'>): FilletLine[] {
  const out: FilletLine[] = [
    {
      legs: [w.size, w.size],
      length: w.length,
      angle: r.angle,
      count: r.lines,
      endLoaded: r.endLoaded,
      builtOut: false,
      intermittent: w.layout === 'intermittent' ? { segments: w.segments, pitch: w.pitch! } : null,
    },
  ];
  if (r.transverse) out.push({ legs: [w.size, w.size], length: r.transverse.length, angle: 90, count: r.transverse.lines, endLoaded: false, builtOut: false, intermittent: null });
  return out;
}

function checkOf(r: SizingRequest, electrode: FilletRequest['electrode'], welds: FilletLine[], parts: FilletPart[] = r.parts) {
  return checkFillet({ method: r.method, units: r.units, electrode, welds, parts, demand: r.demand, directionalIncrease: r.directionalIncrease, lap: null, flatBarWidth: null });
}

function volumeOf(r: SizingRequest, w: number, perLine: number): number {
  return ((w * w) / 2) * (perLine * r.lines + (r.transverse ? r.transverse.length * r.transverse.lines : 0));
}

/** The least weld metal of any compliant weld of the grid, walked without pruning. */
function bruteForce(r: SizingRequest, electrode: FilletRequest['electrode']): number | null {
  const u = r.units;
  const { sizeStep, lengthStep, segmentMin } = SYS[u];
  const p = r.preferences!;
  const lo = minSize(Math.min(...r.parts.map((x) => x.thickness)), u);
  let hi = p.maxSize!;
  for (const x of r.parts) if (x.edge) hi = Math.min(hi, edgeMax(x.thickness, u));
  if (p.singlePass) hi = Math.min(hi, u === 'imperial' ? 0.3125 : 8);
  const L = r.length.value;
  const lengths: number[] = [];
  if (r.length.mode === 'fixed') lengths.push(L);
  else {
    for (let k = 1; k * lengthStep <= L + 1e-9; k++) lengths.push(k * lengthStep);
    if (Math.abs(lengths[lengths.length - 1]! - L) > 1e-9) lengths.push(L);
  }
  let best: number | null = null;
  const consider = (v: number, pass: boolean) => {
    if (pass && (best === null || v < best)) best = v;
  };
  for (let k = Math.ceil(lo / sizeStep - 1e-9); k * sizeStep <= hi + 1e-9; k++) {
    const w = k * sizeStep;
    for (const len of lengths) {
      consider(volumeOf(r, w, len), checkOf(r, electrode, linesOf(r, { size: w, length: len, layout: 'continuous', segments: 1, pitch: null })).status === 'pass');
    }
    if (!p.intermittent) continue;
    for (let ks = 1; ks * lengthStep < L; ks++) {
      const s = ks * lengthStep;
      if (s < Math.max(4 * w, segmentMin) - 1e-9) continue;
      for (let n = 2; ; n++) {
        const pitch = Math.floor((L - s) / ((n - 1) * lengthStep) + 1e-9) * lengthStep;
        if (pitch < s + lengthStep - 1e-9) break;
        consider(volumeOf(r, w, n * s), checkOf(r, electrode, linesOf(r, { size: w, length: s, layout: 'intermittent', segments: n, pitch })).status === 'pass');
      }
    }
  }
  return best;
}

describe('sizeFillet properties', () => {
  it('the recommendation and every alternative pass checkFillet; none has less weld metal than the recommendation', () => {
    fc.assert(
      fc.property(anyRequest(false), (r) => {
        const res = sizeFillet(r);
        const rec = res.values.recommended;
        if (!rec) {
          expect(res.status).toBe('fail');
          return;
        }
        const electrode = electrodeOf(r, rec.electrode.name, rec.electrode.fexx);
        expect(res.status).toBe('pass');
        // the recommendation, rebuilt from its welds field as /v1/fillet/check takes them
        const welds: FilletLine[] = rec.welds.map((w) => ({
          legs: [w.size, w.size],
          length: w.length,
          angle: w.angle,
          count: w.count,
          endLoaded: w.endLoaded,
          builtOut: false,
          intermittent: w.intermittent ?? null,
        }));
        expect(checkOf(r, electrode, welds).status).toBe('pass');
        for (const a of res.values.alternatives) {
          expect(a.volume).toBeGreaterThanOrEqual(rec.volume * (1 - REL));
          expect(checkOf(r, electrode, linesOf(r, a)).status).toBe('pass');
        }
      }),
      { numRuns: 60 },
    );
  });

  it('a brute-force walk over the same grid finds nothing with less weld metal', () => {
    fc.assert(
      fc.property(anyRequest(true), (r) => {
        const res = sizeFillet(r);
        const rec = res.values.recommended;
        // With "match" the walk uses the electrode the answer names (its check's FEXX).
        const electrode = r.electrode === 'match' ? { fexx: res.values.check.fexx } : r.electrode;
        const least = bruteForce(r, electrode);
        if (least === null) {
          expect(rec).toBeNull();
        } else {
          expect(rec).not.toBeNull();
          expect(Math.abs(rec!.volume - least)).toBeLessThanOrEqual(REL * least);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('more demand never needs less weld metal', () => {
    fc.assert(
      fc.property(anyRequest(false), fc.double({ min: 0.001, max: 1, noNaN: true }), (r, more) => {
        const a = sizeFillet(r).values.recommended;
        const b = sizeFillet({ ...r, demand: r.demand * (1 + more) }).values.recommended;
        if (b) {
          expect(a).not.toBeNull();
          expect(b.volume).toBeGreaterThanOrEqual(a!.volume * (1 - REL));
        }
      }),
      { numRuns: 40 },
    );
  });

  it('a blocked search fails, says why, and each way out it reports passes checkFillet with that change', () => {
    // Large demands on short lines so that many searches block.
    const blockedArb = anyRequest(false).map((r) => ({ ...r, demand: r.demand * 4 }));
    let blocked = 0;
    fc.assert(
      fc.property(blockedArb, (r) => {
        const res = sizeFillet(r);
        if (res.values.recommended) return;
        blocked++;
        expect(res.status).toBe('fail');
        const b = res.values.blocking!;
        expect(b.message.length).toBeGreaterThan(0);
        expect(res.warnings.map((w) => w.code)).toContain('SIZING_NO_COMPLIANT_WELD');
        expect(res.values.closest).not.toBeNull();
        for (const way of b.unblock) {
          if (!way.result) continue;
          const parts = way.change === 'thicker-part' ? r.parts.map((p, i) => (i === way.part ? { ...p, thickness: way.value } : p)) : r.parts;
          const e = way.change === 'stronger-electrode' ? way.electrode! : r.electrode === 'match' ? { fexx: res.values.check.fexx } : r.electrode;
          expect(checkOf(r, e, linesOf(r, way.result), parts).status, `${way.change}: ${way.message}`).toBe('pass');
        }
      }),
      { numRuns: 40 },
    );
    expect(blocked).toBeGreaterThan(0);
  });
});
