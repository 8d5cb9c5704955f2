/**
 * Fillet weld provisions, one function per published equation or table.
 * Lengths, stresses and forces are in one consistent unit system (see units.ts); angles in
 * degrees.
 */
import type { UnitSystem } from '../units.js';

/**
 * Effective throat of a fillet with legs a and b: the shortest distance from the root to the
 * face of the idealized triangle, a·b/sqrt(a² + b²) (0.7071·w for equal legs).
 * @cite AISC 360-22 §J2.2a
 */
export function te(a: number, b: number): number {
  return (a * b) / Math.hypot(a, b);
}

/**
 * Directional strength increase factor, kds = 1.0 + 0.50·sin^1.5(theta).
 * theta: angle between the line of action of the force and the weld axis, degrees.
 * @cite AISC 360-22 Eq. J2-5
 */
export function kds(thetaDeg: number): number {
  const s = Math.abs(Math.sin((thetaDeg * Math.PI) / 180));
  // s^1.5 as s·√s: within an ulp of Math.pow(s, 1.5) at a fraction of its cost (the elastic method evaluates this 65 times per segment)
  return 1.0 + 0.5 * s * Math.sqrt(s);
}

/**
 * Nominal stress of fillet weld metal, Fnw = 0.60·FEXX (times kds where the increase applies).
 * @cite AISC 360-22 Table J2.5
 */
export function Fnw(FEXX: number, kdsFactor = 1.0): number {
  return 0.6 * FEXX * kdsFactor;
}

/**
 * Nominal strength of weld metal, Rn = Fnw·Awe, in the system's force unit.
 * @cite AISC 360-22 Eq. J2-4
 */
export function RnWeld(FnwStress: number, Awe: number, units: UnitSystem): number {
  return FnwStress * Awe * units.stressArea;
}

/**
 * Nominal strength of a concentric group of longitudinal and transverse fillets of one size:
 * the larger of Rnwl + Rnwt and 0.85·Rnwl + 1.5·Rnwt, both computed without the directional
 * increase. Returns the strength and which option governs.
 * @cite AISC 360-22 Eq. J2-6a, J2-6b
 */
export function RnMixedGroup(Rnwl: number, Rnwt: number): { Rn: number; option: 'a' | 'b' } {
  const a = Rnwl + Rnwt;
  const b = 0.85 * Rnwl + 1.5 * Rnwt;
  return b > a ? { Rn: b, option: 'b' } : { Rn: a, option: 'a' };
}

/**
 * Effective length of an end-loaded fillet of length l and size w:
 * l for l <= 100·w; beta·l with beta = 1.2 - 0.002·(l/w) <= 1.0 up to 300·w; 180·w beyond.
 * @cite AISC 360-22 Eq. J2-1
 */
export function endLoadedLength(l: number, w: number): { effective: number; beta: number } {
  const ratio = l / w;
  if (ratio <= 100) return { effective: l, beta: 1 };
  if (ratio <= 300) {
    const beta = Math.min(1.0, 1.2 - 0.002 * ratio);
    return { effective: beta * l, beta };
  }
  return { effective: 180 * w, beta: (180 * w) / l };
}

/**
 * Effective size of a short fillet designed for strength: when l < 4·w, no more than l/4.
 * @cite AISC 360-22 §J2.2b
 */
export function shortWeldEffectiveSize(w: number, l: number): number {
  return Math.min(w, l / 4);
}
