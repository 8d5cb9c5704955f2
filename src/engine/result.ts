/**
 * The shape every engine check returns, and the steps shared by all weld families: available
 * strength from nominal, ratio, governing limit state, status.
 */
import { CODES, type CheckCode, type LimitCode, type WarningCode } from './codes.js';
import { EngineError } from './errors.js';
import { availableStrength, type Factors, type Method } from './provisions/resistance.js';

/** Ratios up to 1 + RATIO_TOLERANCE pass, so that float noise in an exact match cannot fail it. */
export const RATIO_TOLERANCE = 1e-9;

export interface Check {
  code: CheckCode;
  title: string;
  clause: string;
  equation: string;
  /** Which connected part (index into parts[]) a base-metal check is for. */
  part?: number;
  nominal: number;
  phi?: number;
  omega?: number;
  available: number;
  demand: number;
  ratio: number;
  pass: boolean;
  /**
   * false when the Specification says this limit state need not be checked for the load
   * (Table J2.5); nominal, available and ratio are then 0 and `note` says why.
   */
  applicable?: boolean;
  note?: string;
}

export interface Limit {
  code: LimitCode;
  title: string;
  clause: string;
  /** Which weld line (index into welds[]) or part the limit is about, when it is about one. */
  weld?: number;
  part?: number;
  required: number;
  provided: number;
  /** "min": provided must be at least required; "max": at most. */
  sense: 'min' | 'max';
  pass: boolean;
  note?: string;
}

export interface Warning {
  code: WarningCode;
  message: string;
}

export interface Governing {
  code: CheckCode;
  part?: number;
  available: number;
  demand: number;
  ratio: number;
}

export interface EngineResult<V> {
  status: 'pass' | 'fail';
  utilization: number;
  governing: Governing;
  checks: Check[];
  limits: Limit[];
  warnings: Warning[];
  values: V;
}

export function ratioOf(demand: number, available: number): number {
  if (demand <= 0) return 0;
  if (available <= 0) return Number.POSITIVE_INFINITY;
  return demand / available;
}

/** One strength check from its nominal strength. */
export function strengthCheck(
  code: CheckCode,
  equation: string,
  method: Method,
  nominal: number,
  factors: Factors,
  demand: number,
  part?: number,
): Check {
  const available = availableStrength(method, nominal, factors);
  const ratio = ratioOf(demand, available);
  const info = CODES[code];
  const pass = ratio <= 1 + RATIO_TOLERANCE;
  // One object literal per shape (with or without a part; phi or omega) rather than properties
  // added afterwards: every check of a shape shares one hidden class, which keeps the code that
  // reads checks (governing, serialization) monomorphic. Key order is the same in all four.
  if (method === 'LRFD') {
    return part === undefined
      ? { code, title: info.title, clause: info.clause, equation, nominal, available, demand, ratio, pass, phi: factors.phi }
      : { code, title: info.title, clause: info.clause, equation, nominal, available, demand, ratio, pass, part, phi: factors.phi };
  }
  return part === undefined
    ? { code, title: info.title, clause: info.clause, equation, nominal, available, demand, ratio, pass, omega: factors.omega }
    : { code, title: info.title, clause: info.clause, equation, nominal, available, demand, ratio, pass, part, omega: factors.omega };
}

export function limit(
  code: LimitCode,
  sense: 'min' | 'max',
  required: number,
  provided: number,
  where: { weld?: number; part?: number } = {},
  override?: { pass: boolean; note: string },
): Limit {
  const info = CODES[code];
  const ok = sense === 'min' ? provided >= required - 1e-12 : provided <= required + 1e-12;
  const l: Limit = { code, title: info.title, clause: info.clause, required, provided, sense, pass: override ? override.pass : ok };
  if (where.weld !== undefined) l.weld = where.weld;
  if (where.part !== undefined) l.part = where.part;
  if (override) l.note = override.note;
  return l;
}

/**
 * Picks the governing check: the highest ratio, or with no demand the lowest available
 * strength; ties keep the first in check order (weld metal before base metal).
 */
export function summarise<V>(checks: Check[], limits: Limit[], warnings: Warning[], values: V): EngineResult<V> {
  // Limit states the Specification exempts for the load case take no part in governing (unless
  // every check is exempt). Plain loops: this runs once per answer and per batch item.
  let anyApplicable = false;
  for (let i = 0; i < checks.length; i++) if (checks[i]!.applicable !== false) anyApplicable = true;
  const inPool = (c: Check): boolean => !anyApplicable || c.applicable !== false;
  let gov: Check | undefined;
  let anyDemand = false;
  for (let i = 0; i < checks.length; i++) {
    const c = checks[i]!;
    if (!inPool(c)) continue;
    gov ??= c;
    if (c.demand > 0) anyDemand = true;
  }
  if (!gov) throw new Error('summarise: no checks');
  for (let i = 0; i < checks.length; i++) {
    const c = checks[i]!;
    if (!inPool(c)) continue;
    if (anyDemand ? c.ratio > gov.ratio : c.available < gov.available) gov = c;
  }
  const governing: Governing = { code: gov.code, available: gov.available, demand: gov.demand, ratio: gov.ratio };
  if (gov.part !== undefined) governing.part = gov.part;
  for (const c of checks) {
    if (!Number.isFinite(c.ratio) || !Number.isFinite(c.available)) {
      throw new EngineError('GEOMETRY_MEANINGLESS', `${c.code} has no strength for these dimensions (available ${c.available}); check the sizes, lengths and thicknesses given.`);
    }
  }
  let pass = true;
  for (let i = 0; i < checks.length; i++) if (!checks[i]!.pass) pass = false;
  for (let i = 0; i < limits.length; i++) if (!limits[i]!.pass) pass = false;
  return { status: pass ? 'pass' : 'fail', utilization: gov.ratio, governing, checks, limits, warnings, values };
}

export function warn(code: WarningCode, message: string): Warning {
  return { code, message };
}
