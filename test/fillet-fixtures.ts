/**
 * Engine-level fillet requests for tests: one longitudinal 5/16 in E70 line 10 in long between two
 * 1 in A992 parts, LRFD, no demand, unless a test says otherwise.
 */
import type { FilletLine, FilletPart, FilletRequest } from '../src/engine/fillet.js';

export function line(size: number, length: number, over: Partial<FilletLine> = {}): FilletLine {
  return { legs: [size, size], length, angle: 0, count: 1, endLoaded: false, builtOut: false, intermittent: null, ...over };
}

export function part(thickness: number, steel: FilletPart['steel'] = 'A992', over: Partial<FilletPart> = {}): FilletPart {
  return { thickness, steel, edge: false, faces: 1, loading: 'shear', ...over };
}

export function req(over: Partial<FilletRequest> = {}): FilletRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    welds: [line(0.3125, 10)],
    parts: [part(1), part(1)],
    demand: null,
    directionalIncrease: true,
    lap: null,
    flatBarWidth: null,
    ...over,
  };
}

/**
 * The POST body the HTTP tests share: two 5/16 in E70 fillets 10 in long (20 in in all) joining a
 * 1/2 in A572-50 plate welded on both faces to a 3/4 in A992 part, 120 kips along the welds, LRFD.
 * By hand (AISC 360-22 Eq. J2-4, from memory): 0.75 × 0.6 × 70 × 0.707 × 5/16 × 20 = 139.2 kips
 * available, so it passes.
 */
export const FILLET_BODY = {
  method: 'LRFD',
  electrode: 'E70',
  welds: [{ size: '5/16', length: 10, count: 2 }],
  load: { force: 120 },
  parts: [
    { thickness: 0.5, steel: 'A572-50', faces: 2 },
    { thickness: 0.75, steel: 'A992' },
  ],
} as const;
