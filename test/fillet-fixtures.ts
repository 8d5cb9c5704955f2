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
