/**
 * The load-deformation law of a fillet weld element used by the instantaneous centre of rotation
 * (ICR) method for in-plane eccentric loads.
 *
 * Written from memory of the AISC Manual Part 8 and of AISC 360-22 §J2.4 with its Commentary
 * (the law goes back to the tests of Lesik and Kennedy); the equation numbers are not given
 * because we are not sure of 360-22's numbering for these expressions. Sizes and deformations in
 * one length unit; angles in degrees, as the published expressions take them; theta is the angle
 * between the element's force and its axis, 0 (longitudinal) to 90 (transverse).
 *
 * The functions are small and allocation-free so that the solver can call them in its hot loop;
 * powers are written as exp(a·ln x), which V8 evaluates about twice as fast as Math.pow, to the
 * same precision (a few units in the last place).
 *
 * The ICR solver's element loop does not call deltaM and fOfP: it evaluates the same two
 * expressions inline with the table-and-series powers of weld-group/powers.ts (about four times
 * faster per element). A change to the law here must be made there too; the solver's tests
 * against published Manual values and the capacity checks would show a mismatch.
 */

/** Cap on the deformation at ultimate as a fraction of the weld size (du <= 0.17·w). */
export const DU_CAP = 0.17;

/** Angle (degrees) below which the 0.17·w cap governs du: 1.087·(theta + 6)^-0.65 = 0.17. */
export const DU_CAP_ANGLE = Math.pow(1.087 / DU_CAP, 1 / 0.65) - 6;

/**
 * Deformation of a weld element at ultimate, du = 1.087·(theta + 6)^-0.65·w <= 0.17·w.
 * @cite AISC Manual Part 8
 */
export function deltaU(thetaDeg: number, w: number): number {
  if (thetaDeg < DU_CAP_ANGLE) return DU_CAP * w;
  return 1.087 * Math.exp(-0.65 * Math.log(thetaDeg + 6)) * w;
}

/**
 * Deformation of a weld element at its peak strength, dm = 0.209·(theta + 2)^-0.32·w.
 * @cite AISC Manual Part 8
 */
export function deltaM(thetaDeg: number, w: number): number {
  return 0.209 * Math.exp(-0.32 * Math.log(thetaDeg + 2)) * w;
}

/**
 * Shape of the load-deformation curve, f(p) = [p·(1.9 - 0.9·p)]^0.3 with p = d/dm, the ratio of
 * the element's deformation to its deformation at peak. Zero for p <= 0 and past the root of
 * 1.9 - 0.9·p (which the ICR method never reaches: p <= du/dm < 1.2).
 * @cite AISC 360-22 §J2.4
 */
export function fOfP(p: number): number {
  const g = p * (1.9 - 0.9 * p);
  return g > 0 ? Math.exp(0.3 * Math.log(g)) : 0;
}

/**
 * Nominal strength of one weld element of effective area Awe at angle theta and deformation
 * ratio p: R = 0.60·FEXX·(1.0 + 0.50·sin^1.5 theta)·f(p)·Awe. The solver passes kds (from
 * Eq. J2-5 in provisions/fillet.ts) and Fnw·Awe (Eq. J2-4) so that this module does not restate
 * those equations.
 * @cite AISC Manual Part 8
 */
export function elementStrength(FnwAwe: number, kdsFactor: number, p: number): number {
  return FnwAwe * kdsFactor * fOfP(p);
}

/**
 * The directional factor of Eq. J2-5, 1.0 + 0.50·sin^1.5 theta, from sin theta itself. The solver
 * knows sin theta from the element's geometry, and this form saves a sine and a general power
 * per element; a test holds it equal to kds() of provisions/fillet.ts at every angle.
 * @cite AISC 360-22 Eq. J2-5
 */
export function kdsOfSin(sinTheta: number): number {
  const s = Math.abs(sinTheta);
  return 1.0 + 0.5 * s * Math.sqrt(s);
}

// ---- derivatives used by the solver's Newton steps (derived from the expressions above) ----

/** d(du)/d(theta) per degree; zero where the 0.17·w cap governs. */
export function deltaUSlope(thetaDeg: number, w: number): number {
  if (thetaDeg < DU_CAP_ANGLE) return 0;
  return -0.65 * 1.087 * Math.exp(-1.65 * Math.log(thetaDeg + 6)) * w;
}

/** d(ln dm)/d(theta) per degree. */
export function deltaMLogSlope(thetaDeg: number): number {
  return -0.32 / (thetaDeg + 2);
}

/** df/dp; pass f = fOfP(p) when it is already known, to save a power. */
export function fOfPSlope(p: number, f: number = fOfP(p)): number {
  const g = p * (1.9 - 0.9 * p);
  if (!(g > 0)) return 0;
  return (0.3 * f * (1.9 - 1.8 * p)) / g;
}

/** d(kds)/d(theta) per radian from sin and cos of theta: kds = 1 + 0.5·sin^1.5 theta. */
export function kdsSlopeRad(sinTheta: number, cosTheta: number): number {
  return 0.75 * Math.sqrt(sinTheta) * cosTheta;
}
