/**
 * Unit systems.
 *
 * The engine computes in the caller's own system, because AISC 360-22 states its metric
 * limits as values of their own (1/16 in is 2 mm, 5/16 in is 8 mm), not as conversions.
 * Within each system the units are consistent except for one factor: imperial
 * ksi · in² = kip exactly; metric MPa · mm² = N, and forces are reported in kN, so
 * `stressArea` (the force of one stress unit on one area unit) is 1 or 0.001.
 * Conversion between systems happens only where a catalogue value native to one system
 * (an ASTM grade in ksi, an EN grade in MPa) is used in the other.
 */

export type UnitSystemId = 'imperial' | 'metric';

export interface UnitSystem {
  readonly id: UnitSystemId;
  readonly length: 'in' | 'mm';
  readonly force: 'kip' | 'kN';
  readonly stress: 'ksi' | 'MPa';
  /** Force, in the system's force unit, of one stress unit acting on one area unit. */
  readonly stressArea: number;
}

export const IMPERIAL: UnitSystem = Object.freeze({
  id: 'imperial',
  length: 'in',
  force: 'kip',
  stress: 'ksi',
  stressArea: 1,
});

export const METRIC: UnitSystem = Object.freeze({
  id: 'metric',
  length: 'mm',
  force: 'kN',
  stress: 'MPa',
  stressArea: 0.001,
});

export function unitSystem(id: UnitSystemId): UnitSystem {
  return id === 'metric' ? METRIC : IMPERIAL;
}

/** Exact definitions: 1 in = 25.4 mm; 1 kip = 4.4482216152605 kN; 1 ksi = 6.894757293168 MPa. */
export const MM_PER_IN = 25.4;
export const KN_PER_KIP = 4.4482216152605;
export const MPA_PER_KSI = 6.894757293168;

/** Converts a stress between systems. */
export function convertStress(value: number, from: UnitSystemId, to: UnitSystemId): number {
  if (from === to) return value;
  return from === 'imperial' ? value * MPA_PER_KSI : value / MPA_PER_KSI;
}

/** Converts a length between systems. */
export function convertLength(value: number, from: UnitSystemId, to: UnitSystemId): number {
  if (from === to) return value;
  return from === 'imperial' ? value * MM_PER_IN : value / MM_PER_IN;
}

/** Converts a force between systems. */
export function convertForce(value: number, from: UnitSystemId, to: UnitSystemId): number {
  if (from === to) return value;
  return from === 'imperial' ? value * KN_PER_KIP : value / KN_PER_KIP;
}

/**
 * Parses an imperial fraction string: "5/16", "1-1/4", "1 1/4", "3", "0.3125".
 * Returns undefined when the text is not such a number (the caller reports the field).
 */
export function parseFraction(text: string): number | undefined {
  const s = text.trim();
  const plain = /^\d+(?:\.\d+)?$/;
  if (plain.test(s)) return Number(s);
  const m = /^(?:(\d+)[ -])?(\d+)\/(\d+)$/.exec(s);
  if (!m) return undefined;
  const whole = m[1] === undefined ? 0 : Number(m[1]);
  const num = Number(m[2]);
  const den = Number(m[3]);
  if (den === 0) return undefined;
  return whole + num / den;
}
