/**
 * Instantaneous centre of rotation (ICR) solver for in-plane eccentric loads on a weld group.
 *
 * Unknown: the rigid-body motion of the loaded part, m = (u, v, ω·lc) (translation of the
 * centroid and rotation, lc = the group's polar radius of gyration), on the unit sphere. The
 * motion's scale is fixed by the critical element, so every point of the sphere is an ordinary
 * state: a centre at infinity (pure translation, ω = 0) needs no special case. For a motion m:
 *   - each element deforms along its motion δ_i, perpendicular to the radius from the centre;
 *   - the critical point has the smallest du/|δ|; every element then deforms d_i = σ·|δ_i| with
 *     σ = du_crit/|δ_crit| (the Manual's d_i = r_i·du_crit/r_crit, written without r);
 *   - each element carries R_i (element law, provisions/icr.ts) along δ_i;
 *   - G(m) = (ΣFx, ΣFy, ΣM/lc) about the centroid.
 * Equilibrium with a load P·(dx, dy) whose line passes at signed distance e from the centroid
 * (moment P·e counter-clockwise) is G(m) = P·q with q = (dx, dy, e/lc): two conditions (G parallel
 * to q) on the two degrees of freedom of m, then P = G·q/|q|². G is odd in m, so a root with G
 * anti-parallel to q is the same answer with the motion reversed.
 *
 * Method: Newton's method on the two components of G normal to q, in the tangent plane of the
 * sphere, with the analytical Jacobian, Levenberg-Marquardt damping and backtracking on the
 * angle between G and q; started from the answer on a coarse mesh of the same welds (about
 * COARSE_FACTOR elements merged into one; a cheap solve whose motion is a few Newton steps nearer
 * than the elastic motion), then from the elastic motion (which is q itself, normalised) and,
 * when those fail, from a fixed set of other motions. Converged answers do not depend on the start
 * beyond the tolerance. Bounded by an iteration count (coarse iterations included) and by a work
 * budget (element evaluations), and optionally by a caller's clock: it returns or throws
 * WELD_GROUP_ICR_NOT_CONVERGED, never runs on.
 *
 * The critical ratio is sought over the element end points (the weld ends included) rather than
 * the element centres: both converge to the same continuous answer as the elements get finer,
 * but end points do so as h² and from the safe side, centres as h and from above.
 *
 * An evaluation of G works through the elements in three short passes (geometry; angle and p;
 * f(p), R and the sums), and the Jacobian, when a step needs it, in a fourth from the values they
 * keep. The element law's powers and angle come from powers.ts (tables and short series, to a few
 * units in the last place of the library functions). No allocation inside the iteration loop: the
 * work arrays are made once per solve (the per-element one lent from solve to solve).
 */
import { EngineError } from '../errors.js';
import { deltaMLogSlope, deltaU, deltaUSlope, fOfPSlope, kdsOfSin, kdsSlopeRad } from '../provisions/icr.js';
import { coarsen, type Mesh } from './discretise.js';
import { angleOf, power03, thetaPower } from './powers.js';

const DEG = 180 / Math.PI;
/** du/w at 90 degrees, the smallest du/w at any angle (du falls as theta grows), a little reduced for rounding. */
const DU_FLOOR = deltaU(90, 1) * (1 - 1e-9);
/** Deformation magnitudes below this (per unit motion) mean the element sits on the centre. */
const RHO_MIN = 1e-13;
/**
 * Lower bounds of du/w by angle, for skipping nodes that cannot be critical: bin j holds the
 * angles whose q = |sin θ|/(|sin θ| + |cos θ|) lies in [j, j + 1)/DU_BINS (q grows with θ), and
 * the bound is du/w at the bin's largest angle (du falls as θ grows), a little reduced for rounding.
 */
const DU_BINS = 512;
const DU_BOUND = ((): Float64Array => {
  const t = new Float64Array(DU_BINS + 1);
  for (let j = 0; j <= DU_BINS; j++) {
    const q = Math.min(1, (j + 1) / DU_BINS);
    t[j] = deltaU(Math.min(90, Math.atan2(q, 1 - q) * DEG + 1e-6), 1) * (1 - 1e-9);
  }
  return t;
})();

export interface IcrLoad {
  /** Unit direction of the in-plane load. */
  readonly dx: number;
  readonly dy: number;
  /** Signed distance of the load's line from the centroid: the load's moment about it is P·e (counter-clockwise positive). */
  readonly e: number;
}

export interface IcrOptions {
  /** Most Newton iterations over all starts. */
  readonly maxIterations?: number;
  /** Most element evaluations (elements + nodes, summed over evaluations). */
  readonly workBudget?: number;
  /** Converged when the angle between G and q is below this (radians). */
  readonly tolerance?: number;
  /** A motion to start from (e.g. the previous solve's, when only the weld size changed). */
  readonly start?: readonly [number, number, number];
  /** The caller's clock in ms and the time allowed; the engine itself never reads a clock. */
  readonly now?: () => number;
  readonly timeLimitMs?: number;
  /** Called after each iteration with the merit (angle between G and q); for diagnostics. */
  readonly trace?: (iteration: number, merit: number, motion: Float64Array) => void;
}

export const ICR_DEFAULTS = Object.freeze({ maxIterations: 600, workBudget: 2e7, tolerance: 1e-12, acceptTolerance: 1e-9 });

export interface IcrSolution {
  /** Nominal capacity Pn for the load's direction and line. */
  readonly capacity: number;
  /** Unit motion (u, v, ω·lc) at capacity, oriented so that P > 0. */
  readonly motion: [number, number, number];
  /** The instantaneous centre (absolute coordinates), or null for a pure translation. */
  readonly centre: [number, number] | null;
  /** Distance of the centre from the centroid, or null for a pure translation. */
  readonly centreDistance: number | null;
  readonly critical: {
    readonly node: number;
    readonly segment: number;
    /** The element whose end point is critical (the one on the segment at or just before it). */
    readonly element: number;
    readonly point: [number, number];
    /** Distance from the centre, or null for a pure translation. */
    readonly radius: number | null;
    /** Deformation at ultimate of the critical point, du. */
    readonly deformation: number;
    /** Angle theta at the critical point, degrees. */
    readonly angle: number;
  };
  /** Equilibrium residuals: force components and moment (about the centroid) left over, and their size relative to the load. */
  readonly residual: { readonly fx: number; readonly fy: number; readonly moment: number; readonly relative: number };
  readonly iterations: number;
  readonly evaluations: number;
  /** Element force vectors at capacity, x and y interleaved (length 2n). */
  readonly forces: Float64Array;
}

/**
 * Per-element values of the evaluation in hand, interleaved in one array (lent from solve to
 * solve): the force R, |δ| (0 for an element on the centre), theta (degrees), p = d/dm, f(p), the
 * constant 1/(0.209·w) of dm = 0.209·w·(θ + 2)^-0.32 (AISC Manual Part 8), 1/|δ|, and the sine and
 * cosine of the angle between the element's axis and its deformation (signed).
 */
const E_R = 0;
const E_RHO = 1;
const E_THETA = 2;
const E_P = 3;
const E_F = 4;
const E_DM = 5;
const E_INV = 6;
const E_SIN = 7;
const E_COS = 8;
const E_STRIDE = 9;

/**
 * The per-element array of the last solve, lent to the next one (solves run one at a time; one
 * started while another holds the array, from a caller's callback, makes its own). Arrays
 * longer than SPARE_MOST values are not kept.
 */
let spare: Float64Array | null = null;
const SPARE_MOST = 1 << 16;

/** Work arrays and the evaluation of G(m) and its Jacobian, reused across iterations. */
class Workspace {
  readonly G = new Float64Array(3);
  /** dG/dm, row-major 3×3. */
  readonly J = new Float64Array(9);
  readonly dsig = new Float64Array(3);
  /** Per-element values, E_STRIDE to an element (see E_R ... E_COS). */
  readonly el: Float64Array;
  crit = -1;
  sigma = 0;
  /** Sum of the element forces' magnitudes: a scale of G that varies little with the motion. */
  sumR = 0;
  /** The true minimum ratio and its node, also when a node is forced critical. */
  minRatio = 0;
  minNode = -1;
  /** A node held as the critical one (active-set step), or -1 for the true minimum. */
  forced = -1;
  evaluations = 0;
  work = 0;

  /**
   * Scale of the moment row of G: G[2] = M/lm. lm = max(lc, |e|) keeps force and moment balanced
   * in the merit when the load is far from the group (nearly a pure moment).
   */
  momentScale = 1;
  /** The motion of the last evaluation, and whether a node was forced then. */
  readonly at = new Float64Array(3);
  atForced = -1;

  constructor(readonly mesh: Mesh) {
    const need = E_STRIDE * mesh.n;
    // every value is written before it is read, so a spare array's old contents never show
    const el = spare !== null && spare.length >= need ? spare : new Float64Array(need);
    spare = null;
    for (let i = 0; i < mesh.n; i++) el[E_STRIDE * i + E_DM] = 1 / (0.209 * mesh.w[i]!);
    this.el = el;
  }

  /** Hands the per-element array on to the next solve (this workspace is not used again). */
  release(): void {
    if (this.el.length <= SPARE_MOST && (spare === null || spare.length < this.el.length)) spare = this.el;
  }

  /**
   * The element force vectors (x and y interleaved) of the last evaluation, for the motion
   * (u, v, ω) it was made at or its reverse (the forces then follow the motion).
   */
  forces(u: number, v: number, om: number): Float64Array {
    const M = this.mesh;
    const el = this.el;
    const out = new Float64Array(2 * M.n);
    for (let i = 0, e = 0; i < M.n; i++, e += E_STRIDE) {
      if (el[e + E_RHO] === 0) continue;
      const q = el[e + E_R]! * el[e + E_INV]!;
      out[2 * i] = q * (u - om * M.y[i]!);
      out[2 * i + 1] = q * (v + om * M.x[i]!);
    }
    return out;
  }

  /**
   * Evaluates G at the motion (u, v, w3), keeping what the Jacobian needs (jacobian() then gives
   * dG/dm at the same motion). False when no point deforms.
   */
  evaluate(u: number, v: number, w3: number): boolean {
    const M = this.mesh;
    this.at[0] = u;
    this.at[1] = v;
    this.at[2] = w3;
    this.atForced = this.forced;
    const iL = 1 / M.lc;
    const om = w3 * iL;
    this.evaluations++;
    this.work += M.n + M.nodes;

    const bi = this.critical(u, v, om);
    if (bi < 0) return false;
    if (this.forced >= 0) {
      const r = nodeRatio(M, this.forced, u, v, om);
      if (r === Number.POSITIVE_INFINITY) return false;
      this.crit = this.forced;
      this.sigma = r;
    } else {
      this.crit = bi;
      this.sigma = this.minRatio;
    }

    // ---- elements: the law (R = Fnw·Awe·kds·f(p), provisions/icr.ts) and the resultant ----
    // In three passes with short chains of dependent operations, so that the processor works
    // on several elements at once (one pass doing all would wait on each element's long chain).
    const sigma = this.sigma;
    const x = M.x;
    const y = M.y;
    const tx = M.tx;
    const ty = M.ty;
    const str = M.strength;
    const el = this.el;
    const n = M.n;
    // geometry: |δ|, 1/|δ|, sin θ and cos θ (θ the angle between the element's axis and its motion)
    for (let i = 0, e = 0; i < n; i++, e += E_STRIDE) {
      const ddx = u - om * y[i]!;
      const ddy = v + om * x[i]!;
      const rho = Math.sqrt(ddx * ddx + ddy * ddy);
      if (rho <= RHO_MIN) {
        el[e + E_RHO] = 0;
        continue;
      }
      const inv = 1 / rho;
      el[e + E_RHO] = rho;
      el[e + E_INV] = inv;
      el[e + E_SIN] = (tx[i]! * ddy - ty[i]! * ddx) * inv;
      el[e + E_COS] = (tx[i]! * ddx + ty[i]! * ddy) * inv;
    }
    // θ, and p = d/dm with d = σ·|δ| and dm = 0.209·w·(θ + 2)^-0.32
    for (let e = 0; e < n * E_STRIDE; e += E_STRIDE) {
      const rho = el[e + E_RHO]!;
      if (rho === 0) continue;
      const th = angleOf(Math.abs(el[e + E_SIN]!), Math.abs(el[e + E_COS]!)) * DEG;
      el[e + E_THETA] = th;
      el[e + E_P] = sigma * rho * thetaPower(th) * el[e + E_DM]!;
    }
    // f = [p·(1.9 - 0.9·p)]^0.3 (zero past the root), R, and their resultant
    let g0 = 0;
    let g1 = 0;
    let g2 = 0;
    let sr = 0;
    for (let i = 0, e = 0; i < n; i++, e += E_STRIDE) {
      if (el[e + E_RHO] === 0) {
        el[e + E_R] = 0;
        continue;
      }
      const p = el[e + E_P]!;
      const g = p * (1.9 - 0.9 * p);
      const f = g > 0 ? power03(g) : 0;
      const Ri = str[i]! * kdsOfSin(el[e + E_SIN]!) * f;
      el[e + E_F] = f;
      el[e + E_R] = Ri;
      const xi = x[i]!;
      const yi = y[i]!;
      const q = Ri * el[e + E_INV]!;
      const fx = q * (u - om * yi);
      const fy = q * (v + om * xi);
      sr += Ri;
      g0 += fx;
      g1 += fy;
      g2 += (xi * fy - yi * fx) * iL;
    }
    this.sumR = sr;
    const G = this.G;
    G[0] = g0;
    G[1] = g1;
    G[2] = g2 * this.momentScale;
    return true;
  }

  /**
   * The critical point: the smallest du/|δ| over the nodes; sets minRatio and minNode and returns
   * the node, or -1 when no node deforms. Exact: a node is skipped only when a lower bound of its
   * du (DU_FLOOR, then the bound table on its angle) already gives a ratio no smaller than the
   * best so far, and starting from the last critical node makes the best so far small at once.
   */
  private critical(u: number, v: number, om: number): number {
    const M = this.mesh;
    let best = Number.POSITIVE_INFINITY;
    let bi = -1;
    const nN = M.nodes;
    const nx = M.nx;
    const ny = M.ny;
    const ntx = M.ntx;
    const nty = M.nty;
    const nw = M.nw;
    if (this.minNode >= 0) {
      const r = nodeRatio(M, this.minNode, u, v, om);
      if (r < Number.POSITIVE_INFINITY) {
        best = r;
        bi = this.minNode;
      }
    }
    for (let k = 0; k < nN; k++) {
      const ddx = u - om * ny[k]!;
      const ddy = v + om * nx[k]!;
      const r2 = ddx * ddx + ddy * ddy;
      const wk = nw[k]!;
      // DU_FLOOR·w >= best·|δ| in squares (a margin of 1e-9 in DU_FLOOR covers the rounding), before any root
      const fw = DU_FLOOR * wk;
      if (fw * fw >= best * best * r2) continue;
      const rho = Math.sqrt(r2);
      if (rho <= RHO_MIN) continue;
      const br = best * rho;
      if (fw >= br) continue;
      const ac = Math.abs(ntx[k]! * ddy - nty[k]! * ddx);
      const ad = Math.abs(ntx[k]! * ddx + nty[k]! * ddy);
      if (DU_BOUND[((ac / (ac + ad)) * DU_BINS) | 0]! * wk >= br) continue;
      const ratio = deltaU(Math.atan2(ac, ad) * DEG, wk) / rho;
      if (ratio < best) {
        best = ratio;
        bi = k;
      }
    }
    if (bi >= 0) {
      this.minRatio = best;
      this.minNode = bi;
    }
    return bi;
  }

  /** dσ/dm at the critical node of the last evaluation (σ = du/|δ| there), into dsig. */
  private criticalSlope(u: number, v: number, om: number): void {
    const M = this.mesh;
    const bi = this.crit;
    const iL = 1 / M.lc;
    const dsig = this.dsig;
    const xk = M.nx[bi]!;
    const yk = M.ny[bi]!;
    const ddx = u - om * yk;
    const ddy = v + om * xk;
    const rho = Math.sqrt(ddx * ddx + ddy * ddy);
    const r2 = rho * rho;
    const t0 = M.ntx[bi]!;
    const t1 = M.nty[bi]!;
    const c = t0 * ddy - t1 * ddx;
    const d = t0 * ddx + t1 * ddy;
    const ac = Math.abs(c);
    const ad = Math.abs(d);
    const sc = c > 0 ? 1 : c < 0 ? -1 : 0;
    const sd = d > 0 ? 1 : d < 0 ? -1 : 0;
    const th = Math.atan2(ac, ad) * DEG;
    const du = deltaU(th, M.nw[bi]!);
    const dup = deltaUSlope(th, M.nw[bi]!) * DEG;
    // dθ/dδ (radians), then through δ = B·m
    const gx = (-sc * ad * t1 - sd * ac * t0) / r2;
    const gy = (sc * ad * t0 - sd * ac * t1) / r2;
    const bt2 = (xk * gy - yk * gx) * iL;
    const n0 = ddx / rho;
    const n1 = ddy / rho;
    const bn2 = (xk * n1 - yk * n0) * iL;
    const a = dup / rho;
    const b = du / r2;
    dsig[0] = a * gx - b * n0;
    dsig[1] = a * gy - b * n1;
    dsig[2] = a * bt2 - b * bn2;
  }

  /** The Jacobian dG/dm at the motion of the last evaluate(), into J. */
  jacobian(): void {
    const M = this.mesh;
    const u = this.at[0]!;
    const v = this.at[1]!;
    const iL = 1 / M.lc;
    const om = this.at[2]! * iL;
    this.criticalSlope(u, v, om);
    const x = M.x;
    const y = M.y;
    const str = M.strength;
    const el = this.el;
    const isig = 1 / this.sigma;
    const n = M.n;
    let j0 = 0;
    let j1 = 0;
    let j2 = 0;
    let j3 = 0;
    let j4 = 0;
    let j5 = 0;
    let j6 = 0;
    let j7 = 0;
    let j8 = 0;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    for (let i = 0, e = 0; i < n; i++, e += E_STRIDE) {
      if (el[e + E_RHO] === 0) continue;
      const xi = x[i]!;
      const yi = y[i]!;
      const inv = el[e + E_INV]!;
      const n0 = (u - om * yi) * inv;
      const n1 = (v + om * xi) * inv;
      const sn = el[e + E_SIN]!;
      const cs = el[e + E_COS]!;
      const sinT = Math.abs(sn);
      const kf = kdsOfSin(sinT);
      const kp = kdsSlopeRad(sinT, Math.abs(cs));
      const p = el[e + E_P]!;
      const f = el[e + E_F]!;
      const si = str[i]!;
      const Ri = el[e + E_R]!;
      const dlm = deltaMLogSlope(el[e + E_THETA]!) * DEG;
      // K = Fnw·Awe·kds·p·df/dp: R's slope in ln p (ln p = ln σ + ln|δ| - ln dm)
      const K = si * kf * fOfPSlope(p, f) * p;
      // dR/dm = a1·dθ/dm + a2·d|δ|/dm (+ K/σ·dσ/dm, gathered in s)
      const a1 = si * kp * f - K * dlm;
      const a2 = K * inv;
      const a3 = K * isig;
      // bn = d|δ|/dm·... = (n0, n1, b2), h = n⊥ through B; dθ/dm = ±h/|δ| (the sign of c·d)
      const b2 = (xi * n1 - yi * n0) * iL;
      const h0 = -n1;
      const h1 = n0;
      const h2 = (xi * n0 + yi * n1) * iL;
      const sg = sn === 0 || cs === 0 ? 0 : sn > 0 === cs > 0 ? 1 : -1;
      const at = a1 * sg * inv;
      const dr0 = at * h0 + a2 * n0;
      const dr1 = at * h1 + a2 * n1;
      const dr2 = at * h2 + a2 * b2;
      s0 += a3 * n0;
      s1 += a3 * n1;
      s2 += a3 * b2;
      // dF/dm = bn ⊗ dR + (R/ρ)·h ⊗ h
      const qh = Ri * inv;
      const q0 = qh * h0;
      const q1 = qh * h1;
      const q2 = qh * h2;
      j0 += n0 * dr0 + q0 * h0;
      j1 += n0 * dr1 + q0 * h1;
      j2 += n0 * dr2 + q0 * h2;
      j3 += n1 * dr0 + q1 * h0;
      j4 += n1 * dr1 + q1 * h1;
      j5 += n1 * dr2 + q1 * h2;
      j6 += b2 * dr0 + q2 * h0;
      j7 += b2 * dr1 + q2 * h1;
      j8 += b2 * dr2 + q2 * h2;
    }
    const ms = this.momentScale;
    const J = this.J;
    const ds = this.dsig;
    J[0] = j0 + s0 * ds[0]!;
    J[1] = j1 + s0 * ds[1]!;
    J[2] = j2 + s0 * ds[2]!;
    J[3] = j3 + s1 * ds[0]!;
    J[4] = j4 + s1 * ds[1]!;
    J[5] = j5 + s1 * ds[2]!;
    J[6] = (j6 + s2 * ds[0]!) * ms;
    J[7] = (j7 + s2 * ds[1]!) * ms;
    J[8] = (j8 + s2 * ds[2]!) * ms;
  }
}

/** Numerical Jacobian check helper for tests: evaluates G and J at a motion. */
export function evaluateMotion(mesh: Mesh, m: readonly [number, number, number]): { G: number[]; J: number[]; critical: number } {
  const ws = new Workspace(mesh);
  if (!ws.evaluate(m[0], m[1], m[2])) throw new Error('no deforming point');
  ws.jacobian();
  return { G: Array.from(ws.G), J: Array.from(ws.J), critical: ws.crit };
}

function notConverged(detail: string): EngineError {
  return new EngineError('WELD_GROUP_ICR_NOT_CONVERGED', `The instantaneous centre could not be found: ${detail}`);
}

export function solveIcr(mesh: Mesh, load: IcrLoad, options: IcrOptions = {}): IcrSolution {
  return solve(mesh, load, options, null);
}

/** What a start-finding solve hands back beside its answer. */
interface StartSolve {
  /** The last Jacobian it made (at or next to its answer). */
  readonly jacobian: Float64Array;
  /** Its critical node. */
  critical: number;
}

/**
 * The solve. With `start` given it is the start-finding solve on a coarse mesh: it gives up
 * early (a few iterations, no lattice) rather than search hard for a start that only saves time,
 * accepts at its own tolerance, and fills `start`.
 */
function solve(mesh: Mesh, load: IcrLoad, options: IcrOptions, start: StartSolve | null): IcrSolution {
  const full = start === null;
  const maxIt = options.maxIterations ?? ICR_DEFAULTS.maxIterations;
  const budget = options.workBudget ?? ICR_DEFAULTS.workBudget;
  const tol = options.tolerance ?? ICR_DEFAULTS.tolerance;
  const now = options.now;
  const t0 = now ? now() : 0;
  const timeLimit = options.timeLimitMs ?? Number.POSITIVE_INFINITY;
  const ws = new Workspace(mesh);
  const G = ws.G;
  const J = ws.J;
  const lm = Math.max(mesh.lc, Math.abs(load.e));
  ws.momentScale = mesh.lc / lm;

  // q and an orthonormal basis e1, e2 of the plane normal to it (moment row scaled by lm)
  const q0 = load.dx;
  const q1 = load.dy;
  const q2 = load.e / lm;
  const qn = Math.hypot(q0, q1, q2);
  const qh = [q0 / qn, q1 / qn, q2 / qn] as const;
  const e1 = new Float64Array(3);
  const e2 = new Float64Array(3);
  tangentBasis(qh[0], qh[1], qh[2], e1, e2);

  // current state (copies of the workspace's outputs at the accepted motion)
  const m = new Float64Array(3);
  const Gc = new Float64Array(3);
  const Jc = new Float64Array(9);
  const b1 = new Float64Array(3);
  const b2 = new Float64Array(3);
  const trial = new Float64Array(3);
  let iterations = 0;

  const merit = (): number => {
    const gn = Math.hypot(G[0]!, G[1]!, G[2]!);
    if (!(gn > 0)) return Number.POSITIVE_INFINITY;
    const r1 = G[0]! * e1[0]! + G[1]! * e1[1]! + G[2]! * e1[2]!;
    const r2 = G[0]! * e2[0]! + G[1]! * e2[1]! + G[2]! * e2[2]!;
    return Math.hypot(r1, r2) / gn;
  };
  /**
   * The line-search merit: the residual against the total element force. Unlike the angle it
   * falls steadily along Newton steps when the load is far away and G is nearly all moment.
   */
  const residual = (): number => {
    const r1 = G[0]! * e1[0]! + G[1]! * e1[1]! + G[2]! * e1[2]!;
    const r2 = G[0]! * e2[0]! + G[1]! * e2[1]! + G[2]! * e2[2]!;
    return ws.sumR > 0 ? Math.hypot(r1, r2) / ws.sumR : Number.POSITIVE_INFINITY;
  };
  const outOfTime = (): boolean => ws.work > budget || (now !== undefined && now() - t0 > timeLimit);

  /** A Jacobian for the first step of the next descent (from a coarse solve), or null. */
  let borrowed: Float64Array | null = null;

  /** Newton/LM from the motion in m; returns the final merit, leaving the best motion in m. */
  const descend = (): number => {
    if (!ws.evaluate(m[0]!, m[1]!, m[2]!)) return Number.POSITIVE_INFINITY;
    let phi = merit();
    let psi = residual();
    Gc.set(G);
    // the Jacobian at m is made when a step from m is about to be taken (never at a converged m)
    let jacobianAtM = false;
    // the first step from a coarse start takes the coarse solve's Jacobian (near this one's)
    let approximate = false;
    let mu = 0;
    let stalls = 0;
    let local = 0;
    let checkpoint = psi;
    while (phi > tol && iterations < maxIt && !outOfTime()) {
      iterations++;
      // a descent that crawls is on a crease or in a false valley: give the next attempt its turn
      if (++local % DESCENT_WINDOW === 0) {
        if (psi > 0.5 * checkpoint || local >= DESCENT_MAX) return phi;
        checkpoint = psi;
      }
      if (!jacobianAtM) {
        if (borrowed !== null) {
          Jc.set(borrowed);
          approximate = true;
        } else {
          // the last evaluation was at m: the start, or the step just accepted
          ws.jacobian();
          Jc.set(J);
        }
        borrowed = null;
        jacobianAtM = true;
      }
      tangentBasis(m[0]!, m[1]!, m[2]!, b1, b2);
      // A = E^T·J·T (2×2), r = E^T·G
      const jb10 = Jc[0]! * b1[0]! + Jc[1]! * b1[1]! + Jc[2]! * b1[2]!;
      const jb11 = Jc[3]! * b1[0]! + Jc[4]! * b1[1]! + Jc[5]! * b1[2]!;
      const jb12 = Jc[6]! * b1[0]! + Jc[7]! * b1[1]! + Jc[8]! * b1[2]!;
      const jb20 = Jc[0]! * b2[0]! + Jc[1]! * b2[1]! + Jc[2]! * b2[2]!;
      const jb21 = Jc[3]! * b2[0]! + Jc[4]! * b2[1]! + Jc[5]! * b2[2]!;
      const jb22 = Jc[6]! * b2[0]! + Jc[7]! * b2[1]! + Jc[8]! * b2[2]!;
      const A00 = e1[0]! * jb10 + e1[1]! * jb11 + e1[2]! * jb12;
      const A01 = e1[0]! * jb20 + e1[1]! * jb21 + e1[2]! * jb22;
      const A10 = e2[0]! * jb10 + e2[1]! * jb11 + e2[2]! * jb12;
      const A11 = e2[0]! * jb20 + e2[1]! * jb21 + e2[2]! * jb22;
      const r1 = Gc[0]! * e1[0]! + Gc[1]! * e1[1]! + Gc[2]! * e1[2]!;
      const r2 = Gc[0]! * e2[0]! + Gc[1]! * e2[1]! + Gc[2]! * e2[2]!;
      const norm2 = A00 * A00 + A01 * A01 + A10 * A10 + A11 * A11;
      let a1: number;
      let a2: number;
      const det = A00 * A11 - A01 * A10;
      if (mu === 0 && Math.abs(det) > 1e-12 * norm2) {
        a1 = -(A11 * r1 - A01 * r2) / det;
        a2 = -(-A10 * r1 + A00 * r2) / det;
      } else {
        if (mu === 0) mu = 1e-8 * norm2 + 1e-300;
        // (AᵀA + μI)·α = -Aᵀr
        const M00 = A00 * A00 + A10 * A10 + mu;
        const M01 = A00 * A01 + A10 * A11;
        const M11 = A01 * A01 + A11 * A11 + mu;
        const v1 = -(A00 * r1 + A10 * r2);
        const v2 = -(A01 * r1 + A11 * r2);
        const dd = M00 * M11 - M01 * M01;
        a1 = (M11 * v1 - M01 * v2) / dd;
        a2 = (-M01 * v1 + M00 * v2) / dd;
      }
      if (!Number.isFinite(a1) || !Number.isFinite(a2)) return phi;
      const step = Math.hypot(a1, a2);
      const cap = 0.6;
      if (step > cap) {
        a1 *= cap / step;
        a2 *= cap / step;
      }
      // backtracking along the step
      let accepted = false;
      let t = 1;
      for (let k = 0; k < 6 && !accepted; k++, t *= 0.5) {
        trial[0] = m[0]! + t * (a1 * b1[0]! + a2 * b2[0]!);
        trial[1] = m[1]! + t * (a1 * b1[1]! + a2 * b2[1]!);
        trial[2] = m[2]! + t * (a1 * b1[2]! + a2 * b2[2]!);
        const tn = Math.hypot(trial[0]!, trial[1]!, trial[2]!);
        trial[0] = trial[0]! / tn;
        trial[1] = trial[1]! / tn;
        trial[2] = trial[2]! / tn;
        if (!ws.evaluate(trial[0]!, trial[1]!, trial[2]!)) continue;
        const psiT = residual();
        if (psiT < psi) {
          accepted = true;
          m.set(trial);
          Gc.set(G);
          jacobianAtM = false;
          psi = psiT;
          phi = merit();
        }
      }
      if (options.trace) options.trace(iterations, phi, m);
      if (approximate) {
        approximate = false;
        if (!accepted) {
          // the borrowed Jacobian led nowhere: take this one's at m, and step again
          if (!ws.evaluate(m[0]!, m[1]!, m[2]!)) return phi;
          ws.jacobian();
          Jc.set(J);
          continue;
        }
      }
      if (accepted) {
        mu = mu > 1e-6 * norm2 ? mu / 10 : 0;
        stalls = 0;
      } else {
        mu = Math.max(mu * 100, 1e-6 * norm2);
        if (++stalls > 8) return phi;
      }
    }
    return phi;
  };

  let bestPhi = Number.POSITIVE_INFINITY;
  const bestM = new Float64Array(3);
  const stall = new Float64Array(3);
  const done = (): boolean => bestPhi <= tol || iterations >= maxIt || outOfTime();

  /**
   * One attempt from the motion s: a free descent; if it stalls (typically on a crease where the
   * critical point switches), descents with each nearly-critical end point held as the critical
   * one, each accepted only if that point really is critical at its root.
   */
  const attempt = (s0: number, s1: number, s2: number): void => {
    const sn = Math.hypot(s0, s1, s2);
    if (!(sn > 0)) return;
    m[0] = s0 / sn;
    m[1] = s1 / sn;
    m[2] = s2 / sn;
    ws.forced = -1;
    const phi = descend();
    if (phi < bestPhi) {
      bestPhi = phi;
      bestM.set(m);
    }
    if (done() || !(phi < Number.POSITIVE_INFINITY)) return;
    stall.set(m);
    const candidates = nearlyCritical(ws, stall, 4);
    for (const k of candidates) {
      if (done()) return;
      m.set(stall);
      ws.forced = k;
      descend();
      ws.forced = -1;
      // valid only where node k is (within rounding) the true critical point
      if (!ws.evaluate(m[0]!, m[1]!, m[2]!)) continue;
      const holds = ws.crit === k || ratioOf(ws, k, m) <= ws.minRatio * (1 + 1e-12);
      const phiTrue = merit();
      if (holds && phiTrue < bestPhi) {
        bestPhi = phiTrue;
        bestM.set(m);
      }
    }
  };

  // ---- starts: the given motion, the elastic motion, then a lattice over the half-sphere ----
  // the elastic motion: translation d/A and rotation e/Ip per unit load, i.e. (dx, dy, e/lc) in motion units
  const qe = load.e / mesh.lc;
  if (options.start) attempt(options.start[0], options.start[1], options.start[2]);
  else if (full) {
    // the answer on a coarser mesh of the same welds is near this one's: a start a few Newton
    // steps closer than the elastic motion, with a Jacobian for the first step and a first guess
    // at the critical node, for a small share of the work
    const coarse = coarsen(mesh, COARSE_FACTOR);
    if (coarse.n * COARSE_SHARE <= mesh.n) {
      const found = coarseMotion(coarse, load, maxIt, budget, options);
      if (found) {
        iterations += found.iterations;
        ws.work += found.work;
        ws.minNode = fineNode(coarse, mesh, found.critical);
        borrowed = found.jacobian.some((x) => x !== 0) ? found.jacobian : null;
        if (!done()) attempt(found.motion[0], found.motion[1], found.motion[2]);
        borrowed = null;
      }
    }
  }
  if (!done()) attempt(load.dx, load.dy, qe);
  if (full && !done()) {
    // global fallback: the merit on a lattice of motions (no Jacobian), best local starts first
    const count = LATTICE;
    const scored: Array<{ k: number; phi: number }> = [];
    for (let k = 0; k < count && !outOfTime(); k++) {
      latticePoint(k, count, trial);
      scored.push({ k, phi: ws.evaluate(trial[0]!, trial[1]!, trial[2]!) ? merit() : Number.POSITIVE_INFINITY });
    }
    scored.sort((a, b) => a.phi - b.phi);
    for (let i = 0; i < Math.min(LATTICE_STARTS, scored.length) && !done(); i++) {
      latticePoint(scored[i]!.k, count, trial);
      attempt(trial[0]!, trial[1]!, trial[2]!);
    }
  }
  if (!(bestPhi <= (full ? ICR_DEFAULTS.acceptTolerance : tol))) {
    const why = iterations >= maxIt ? `no balance within ${maxIt} iterations` : outOfTime() ? 'the work or time bound was reached' : 'every start stalled';
    ws.release();
    throw notConverged(`${why} (best angle between the element resultant and the load ${bestPhi.toExponential(2)} rad).`);
  }

  // ---- the answer at the best motion, oriented so that P > 0 ----
  ws.forced = -1;
  m.set(bestM);
  if (!(ws.atForced === -1 && ws.at[0] === m[0] && ws.at[1] === m[1] && ws.at[2] === m[2])) ws.evaluate(m[0]!, m[1]!, m[2]!);
  if (G[0]! * q0 + G[1]! * q1 + G[2]! * q2 < 0) {
    // G is odd in the motion: reversing it reverses every force and keeps the critical point
    m[0] = -m[0]!;
    m[1] = -m[1]!;
    m[2] = -m[2]!;
    G[0] = -G[0]!;
    G[1] = -G[1]!;
    G[2] = -G[2]!;
  }
  const P = (G[0]! * q0 + G[1]! * q1 + G[2]! * q2) / (qn * qn);
  const lc = mesh.lc;
  const rfx = G[0]! - P * q0;
  const rfy = G[1]! - P * q1;
  const rm = (G[2]! - P * q2) * lm;
  // forces against the load, moment against the load times max(lc, |e|)
  const relative = Math.hypot(rfx, rfy, rm / lm) / Math.abs(P);

  const u = m[0]!;
  const v = m[1]!;
  const w3 = m[2]!;
  const om = w3 / lc;
  const trans = Math.hypot(u, v);
  const isTranslation = om === 0 || trans / Math.abs(om) > 1e14 * lc;
  const centre: [number, number] | null = isTranslation ? null : [mesh.cx - v / om, mesh.cy + u / om];
  const centreDistance = isTranslation ? null : trans / Math.abs(om);

  const forces = full ? ws.forces(u, v, om) : NO_FORCES;
  ws.release();
  if (start !== null) {
    start.jacobian.set(Jc);
    start.critical = ws.crit;
  }

  const k = ws.crit;
  const kx = mesh.nx[k]!;
  const ky = mesh.ny[k]!;
  const cdx = u - om * ky;
  const cdy = v + om * kx;
  const crho = Math.hypot(cdx, cdy);
  const ct = Math.abs(mesh.ntx[k]! * cdy - mesh.nty[k]! * cdx);
  const cd = Math.abs(mesh.ntx[k]! * cdx + mesh.nty[k]! * cdy);
  const cth = Math.atan2(ct, cd) * DEG;
  const segment = mesh.nseg[k]!;
  // node k is the i-th end point of its segment: nodes of segment j start at segStart[j] + j
  const local = k - (mesh.segStart[segment]! + segment);
  const count = mesh.segStart[segment + 1]! - mesh.segStart[segment]!;
  const element = mesh.segStart[segment]! + Math.min(local, count - 1);

  return {
    capacity: P,
    motion: [u, v, w3],
    centre,
    centreDistance,
    critical: {
      node: k,
      segment,
      element,
      point: [kx + mesh.cx, ky + mesh.cy],
      radius: isTranslation ? null : crho / Math.abs(om),
      deformation: deltaU(cth, mesh.nw[k]!),
      angle: cth,
    },
    residual: { fx: rfx, fy: rfy, moment: rm, relative },
    iterations,
    evaluations: ws.evaluations,
    forces,
  };
}

/** The coarse solve's (unused) forces. */
const NO_FORCES = new Float64Array(0);
/** Elements of a fine mesh merged into one for the coarse start (about). */
const COARSE_FACTOR = 25;
/** A coarse start is sought only when the coarse mesh has at most 1/COARSE_SHARE of the elements. */
const COARSE_SHARE = 4;
/** Bounds of the coarse solve: iterations, and its convergence tolerance (far below the coarse mesh's own error). */
const COARSE_ITERATIONS = 40;
const COARSE_TOLERANCE = 1e-5;

/**
 * The motion at capacity on a coarse mesh, its last Jacobian and critical node, and the
 * iterations and work spent; null when not found within its bounds.
 */
function coarseMotion(
  coarse: Mesh,
  load: IcrLoad,
  maxIt: number,
  budget: number,
  options: IcrOptions,
): { motion: [number, number, number]; jacobian: Float64Array; critical: number; iterations: number; work: number } | null {
  const out: StartSolve = { jacobian: new Float64Array(9), critical: -1 };
  try {
    const s = solve(
      coarse,
      load,
      {
        maxIterations: Math.min(maxIt, COARSE_ITERATIONS),
        workBudget: budget,
        tolerance: COARSE_TOLERANCE,
        ...(options.now ? { now: options.now } : {}),
        ...(options.timeLimitMs !== undefined ? { timeLimitMs: options.timeLimitMs } : {}),
      },
      out,
    );
    return { motion: s.motion, jacobian: out.jacobian, critical: out.critical, iterations: s.iterations, work: s.evaluations * (coarse.n + coarse.nodes) };
  } catch {
    return null;
  }
}

/** The node of the fine mesh at node k of a mesh made from it by coarsen(). */
function fineNode(coarse: Mesh, fine: Mesh, k: number): number {
  const j = coarse.nseg[k]!;
  const g = k - (coarse.segStart[j]! + j);
  const mc = coarse.segStart[j + 1]! - coarse.segStart[j]!;
  const m = fine.segStart[j + 1]! - fine.segStart[j]!;
  return fine.segStart[j]! + j + Math.round((g * m) / mc);
}

/** Two unit vectors completing (a0, a1, a2) (a unit vector) to an orthonormal basis. */
function tangentBasis(a0: number, a1: number, a2: number, out1: Float64Array, out2: Float64Array): void {
  // the coordinate axis least aligned with a
  const x = Math.abs(a0);
  const y = Math.abs(a1);
  const z = Math.abs(a2);
  let p0 = 0;
  let p1 = 0;
  let p2 = 0;
  if (x <= y && x <= z) p0 = 1;
  else if (y <= z) p1 = 1;
  else p2 = 1;
  const dot = p0 * a0 + p1 * a1 + p2 * a2;
  let v0 = p0 - dot * a0;
  let v1 = p1 - dot * a1;
  let v2 = p2 - dot * a2;
  const vn = Math.hypot(v0, v1, v2);
  v0 /= vn;
  v1 /= vn;
  v2 /= vn;
  out1[0] = v0;
  out1[1] = v1;
  out1[2] = v2;
  out2[0] = a1 * v2 - a2 * v1;
  out2[1] = a2 * v0 - a0 * v2;
  out2[2] = a0 * v1 - a1 * v0;
}

/** A descent must halve its merit every this many iterations, and stops after DESCENT_MAX. */
const DESCENT_WINDOW = 8;
const DESCENT_MAX = 48;
/** Points of the lattice over the half-sphere of motions. */
const LATTICE = 600;
/** How many of the best lattice points are tried as starts. */
const LATTICE_STARTS = 10;

/** The k-th of `count` nearly even points on the half-sphere w3 >= 0 (a Fibonacci lattice). */
function latticePoint(k: number, count: number, out: Float64Array): void {
  const z = (k + 0.5) / count;
  const r = Math.sqrt(1 - z * z);
  const a = k * 2.399963229728653; // the golden angle
  out[0] = r * Math.cos(a);
  out[1] = r * Math.sin(a);
  out[2] = z;
}

/**
 * du/|δ| of node k for the motion (u, v, ω): its deformation capacity over its deformation per
 * unit motion; infinite for a node on the centre.
 */
function nodeRatio(M: Mesh, k: number, u: number, v: number, om: number): number {
  const ddx = u - om * M.ny[k]!;
  const ddy = v + om * M.nx[k]!;
  const rho = Math.sqrt(ddx * ddx + ddy * ddy);
  if (rho <= RHO_MIN) return Number.POSITIVE_INFINITY;
  const c = M.ntx[k]! * ddy - M.nty[k]! * ddx;
  const d = M.ntx[k]! * ddx + M.nty[k]! * ddy;
  return deltaU(Math.atan2(Math.abs(c), Math.abs(d)) * DEG, M.nw[k]!) / rho;
}

/** du/|δ| of node k at motion m. */
function ratioOf(ws: Workspace, k: number, m: Float64Array): number {
  return nodeRatio(ws.mesh, k, m[0]!, m[1]!, m[2]! / ws.mesh.lc);
}

/** Up to `most` nodes whose du/|δ| at m is within 10 % of the smallest, smallest first. */
function nearlyCritical(ws: Workspace, m: Float64Array, most: number): number[] {
  const M = ws.mesh;
  const ratios: Array<{ k: number; r: number }> = [];
  for (let k = 0; k < M.nodes; k++) ratios.push({ k, r: ratioOf(ws, k, m) });
  ratios.sort((a, b) => a.r - b.r);
  const min = ratios[0]?.r ?? Number.POSITIVE_INFINITY;
  const out: number[] = [];
  for (const x of ratios) {
    if (out.length >= most || !(x.r <= min * 1.1)) break;
    out.push(x.k);
  }
  return out;
}
