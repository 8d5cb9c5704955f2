/** Rules of application in the fillet check that are about which provision applies, not its numbers. */
import { describe, expect, it } from 'vitest';
import { checkFillet, type FilletLine, type FilletRequest } from '../../src/engine/fillet.js';

const line = (over: Partial<FilletLine> = {}): FilletLine => ({ legs: [0.25, 0.25], length: 50, angle: 0, count: 1, endLoaded: false, builtOut: false, intermittent: null, ...over });
const req = (welds: FilletLine[], over: Partial<FilletRequest> = {}): FilletRequest => ({
  method: 'LRFD', units: 'imperial', electrode: 'E70', welds,
  parts: [{ thickness: 2, steel: 'A572-50', edge: false, faces: 1, loading: 'shear' }],
  demand: 10, directionalIncrease: true, lap: null, flatBarWidth: null, ...over,
});

describe('end-loaded length reduction applies to longitudinal welds only (AISC 360-22 §J2.2b, from memory)', () => {
  it('a transverse line marked end-loaded keeps its full length and says why', () => {
    const r = checkFillet(req([line({ angle: 90, endLoaded: true })]));
    // l/w = 50/0.25 = 200 would give beta = 1.2 - 0.002·200 = 0.80 if it applied
    expect(r.values.welds[0]!.beta).toBe(1);
    expect(r.values.welds[0]!.effectiveLength).toBe(50);
    expect(r.warnings.map((w) => w.code)).toContain('END_LOADED_NOT_LONGITUDINAL');
    expect(r.warnings.map((w) => w.code)).not.toContain('END_LOADED_LENGTH_REDUCED');
  });
  it('the same line loaded longitudinally is reduced to 0.80·l', () => {
    const r = checkFillet(req([line({ endLoaded: true })]));
    expect(r.values.welds[0]!.beta).toBeCloseTo(0.8, 12); // 1.2 - 0.002·200
    expect(r.warnings.map((w) => w.code)).toContain('END_LOADED_LENGTH_REDUCED');
  });
});

describe('group rule reported', () => {
  it('is no-increase when the directional increase is switched off, even for one transverse line', () => {
    const r = checkFillet(req([line({ angle: 90 })], { directionalIncrease: false }));
    expect(r.values.groupRule).toBe('no-increase');
    expect(r.values.welds[0]!.kds).toBe(1);
  });
});
