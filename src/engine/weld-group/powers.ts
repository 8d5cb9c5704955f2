/**
 * The transcendental parts of the ICR element law, evaluated for every element at every step of
 * the solver (AISC Manual Part 8; AISC 360-22 §J2.4):
 *   (theta + 2)^0.32, the inverse of dm/(0.209·w), for theta in degrees;
 *   g^0.3, the curve's shape f = g^0.3 with g = p·(1.9 - 0.9·p);
 *   theta itself, the angle between the element's axis and its deformation, from its sine and cosine.
 *
 * provisions/icr.ts writes the powers as exp(a·ln x), two library calls each, and the solver took
 * the angle from atan2. Here each is a table value at the nearest grid point and a short series
 * for the small remainder ((1 + t)^a, or asin y), cut off where the next term is below about a
 * hundredth of the last unit of a double: the values agree with the library functions to a few
 * units in the last place (test/engine/weld-group-icr-speed.test.ts), with no library call and no
 * division. Arguments outside the tables fall back to exp(a·ln x).
 *
 * Tables are built once, at load, from the library functions themselves.
 */

/** Grid of the theta-power table: THETA_STEPS points per degree, theta = 0 ... 90. */
const THETA_STEPS = 64;
const THETA_MAX = 90;
const THETA_TABLE = ((): Float64Array => {
  const n = THETA_MAX * THETA_STEPS;
  const t = new Float64Array(n + 1);
  for (let j = 0; j <= n; j++) t[j] = Math.exp(0.32 * Math.log(2 + j / THETA_STEPS));
  return t;
})();

/** Binomial series coefficients of (1 + t)^a, k = 1 ... count. */
function binomial(a: number, count: number): Float64Array {
  const c = new Float64Array(count + 1);
  c[0] = 1;
  for (let k = 1; k <= count; k++) c[k] = (c[k - 1]! * (a - k + 1)) / k;
  return c;
}

// |t| <= (1/128)/2 = 1/256 for the theta-power table (theta + 2 >= 2): the seventh term is below 3e-19
const B032 = binomial(0.32, 6);
const B1 = B032[1]!;
const B2 = B032[2]!;
const B3 = B032[3]!;
const B4 = B032[4]!;
const B5 = B032[5]!;
const B6 = B032[6]!;

/** 1/(2 + j/THETA_STEPS), the theta-power table's abscissae inverted. */
const THETA_INVERSE = ((): Float64Array => {
  const n = THETA_MAX * THETA_STEPS;
  const t = new Float64Array(n + 1);
  for (let j = 0; j <= n; j++) t[j] = THETA_STEPS / (2 * THETA_STEPS + j);
  return t;
})();

/** (theta + 2)^0.32 for theta in degrees (0 to 90 by the table; elsewhere exp(0.32·ln)). */
export function thetaPower(thetaDeg: number): number {
  if (!(thetaDeg >= 0 && thetaDeg <= THETA_MAX)) return Math.exp(0.32 * Math.log(thetaDeg + 2));
  const j = (thetaDeg * THETA_STEPS + 0.5) | 0;
  const t = (thetaDeg - j * (1 / THETA_STEPS)) * THETA_INVERSE[j]!;
  // the series in Estrin's form (shorter dependency chains than Horner's)
  const t2 = t * t;
  const s = 1 + B1 * t + t2 * (B2 + B3 * t) + t2 * t2 * (B4 + B5 * t + t2 * B6);
  return THETA_TABLE[j]! * s;
}

/** Mantissa grid of the g table: g = 2^k·m, m in [1, 2) at MANTISSA_STEPS points per unit. */
const MANTISSA_STEPS = 256;
const MANTISSA_TABLE = ((): Float64Array => {
  const t = new Float64Array(MANTISSA_STEPS + 1);
  for (let j = 0; j <= MANTISSA_STEPS; j++) t[j] = Math.exp(0.3 * Math.log(1 + j / MANTISSA_STEPS));
  return t;
})();
const MANTISSA_INVERSE = ((): Float64Array => {
  const t = new Float64Array(MANTISSA_STEPS + 1);
  for (let j = 0; j <= MANTISSA_STEPS; j++) t[j] = MANTISSA_STEPS / (MANTISSA_STEPS + j);
  return t;
})();
/** Exponents k of g = 2^k·m held in the table: -OCTAVES < k <= 0 (g in [2^-29, 2)). */
const OCTAVES = 30;
const TWO_OCTAVES = 2 ** OCTAVES;
/** 2^(0.3·k) and 2^-k for k = 0, -1, ..., at index -k. */
const OCTAVE_POWER = Float64Array.from({ length: OCTAVES + 1 }, (_, i) => Math.exp(0.3 * Math.log(2 ** -i)));
const OCTAVE_SCALE = Float64Array.from({ length: OCTAVES + 1 }, (_, i) => 2 ** i);

// |t| <= (1/512) for the mantissa table: the sixth term is below 2e-18
const G03 = binomial(0.3, 5);
const G1 = G03[1]!;
const G2 = G03[2]!;
const G3 = G03[3]!;
const G4 = G03[4]!;
const G5 = G03[5]!;

const G_LEAST = 2 ** -(OCTAVES - 1);

/** g^0.3 for g > 0 (2^-29 <= g < 2 by the table; elsewhere exp(0.3·ln g)). */
export function power03(g: number): number {
  let i = 0;
  if (g < 1) {
    if (g >= 0.5) i = 1;
    else if (g >= G_LEAST) {
      // g·2^30 in [2, 2^30): its leading zeros give the exponent, k = 1 - clz
      i = Math.clz32(g * TWO_OCTAVES) - 1;
    } else return Math.exp(0.3 * Math.log(g));
  } else if (!(g < 2)) return Math.exp(0.3 * Math.log(g));
  const m = g * OCTAVE_SCALE[i]!;
  const j = ((m - 1) * MANTISSA_STEPS + 0.5) | 0;
  const t = (m - (1 + j * (1 / MANTISSA_STEPS))) * MANTISSA_INVERSE[j]!;
  const t2 = t * t;
  const s = 1 + G1 * t + t2 * (G2 + G3 * t) + t2 * t2 * (G4 + G5 * t);
  return OCTAVE_POWER[i]! * MANTISSA_TABLE[j]! * s;
}

/** Grid of the angle table: s_j = j/ANGLE_STEPS for sines (or cosines) up to sin 45 degrees. */
const ANGLE_STEPS = 512;
const ANGLE_COUNT = Math.ceil(Math.SQRT1_2 * ANGLE_STEPS) + 2;
/** asin(s_j) and sqrt(1 - s_j²) = cos(asin(s_j)). */
const ANGLE_TABLE = Float64Array.from({ length: ANGLE_COUNT }, (_, j) => Math.asin(j / ANGLE_STEPS));
const COS_TABLE = Float64Array.from({ length: ANGLE_COUNT }, (_, j) => Math.sqrt(1 - (j / ANGLE_STEPS) ** 2));
const RIGHT = Math.PI / 2;

/**
 * The angle (radians, 0 to π/2) whose sine and cosine are s and c (s, c >= 0, s² + c² = 1 to
 * rounding): from the smaller of the two, by the table of asin at the nearest grid point and
 * asin(s) = asin(s_j) + asin(y), y = sin(θ - θ_j) = s·cos θ_j - s_j·c, a short series
 * (|y| < 1.4e-3: the next term is below 1e-18·|y|). Within a few units in the last place of π/2;
 * no division.
 */
export function angleOf(s: number, c: number): number {
  const swap = s > c;
  const lo = swap ? c : s;
  const hi = swap ? s : c;
  const j = (lo * ANGLE_STEPS + 0.5) | 0;
  const y = lo * COS_TABLE[j]! - j * (1 / ANGLE_STEPS) * hi;
  const y2 = y * y;
  const at = ANGLE_TABLE[j]! + (y + y * y2 * (1 / 6 + y2 * (3 / 40)));
  return swap ? RIGHT - at : at;
}
