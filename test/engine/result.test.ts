/** The shared summary step: governing limit state and status. */
import { describe, expect, it } from 'vitest';
import { strengthCheck, summarise, type Check } from '../../src/engine/result.js';

const weld = { phi: 0.75, omega: 2.0 };

describe('summarise', () => {
  it('picks the highest ratio; a tie keeps the first check', () => {
    const checks = [strengthCheck('FILLET_WELD_METAL', 'Eq. J2-4', 'LRFD', 100, weld, 30), strengthCheck('BASE_METAL_SHEAR_RUPTURE', 'Eq. J4-4', 'LRFD', 100, weld, 30, 0)];
    const r = summarise(checks, [], [], {});
    expect(r.governing.code).toBe('FILLET_WELD_METAL');
    expect(r.utilization).toBeCloseTo(30 / 75, 12); // 30 / (0.75 · 100)
  });
  it('with no demand, the lowest available strength governs, skipping limit states exempt for the load case', () => {
    const exempt: Check = { ...strengthCheck('BASE_METAL_SHEAR_YIELD', '', 'LRFD', 0, weld, 0, 1), applicable: false, note: 'need not be checked' };
    const checks = [exempt, strengthCheck('FILLET_WELD_METAL', 'Eq. J2-4', 'LRFD', 100, weld, 0), strengthCheck('BASE_METAL_SHEAR_RUPTURE', 'Eq. J4-4', 'LRFD', 80, weld, 0, 0)];
    const r = summarise(checks, [], [], {});
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE'); // 0.75·80 = 60 < 0.75·100 = 75
    expect(r.status).toBe('pass');
  });
  it('fails on a failed limit even when every ratio passes', () => {
    const r = summarise([strengthCheck('FILLET_WELD_METAL', 'Eq. J2-4', 'ASD', 100, weld, 10)], [{ code: 'FILLET_MIN_SIZE', title: '', clause: '', required: 0.25, provided: 0.1875, sense: 'min', pass: false }], [], {});
    expect(r.status).toBe('fail');
  });
  it('passes a ratio of exactly 1 and fails one just above', () => {
    // 0.75 · 100 = 75 available
    expect(summarise([strengthCheck('FILLET_WELD_METAL', 'Eq. J2-4', 'LRFD', 100, weld, 75)], [], [], {}).status).toBe('pass');
    expect(summarise([strengthCheck('FILLET_WELD_METAL', 'Eq. J2-4', 'LRFD', 100, weld, 75.001)], [], [], {}).status).toBe('fail');
  });
});
