/**
 * sizeFillet: hand-checked sizing cases, both unit systems, the grid it searches, the ranking,
 * and the blocking answers with their ways out.
 *
 * Sources: AISC 360-22 Table J2.4, §J2.2b, Table J2.5, Eq. J2-1, J2-4, J2-6a/b and §J4 (from
 * memory). Expected values are hand arithmetic from those equations, written out beside each
 * assertion, with 0.75·0.60·70/√2 = 22.2739 kip/in per inch of size (E70, LRFD) and
 * 0.75·0.60·490/√2 = 155.917 N/mm per mm of size (E49, LRFD). "1.392 kip/in per sixteenth"
 * (0.928 ASD) is common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { EngineError } from '../../src/engine/errors.js';
import type { FilletPart } from '../../src/engine/fillet.js';
import { estimatedPasses, matchingElectrode, sizeFillet, type SizingRequest } from '../../src/engine/sizing.js';

function part(thickness: number, steel: FilletPart['steel'] = 'A992', over: Partial<FilletPart> = {}): FilletPart {
  return { thickness, steel, edge: false, faces: 1, loading: 'shear', ...over };
}

/** Default: one longitudinal line fixed at 10 in, E70, LRFD, between two 1/2 in A992 parts. */
function req(over: Partial<SizingRequest> = {}): SizingRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    demand: 50,
    angle: 0,
    lines: 1,
    length: { mode: 'fixed', value: 10 },
    transverse: null,
    endLoaded: false,
    parts: [part(0.5), part(0.5)],
    directionalIncrease: true,
    ...over,
  };
}

function metricReq(over: Partial<SizingRequest> = {}): SizingRequest {
  return req({ units: 'metric', electrode: 'E49', length: { mode: 'fixed', value: 100 }, parts: [part(10, 'S355'), part(10, 'S355')], ...over });
}

function close(actual: number, expected: number, tol = 1e-4): void {
  expect(Math.abs(actual - expected), `expected ${expected}, got ${actual}`).toBeLessThanOrEqual(tol * Math.abs(expected));
}

describe('smallest passing size at a fixed length (the cases of the issue)', () => {
  it('LRFD: the demand a 1/4 in E70 weld carries (1.392 × 4 = 5.568 kip/in over 10 in) gives 1/4 in', () => {
    // common practice, no source: 1.392 × 4 = 5.568 kip/in; × 10 in = 55.68 kip.
    // hand: 1/4 in capacity 22.2739 × 0.25 × 10 = 55.685 kip >= 55.68; 3/16 in: 41.76 kip < 55.68.
    const r = sizeFillet(req({ demand: 55.68 }));
    expect(r.status).toBe('pass');
    expect(r.values.recommended?.size).toBe(0.25);
    expect(r.values.recommended?.length).toBe(10);
    expect(r.values.recommended?.layout).toBe('continuous');
    // hand: 55.68 / 55.685 = 0.99991
    close(r.utilization, 55.68 / 55.6847);
    expect(r.governing.code).toBe('FILLET_WELD_METAL');
  });

  it('LRFD: one percent more (56.24 kip) needs 5/16 in when the length is fixed', () => {
    // hand: 1.01 × 55.68 = 56.237 kip > 55.685 (1/4 in); 5/16 in: 22.2739 × 0.3125 × 10 = 69.61 kip.
    const r = sizeFillet(req({ demand: 55.68 * 1.01 }));
    expect(r.values.recommended?.size).toBe(0.3125);
    close(r.governing.available, 69.6058);
    // the 1/4 in weld fails, so it is no alternative: every alternative is larger.
    for (const a of r.values.alternatives) expect(a.size).toBeGreaterThan(0.3125);
  });

  it('ASD: 0.928 × 4 = 3.712 kip/in over 10 in gives 1/4 in, one percent more 5/16 in', () => {
    // common practice, no source: 0.928 kip/in per sixteenth. hand: 0.60 × 70/√2 × 0.25 × 10 / 2.00 = 37.123 kip >= 37.12.
    expect(sizeFillet(req({ method: 'ASD', demand: 37.12 })).values.recommended?.size).toBe(0.25);
    // hand: 37.12 × 1.01 = 37.49 > 37.123
    expect(sizeFillet(req({ method: 'ASD', demand: 37.12 * 1.01 })).values.recommended?.size).toBe(0.3125);
  });

  it('metric: 93.5 kN over 100 mm gives 6 mm, one percent more 7 mm (1 mm steps)', () => {
    // hand: 155.917 N/mm per mm × 6 mm × 100 mm / 1000 = 93.55 kN >= 93.5; 5 mm: 77.96 kN.
    const six = sizeFillet(metricReq({ demand: 93.5 }));
    expect(six.values.recommended?.size).toBe(6);
    close(six.governing.available, 93.5502);
    // hand: 93.5 × 1.01 = 94.44 kN > 93.55; 7 mm: 155.917 × 7 × 100 / 1000 = 109.14 kN.
    const seven = sizeFillet(metricReq({ demand: 93.5 * 1.01 }));
    expect(seven.values.recommended?.size).toBe(7);
    close(seven.governing.available, 109.142);
    expect(seven.values.search.sizeStep).toBe(1);
  });
});

describe('length open up to a maximum', () => {
  it('55.68 kip with up to 24 in: 3/16 in × 13.5 in beats 1/4 in × 10 in on weld metal', () => {
    // hand: 3/16 in carries 22.2739 × 0.1875 = 4.1763 kip/in; 55.68 / 4.1763 = 13.33 in → 13.5 in on the 1/4 in step
    // (13.25 in: 55.34 kip < 55.68). Volume (3/16)²/2 × 13.5 = 0.23730 in³; 1/4 × 10 in: 0.3125 in³.
    const r = sizeFillet(req({ demand: 55.68, length: { mode: 'max', value: 24 } }));
    const rec = r.values.recommended!;
    expect(rec.size).toBe(0.1875);
    expect(rec.length).toBe(13.5);
    close(rec.volume, 0.2373047);
    expect(r.values.search.lengthStep).toBe(0.25);
    expect(r.values.search.lengthMode).toBe('max');
    const quarter = r.values.alternatives.find((a) => a.size === 0.25)!;
    // hand: 55.68 / 5.5685 = 9.999 in → 10 in
    expect(quarter.length).toBe(10);
    close(quarter.volume, 0.3125);
    // ranked by weld metal volume
    const volumes = [rec.volume, ...r.values.alternatives.map((a) => a.volume)];
    expect([...volumes].sort((a, b) => a - b)).toEqual(volumes);
  });

  it('an end-loaded line needs more length once l > 100·w (Eq. J2-1)', () => {
    // hand: 3/16 in only (maxSize 3/16), 90 kip, 4.1763 kip/in. Not end-loaded: 90 / 4.1763 = 21.55 → 21.75 in.
    const plain = sizeFillet(req({ demand: 90, length: { mode: 'max', value: 40 }, preferences: { maxSize: 0.1875 } }));
    expect(plain.values.recommended?.length).toBe(21.75);
    // End-loaded: at 22.5 in, l/w = 120, beta = 1.2 - 0.002 × 120 = 0.96, 4.1763 × 0.96 × 22.5 = 90.21 kip >= 90;
    // at 22.25 in, beta = 0.96267, 89.45 kip < 90.
    const end = sizeFillet(req({ demand: 90, endLoaded: true, length: { mode: 'max', value: 40 }, preferences: { maxSize: 0.1875 } }));
    expect(end.values.recommended?.length).toBe(22.5);
    expect(end.warnings.map((w) => w.code)).toContain('END_LOADED_LENGTH_REDUCED');
  });

  it('longitudinal lines with a transverse line: the mixed-group rule (Eq. J2-6b) sets the length', () => {
    // hand, 3/16 in, two longitudinal lines of L and one 4 in transverse line, nominal 0.60 × 70/√2 × 0.1875 = 5.5685 kip/in:
    // Rnwt = 22.274, Rnwl = 11.137·L; J2-6b: 0.85·Rnwl + 1.5·Rnwt. phi·Rn at L = 5.0 in: 0.75 × (0.85 × 55.685 + 33.411) = 60.56 kip >= 60;
    // at 4.75 in: 58.78 kip < 60. Volume (3/16)²/2 × (2 × 5 + 4) = 0.24609 in³.
    const r = sizeFillet(
      req({ demand: 60, lines: 2, length: { mode: 'max', value: 12 }, transverse: { lines: 1, length: 4 }, parts: [part(0.375, 'A572-50'), part(0.5)] }),
    );
    const rec = r.values.recommended!;
    expect(rec.size).toBe(0.1875);
    expect(rec.length).toBe(5);
    expect(rec.totalLength).toBe(14);
    close(rec.volume, 0.2460938);
    expect(r.values.check.groupRule).toBe('mixed-J2-6b');
    expect(rec.welds).toEqual([
      { size: 0.1875, length: 5, angle: 0, count: 2, endLoaded: false },
      { size: 0.1875, length: 4, angle: 90, count: 1, endLoaded: false },
    ]);
  });

  it('the maximum itself is searched when it is not on the length step', () => {
    // hand: 3/16 in × 10.1 in carries 4.1763 × 10.1 = 42.18 kip >= 42; 10 in: 41.76 kip < 42.
    const r = sizeFillet(req({ demand: 42, length: { mode: 'max', value: 10.1 }, preferences: { maxSize: 0.1875 } }));
    expect(r.values.recommended?.length).toBe(10.1);
  });
});

describe('intermittent welds', () => {
  it('20 kip on a 10 in line: two 2.5 in segments of 3/16 in at a 7.5 in pitch', () => {
    // hand: 3/16 in, 4.1763 kip/in; 20 / 4.1763 = 4.79 in of weld. Segments at least max(4 × 3/16, 1-1/2) = 1.5 in
    // (AISC 360-22 §J2.2b, from memory); the least total on the 1/4 in step is 2 × 2.5 = 5.0 in (20.88 kip);
    // 2 × 2.25 and 3 × 1.5 give 4.5 in (18.79 kip). Pitch: (10 - 2.5) / 1 = 7.5 in. Volume (3/16)²/2 × 5 = 0.08789 in³,
    // less than the continuous 3/16 × 10 in (0.17578 in³).
    const r = sizeFillet(req({ demand: 20, preferences: { intermittent: true } }));
    const rec = r.values.recommended!;
    expect(rec.layout).toBe('intermittent');
    expect(rec.size).toBe(0.1875);
    expect(rec.length).toBe(2.5);
    expect(rec.segments).toBe(2);
    expect(rec.pitch).toBe(7.5);
    expect(rec.span).toBe(10);
    close(rec.volume, 0.0878906);
    expect(rec.welds[0]!.intermittent).toEqual({ segments: 2, pitch: 7.5 });
    expect(r.limits.find((l) => l.code === 'FILLET_INTERMITTENT_SEGMENT')?.required).toBe(1.5);
    expect(r.warnings.map((w) => w.code)).toContain('SIZING_INTERMITTENT_SPACING');
    const continuous = r.values.alternatives.find((a) => a.layout === 'continuous' && a.size === 0.1875)!;
    close(continuous.volume, 0.1757813);
  });

  it('minSegment raises the shortest segment considered', () => {
    // hand: segments of at least 3 in: 2 × 3 = 6 in (25.06 kip) is the least total.
    const r = sizeFillet(req({ demand: 20, preferences: { intermittent: true, minSegment: 3 } }));
    expect(r.values.recommended?.length).toBe(3);
    expect(r.values.recommended?.segments).toBe(2);
  });

  it('intermittent layouts are not searched unless allowed', () => {
    const r = sizeFillet(req({ demand: 20 }));
    expect(r.values.recommended?.layout).toBe('continuous');
    expect(r.values.alternatives.every((a) => a.layout === 'continuous')).toBe(true);
  });
});

describe('the size range searched', () => {
  it('Table J2.4 minimum by the thinner part: 5/16 in for parts over 3/4 in', () => {
    // AISC 360-22 Table J2.4 (from memory): t > 3/4 in → 5/16 in. A tiny demand still gets 5/16 in.
    const r = sizeFillet(req({ demand: 1, parts: [part(1), part(1.25)] }));
    expect(r.values.search.sizeMinRule).toBe(0.3125);
    expect(r.values.recommended?.size).toBe(0.3125);
  });

  it('an edge of 1/2 in limits sizes to 7/16 in', () => {
    // AISC 360-22 §J2.2b (from memory): t - 1/16 = 7/16 in along a 1/2 in edge.
    const r = sizeFillet(req({ demand: 1, parts: [part(0.5, 'A992', { edge: true }), part(0.75)] }));
    expect(r.values.search.sizeMaxRule).toBe(0.4375);
    expect(r.values.search.sizeMaxBy).toBe('edge');
    // 3/16 (Table J2.4, t = 1/2 in) to 7/16 in in 1/16 steps: 5 sizes
    expect(r.values.search.sizeCount).toBe(5);
  });

  it('singlePass keeps sizes to 5/16 in (8 mm)', () => {
    // common practice, no source: 5/16 in (8 mm) is the largest single-pass fillet.
    expect(sizeFillet(req({ preferences: { singlePass: true } })).values.search.sizeMaxRule).toBe(0.3125);
    expect(sizeFillet(metricReq({ preferences: { singlePass: true } })).values.search.sizeMaxRule).toBe(8);
  });

  it('a coarser size step searches its multiples only', () => {
    // 55.68 kip at 10 in needs 1/4 in; with a 1/8 in step the sizes are 1/4, 3/8, ...
    const r = sizeFillet(req({ demand: 55.68 * 1.01, preferences: { sizeStep: 0.125 } }));
    // hand: 1/4 in fails (56.24 > 55.68), 3/8 in: 83.53 kip
    expect(r.values.recommended?.size).toBe(0.375);
  });
});

describe('ranking details', () => {
  it('estimated passes: 1 up to 5/16 in (8 mm), then the deposit area ratio rounded up', () => {
    // common practice, no source: single pass to 5/16 in; (3/8 ÷ 5/16)² = 1.44 → 2; (1/2 ÷ 5/16)² = 2.56 → 3; (10/8)² = 1.5625 → 2.
    expect(estimatedPasses(0.25, 'imperial')).toBe(1);
    expect(estimatedPasses(0.3125, 'imperial')).toBe(1);
    expect(estimatedPasses(0.375, 'imperial')).toBe(2);
    expect(estimatedPasses(0.5, 'imperial')).toBe(3);
    expect(estimatedPasses(8, 'metric')).toBe(1);
    expect(estimatedPasses(10, 'metric')).toBe(2);
  });

  it('alternatives list at most the number asked for, ranked 2, 3, ...', () => {
    const r = sizeFillet(req({ demand: 30, length: { mode: 'max', value: 24 }, preferences: { alternatives: 3 } }));
    expect(r.values.recommended?.rank).toBe(1);
    expect(r.values.alternatives.map((a) => a.rank)).toEqual([2, 3, 4]);
  });

  it('a length search checks fewer candidates than its grid (pruned) and says how many', () => {
    const r = sizeFillet(req({ demand: 30, length: { mode: 'max', value: 24 } }));
    // sizes 3/16..1 in (14) × lengths 0.25..24 in (96)
    expect(r.values.search.gridSize).toBe(14 * 96);
    expect(r.values.search.evaluated).toBeLessThan(r.values.search.gridSize);
  });
});

describe('matching electrode', () => {
  it('chooses by the strongest part', () => {
    // AWS D1.1 matching filler (from memory), with our rule FEXX >= 0.95 Fu: A992 (Fu 65) → E70; A36 (Fu 58) → E60;
    // A514 (Fu 110) → E110; S355 (Fu 510 MPa) → E49; S460 (Fu 540 MPa) → E55.
    expect(matchingElectrode([65, 58], 'imperial').name).toBe('E70');
    expect(matchingElectrode([58], 'imperial').name).toBe('E60');
    expect(matchingElectrode([110], 'imperial').name).toBe('E110');
    expect(matchingElectrode([510], 'metric').name).toBe('E49');
    expect(matchingElectrode([540, 510], 'metric').name).toBe('E55');
  });

  it('electrode "match" sizes with it and says so', () => {
    const r = sizeFillet(req({ electrode: 'match', demand: 55.68 }));
    expect(r.values.recommended?.electrode).toEqual({ name: 'E70', fexx: 70, chosen: true });
    expect(r.values.recommended?.size).toBe(0.25);
    expect(r.warnings.map((w) => w.code)).toContain('SIZING_ELECTRODE_CHOSEN');
  });
});

describe('when nothing complies', () => {
  it('base metal too thin: a 1/8 in A36 part over 10 in cannot take 30 kip whatever the size', () => {
    // hand: shear yielding of the 1/8 in A36 part (AISC 360-22 Eq. J4-3): 1.00 × 0.60 × 36 × 0.125 × 10 = 27 kip < 30.
    const r = sizeFillet(req({ demand: 30, parts: [part(0.125, 'A36'), part(0.5)] }));
    expect(r.status).toBe('fail');
    expect(r.values.recommended).toBeNull();
    const b = r.values.blocking!;
    expect(b.code).toBe('SIZING_BASE_METAL_TOO_THIN');
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['SIZING_NO_COMPLIANT_WELD', 'SIZING_BASE_METAL_TOO_THIN']));
    // thicker part: 0.125 × 30 / 27 = 0.139 → 3/16 in; then 1/8 in welds give 27.84 kip < 30 and 3/16 in 41.76 kip.
    const thicker = b.unblock.find((u) => u.change === 'thicker-part')!;
    expect(thicker.part).toBe(0);
    expect(thicker.value).toBe(0.1875);
    expect(thicker.result).toEqual({ size: 0.1875, length: 10, layout: 'continuous', segments: 1, pitch: null });
    // longer weld: 30 / 2.7 kip/in = 11.11 in → 11.25 in; then 1/8 in (Table J2.4 for 1/8 in) carries
    // 22.2739 × 0.125 × 11.25 = 31.32 kip >= 30.
    const longer = b.unblock.find((u) => u.change === 'longer-weld')!;
    expect(longer.value).toBe(11.25);
    expect(longer.result).toEqual({ size: 0.125, length: 11.25, layout: 'continuous', segments: 1, pitch: null });
    // the check shown is of the strongest weld searched
    expect(r.values.closest?.length).toBe(10);
    expect(r.values.closest?.rank).toBe(0);
  });

  it('length unavailable: 100 kip over a fixed 10 in with sizes up to 3/8 in', () => {
    // hand: 3/8 in × 10 in: 22.2739 × 0.375 × 10 = 83.53 kip < 100; base metal of 1 in parts: 0.60 × 50 × 1 × 10 = 300 kip.
    const r = sizeFillet(req({ demand: 100, parts: [part(1), part(1)], preferences: { maxSize: 0.375 } }));
    expect(r.status).toBe('fail');
    const b = r.values.blocking!;
    expect(b.code).toBe('SIZING_LENGTH_UNAVAILABLE');
    const by = (c: string) => b.unblock.find((u) => u.change === c);
    // longer: 100 / 8.3527 = 11.97 in → 12 in (11.75 in: 98.14 kip).
    expect(by('longer-weld')?.value).toBe(12);
    // larger: 7/16 in 97.45 kip < 100; 1/2 in 111.37 kip.
    expect(by('larger-size')?.value).toBe(0.5);
    expect(by('larger-size')?.result?.size).toBe(0.5);
    // stronger electrode at 3/8 in: E80 0.75 × 0.60 × 80/√2 × 0.375 × 10 = 95.46 kip < 100; E90 107.39 kip.
    expect(by('stronger-electrode')?.electrode).toBe('E90');
    expect(by('stronger-electrode')?.value).toBe(90);
  });

  it('size limits cross: a 0.1 in edge part allows 0.1 in, Table J2.4 asks 1/8 in', () => {
    // AISC 360-22 §J2.2b (from memory): along an edge under 1/4 in the fillet is at most t = 0.1 in;
    // Table J2.4 (from memory): 1/8 in for parts up to 1/4 in. A 1/8 in edge allows 1/8 in.
    const r = sizeFillet(req({ demand: 5, parts: [part(0.5), part(0.1, 'A36', { edge: true })] }));
    expect(r.status).toBe('fail');
    expect(r.values.blocking?.code).toBe('SIZING_SIZE_LIMITS_CROSS');
    expect(r.values.search.sizeCount).toBe(0);
    const t = r.values.blocking!.unblock.find((u) => u.change === 'thicker-part')!;
    expect(t.part).toBe(1);
    expect(t.value).toBe(0.125);
    // hand: 1/8 in × 10 in carries 27.8 kip; the 1/8 in A36 part 0.60 × 36 × 0.125 × 10 = 27 kip >= 5.
    expect(t.result?.size).toBe(0.125);
    expect(r.limits.some((l) => !l.pass)).toBe(true);
  });

  it('size limits cross: maxSize below the Table J2.4 minimum', () => {
    // Table J2.4 (from memory): 5/16 in for 1 in parts; maxSize 1/4 in.
    const r = sizeFillet(req({ demand: 5, parts: [part(1), part(1)], preferences: { maxSize: 0.25 } }));
    expect(r.values.blocking?.code).toBe('SIZING_SIZE_LIMITS_CROSS');
    const larger = r.values.blocking!.unblock.find((u) => u.change === 'larger-size')!;
    expect(larger.value).toBe(0.3125);
    expect(larger.result?.size).toBe(0.3125);
  });

  it('metric: base metal too thin with a 4 mm S235 part', () => {
    // hand: shear yielding 1.00 × 0.60 × 235 × 4 × 100 / 1000 = 56.4 kN < 60; thicker part 4 × 60 / 56.4 = 4.26 → 5 mm.
    const r = sizeFillet(metricReq({ demand: 60, parts: [part(4, 'S235'), part(10, 'S355')] }));
    expect(r.values.blocking?.code).toBe('SIZING_BASE_METAL_TOO_THIN');
    expect(r.values.blocking!.unblock.find((u) => u.change === 'thicker-part')?.value).toBe(5);
  });
});

describe('requests the search refuses', () => {
  it('a grid above the candidate bound is a SIZING_SEARCH_TOO_LARGE error', () => {
    try {
      sizeFillet(req({ length: { mode: 'max', value: 100000 } }));
      expect.fail('expected an EngineError');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).code).toBe('SIZING_SEARCH_TOO_LARGE');
      expect((e as EngineError).pointer).toBe('/preferences/lengthStep');
    }
  });

  it('a zero demand is meaningless', () => {
    expect(() => sizeFillet(req({ demand: 0 }))).toThrow(EngineError);
  });
});
