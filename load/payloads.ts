/** The request bodies the benchmarks send: the bench's own invented welds, one of each kind measured. */
export const fillet = {
  method: 'LRFD', units: 'imperial', electrode: 'E70',
  welds: [{ size: '5/16', length: 10, angle: 0, count: 2 }],
  load: { force: 120 },
  parts: [{ thickness: 0.5, steel: 'A572-50', faces: 2 }, { thickness: 0.75, steel: 'A992' }],
};
export const pjp = {
  method: 'LRFD', units: 'imperial', electrode: 'E70',
  groove: { type: 'bevel-45', depth: 0.5, process: 'SMAW', position: 'vertical', sides: 1 },
  length: 12, load: { case: 'tension-normal', force: 40 },
  parts: [{ thickness: 0.75, steel: 'A992' }, { thickness: 1.0, steel: 'A572-50' }],
};
export const eccentric = {
  method: 'LRFD', units: 'imperial', electrode: 'E70', size: '1/4',
  segments: [{ from: [0, 0], to: [4, 0] }, { from: [0, 0], to: [0, 10] }, { from: [0, 10], to: [4, 10] }],
  load: { fx: 0, fy: -30, at: [10, 5] },
};
