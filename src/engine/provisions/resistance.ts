/**
 * Resistance and safety factors, and the step from nominal to available strength.
 * Each pair is a named, adjustable parameter set; the defaults are the Specification's.
 */

export type Method = 'LRFD' | 'ASD';

export interface Factors {
  readonly phi: number;
  readonly omega: number;
}

/** Factors by limit state. @cite AISC 360-22 Table J2.5 and §J4 */
export const FACTORS = Object.freeze({
  /** Fillet weld metal in shear; PJP shear. @cite AISC 360-22 Table J2.5 */
  weldShear: { phi: 0.75, omega: 2.0 },
  /** Shear yielding of connecting elements. @cite AISC 360-22 Eq. J4-3 */
  shearYield: { phi: 1.0, omega: 1.5 },
  /** Shear rupture of connecting elements. @cite AISC 360-22 Eq. J4-4 */
  shearRupture: { phi: 0.75, omega: 2.0 },
  /** Tension yielding of connecting elements. @cite AISC 360-22 Eq. J4-1 */
  tensionYield: { phi: 0.9, omega: 1.67 },
  /** Tension rupture of connecting elements. @cite AISC 360-22 Eq. J4-2 */
  tensionRupture: { phi: 0.75, omega: 2.0 },
} satisfies Record<string, Factors>);

/**
 * Available strength: phi·Rn (LRFD) or Rn/Omega (ASD).
 * @cite AISC 360-22 §B3.1
 */
export function availableStrength(method: Method, Rn: number, factors: Factors): number {
  return method === 'LRFD' ? factors.phi * Rn : Rn / factors.omega;
}
