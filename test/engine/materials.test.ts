/**
 * Steel and electrode catalogue, thickness bands, material errors, cross-system conversion and
 * the fraction parser.
 *
 * Sources (all from memory): minimum Fy/Fu of ASTM grades as tabulated in AISC Manual
 * Table 2-3 / Table 2-4 (ksi); EN 10025 grades per EN 1993-1-1 Table 3.1 (MPa, nominal
 * thickness t <= 40 mm and 40 < t <= 80 mm); electrode classification strengths per AWS A5.1 /
 * A5.5 and their metric companions A5.1M / A5.5M. The exact conversion factors are by
 * definition (1 in = 25.4 mm; 1 ksi = 6.894757293168 MPa).
 */
import { describe, expect, it } from 'vitest';
import { ELECTRODES, STEELS, resolveElectrode, resolveSteel } from '../../src/engine/materials.js';
import { EngineError } from '../../src/engine/errors.js';
import { thrown } from '../assert.js';
import { convertForce, convertLength, convertStress, parseFraction } from '../../src/engine/units.js';

function close(actual: number, expected: number, tol = 1e-9): void {
  const slack = tol * Math.abs(expected);
  expect(actual, `expected ${expected} within ${tol} relative, got ${actual}`).toBeGreaterThanOrEqual(expected - slack);
  expect(actual, `expected ${expected} within ${tol} relative, got ${actual}`).toBeLessThanOrEqual(expected + slack);
}

describe('ASTM grades at usual thicknesses (AISC Manual Table 2-3 / 2-4, from memory)', () => {
  it.each([
    ['A36', 1, 36, 58],
    ['A572-42', 1, 42, 60],
    ['A572-50', 1, 50, 65],
    ['A572-55', 1, 55, 70],
    ['A572-60', 1, 60, 75],
    ['A572-65', 1, 65, 80],
    ['A992', 1, 50, 65],
    ['A588', 1, 50, 70],
    ['A529-50', 0.5, 50, 65],
    ['A1085', 0.5, 50, 65],
    ['A500-B-round', 0.5, 42, 58],
    ['A500-B-rect', 0.5, 46, 58],
    ['A500-C-round', 0.5, 46, 62],
    ['A500-C-rect', 0.5, 50, 62],
    ['A53-B', 0.5, 35, 60],
    ['A514', 1, 100, 110],
    ['A913-65', 1, 65, 80],
  ])('%s at %s in: Fy %s, Fu %s ksi', (name, t, fy, fu) => {
    const s = resolveSteel(name, t, 'imperial', '/parts/0/steel');
    expect(s.name).toBe(name);
    expect(s.fy).toBe(fy);
    expect(s.fu).toBe(fu);
  });
});

describe('EN grades, t <= 40 mm (EN 1993-1-1 Table 3.1, from memory)', () => {
  it.each([
    ['S235', 235, 360],
    ['S275', 275, 430],
    ['S355', 355, 510],
    ['S460', 460, 540], // EN 10025-3 S460N/NL row
  ])('%s at 20 mm: fy %s, fu %s MPa', (name, fy, fu) => {
    const s = resolveSteel(name, 20, 'metric', '/parts/0/steel');
    expect(s.fy).toBe(fy);
    expect(s.fu).toBe(fu);
  });
});

describe('thickness bands', () => {
  it('A36: 36/58 up to 8 in, 32/58 above (AISC Manual Table 2-4, from memory)', () => {
    expect(resolveSteel('A36', 8, 'imperial', '/p')).toMatchObject({ fy: 36, fu: 58 });
    expect(resolveSteel('A36', 8.01, 'imperial', '/p')).toMatchObject({ fy: 32, fu: 58 });
  });

  it('S355: 355/510 up to 40 mm, 335/470 above (EN 1993-1-1 Table 3.1, from memory)', () => {
    expect(resolveSteel('S355', 40, 'metric', '/p')).toMatchObject({ fy: 355, fu: 510 });
    expect(resolveSteel('S355', 40.01, 'metric', '/p')).toMatchObject({ fy: 335, fu: 470 });
  });

  it('S235 and S275 above 40 mm: 215/360 and 255/410 (EN 1993-1-1 Table 3.1, from memory)', () => {
    expect(resolveSteel('S235', 50, 'metric', '/p')).toMatchObject({ fy: 215, fu: 360 });
    expect(resolveSteel('S275', 50, 'metric', '/p')).toMatchObject({ fy: 255, fu: 410 });
  });

  it('A514: 100/110 up to 2-1/2 in, 90/100 above (AISC Manual Table 2-4, from memory)', () => {
    expect(resolveSteel('A514', 2.5, 'imperial', '/p')).toMatchObject({ fy: 100, fu: 110 });
    expect(resolveSteel('A514', 2.51, 'imperial', '/p')).toMatchObject({ fy: 90, fu: 100 });
  });

  it('A588: 50/70 to 4 in, 46/67 to 5 in, 42/63 to 8 in (AISC Manual Table 2-4, from memory)', () => {
    expect(resolveSteel('A588', 4, 'imperial', '/p')).toMatchObject({ fy: 50, fu: 70 });
    expect(resolveSteel('A588', 4.5, 'imperial', '/p')).toMatchObject({ fy: 46, fu: 67 });
    expect(resolveSteel('A588', 6, 'imperial', '/p')).toMatchObject({ fy: 42, fu: 63 });
  });

  it('band limits apply to a metric thickness converted to inches: A36 at 203.2 mm (= 8 in) and 204 mm', () => {
    // 203.2 mm / 25.4 = 8 in exactly; 204 mm = 8.031 in
    close(resolveSteel('A36', 203.2, 'metric', '/p').fy, 36 * 6.894757293168, 1e-12);
    close(resolveSteel('A36', 204, 'metric', '/p').fy, 32 * 6.894757293168, 1e-12);
  });

  it('and an inch thickness to mm: S355 at 1.5 in (38.1 mm) and 1.6 in (40.64 mm)', () => {
    close(resolveSteel('S355', 1.5, 'imperial', '/p').fy, 355 / 6.894757293168, 1e-12);
    close(resolveSteel('S355', 1.6, 'imperial', '/p').fy, 335 / 6.894757293168, 1e-12);
  });

  it.each([
    ['A514', 6.5, 'imperial'],
    ['A572-50', 4.5, 'imperial'],
    ['A572-65', 1.5, 'imperial'],
    ['A588', 8.5, 'imperial'],
    ['S355', 81, 'metric'],
  ] as const)('%s at %s (%s) is out of range → MATERIAL_THICKNESS_OUT_OF_RANGE', (name, t, sys) => {
    const e = thrown(() => resolveSteel(name, t, sys, '/parts/1/steel'), EngineError);
    expect(e.code).toBe('MATERIAL_THICKNESS_OUT_OF_RANGE');
    expect(e.pointer).toBe('/parts/1/steel');
  });

  it('every grade has bands in increasing thickness order', () => {
    for (const g of STEELS) {
      for (let i = 1; i < g.bands.length; i++) expect(g.bands[i]!.upTo).toBeGreaterThan(g.bands[i - 1]!.upTo);
      for (const b of g.bands) expect(b.fy).toBeLessThan(b.fu);
    }
  });
});

describe('steel given by numbers', () => {
  it('passes fy and fu through in the request units', () => {
    expect(resolveSteel({ fy: 50, fu: 65 }, 1, 'imperial', '/p')).toEqual({ name: null, fy: 50, fu: 65 });
    expect(resolveSteel({ fy: 355, fu: 355 }, 10, 'metric', '/p')).toEqual({ name: null, fy: 355, fu: 355 });
  });

  it('fy > fu → MATERIAL_FY_EXCEEDS_FU with the pointer', () => {
    const e = thrown(() => resolveSteel({ fy: 70, fu: 65 }, 1, 'imperial', '/parts/0/steel'), EngineError);
    expect(e.code).toBe('MATERIAL_FY_EXCEEDS_FU');
    expect(e.pointer).toBe('/parts/0/steel');
  });

  it('an unknown name → UNKNOWN_MATERIAL', () => {
    expect(thrown(() => resolveSteel('A999', 1, 'imperial', '/p'), EngineError).code).toBe('UNKNOWN_MATERIAL');
    expect(thrown(() => resolveElectrode('E71', 'imperial', '/electrode'), EngineError).code).toBe('UNKNOWN_MATERIAL');
  });
});

describe('cross-system conversion (1 ksi = 6.894757293168 MPa, 1 in = 25.4 mm, by definition)', () => {
  it('S355 in imperial: 355 / 6.894757 = 51.49 ksi, 510 / 6.894757 = 73.97 ksi', () => {
    const s = resolveSteel('S355', 0.5, 'imperial', '/p');
    close(s.fy, 355 / 6.894757293168, 1e-12);
    expect(s.fy).toBeCloseTo(51.49, 2);
    expect(s.fu).toBeCloseTo(73.97, 2);
  });

  it('A36 in metric: 36 × 6.894757 = 248.2 MPa, 58 × 6.894757 = 399.9 MPa', () => {
    const s = resolveSteel('A36', 20, 'metric', '/p');
    expect(s.fy).toBeCloseTo(248.21, 2);
    expect(s.fu).toBeCloseTo(399.9, 1);
  });

  it('E70 in metric: 70 × 6.894757 = 482.6 MPa; E49 in imperial: 490 / 6.894757 = 71.07 ksi', () => {
    expect(resolveElectrode('E70', 'metric', '/e').fexx).toBeCloseTo(482.63, 2);
    expect(resolveElectrode('E49', 'imperial', '/e').fexx).toBeCloseTo(71.07, 2);
  });

  it('convert* functions', () => {
    close(convertLength(1, 'imperial', 'metric'), 25.4, 1e-15);
    close(convertLength(25.4, 'metric', 'imperial'), 1, 1e-15);
    close(convertStress(1, 'imperial', 'metric'), 6.894757293168, 1e-15);
    close(convertForce(1, 'imperial', 'metric'), 4.4482216152605, 1e-15);
    close(convertForce(4.4482216152605, 'metric', 'imperial'), 1, 1e-15);
    expect(convertStress(50, 'metric', 'metric')).toBe(50);
  });

  it('ksi·in² = kip matches MPa·mm² = N: 6.894757293168 × 645.16 / 1000 = 4.44822 kN', () => {
    close((6.894757293168 * 25.4 * 25.4) / 1000, 4.4482216152605, 1e-12);
  });
});

describe('electrodes (AWS A5.1/A5.5 and A5.1M/A5.5M classifications, from memory)', () => {
  it.each([
    ['E60', 60],
    ['E70', 70],
    ['E80', 80],
    ['E90', 90],
    ['E100', 100],
    ['E110', 110],
  ])('%s: FEXX %s ksi', (name, fexx) => {
    expect(resolveElectrode(name, 'imperial', '/e')).toEqual({ name, fexx });
  });

  it.each([
    ['E43', 430],
    ['E49', 490],
    ['E55', 550],
    ['E62', 620],
    ['E69', 690],
    ['E76', 760],
  ])('%s: FEXX %s MPa', (name, fexx) => {
    expect(resolveElectrode(name, 'metric', '/e')).toEqual({ name, fexx });
  });

  it('an electrode given by number passes through', () => {
    expect(resolveElectrode({ fexx: 75 }, 'imperial', '/e')).toEqual({ name: null, fexx: 75 });
  });

  it('the catalogue lists each name once', () => {
    expect(new Set(ELECTRODES.map((e) => e.name)).size).toBe(ELECTRODES.length);
    expect(new Set(STEELS.map((s) => s.name)).size).toBe(STEELS.length);
  });
});

describe('parseFraction', () => {
  it.each([
    ['5/16', 0.3125],
    ['1-1/4', 1.25],
    ['1 1/4', 1.25],
    ['3', 3],
    ['0.3125', 0.3125],
    ['3/8', 0.375],
    ['2-1/2', 2.5],
    [' 5/16 ', 0.3125],
    ['10', 10],
  ])('"%s" → %s', (text, value) => {
    expect(parseFraction(text)).toBe(value);
  });

  it.each(['', 'abc', '5/0', '5//16', '1--1/4', '-1/4', '1/4/8', '5/16in', '1,5', 'NaN', 'Infinity', '1e3'])('"%s" → undefined', (text) => {
    expect(parseFraction(text)).toBeUndefined();
  });
});
