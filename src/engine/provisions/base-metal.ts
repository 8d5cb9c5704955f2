/**
 * Affected elements of connections: the base metal beside a weld.
 * Stresses and areas in one consistent unit system; the result in the system's force unit.
 */
import type { UnitSystem } from '../units.js';

/** Shear yielding, Rn = 0.60·Fy·Agv. @cite AISC 360-22 Eq. J4-3 */
export function RnShearYield(Fy: number, Agv: number, units: UnitSystem): number {
  return 0.6 * Fy * Agv * units.stressArea;
}

/** Shear rupture, Rn = 0.60·Fu·Anv. @cite AISC 360-22 Eq. J4-4 */
export function RnShearRupture(Fu: number, Anv: number, units: UnitSystem): number {
  return 0.6 * Fu * Anv * units.stressArea;
}

/** Tension yielding, Rn = Fy·Ag. @cite AISC 360-22 Eq. J4-1 */
export function RnTensionYield(Fy: number, Ag: number, units: UnitSystem): number {
  return Fy * Ag * units.stressArea;
}

/** Tension rupture, Rn = Fu·Ae. @cite AISC 360-22 Eq. J4-2 */
export function RnTensionRupture(Fu: number, Ae: number, units: UnitSystem): number {
  return Fu * Ae * units.stressArea;
}
