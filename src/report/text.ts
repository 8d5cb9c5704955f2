/**
 * Small text helpers shared by the calculation sheets: HTML escaping, number display and unit
 * names. Display rounding only: the JSON answer keeps full precision.
 */

export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/**
 * A number for a sheet: four significant figures (enough to check by hand and to tell the
 * governing case from the next one), no exponent for ordinary magnitudes, and a minus sign
 * rather than a hyphen.
 */
export function fmt(x: number, sig = 4): string {
  if (!Number.isFinite(x)) return x > 0 ? '∞' : x < 0 ? '−∞' : '—';
  if (x === 0) return '0';
  const a = Math.abs(x);
  let s: string;
  if (a >= 10 ** sig) s = Math.round(x).toString();
  else if (a < 1e-3) s = x.toExponential(sig - 1);
  else s = x.toPrecision(sig);
  return s.replace(/^-/, '−');
}

/** A ratio: three decimals, as demand/capacity ratios are usually quoted. */
export function fmtRatio(x: number): string {
  if (!Number.isFinite(x)) return '∞';
  return x.toFixed(3);
}

/** A resistance or safety factor as published (0.75, 2.00, 1.67). */
export function fmtFactor(x: number): string {
  return x.toFixed(2);
}

export interface UnitNames {
  length: string;
  force: string;
  stress: string;
}

/** The unit of a quantity, by dimension, for display in plain text. */
export function unitText(u: UnitNames, dim: Dimension): string {
  switch (dim) {
    case 'length':
      return u.length;
    case 'area':
      return `${u.length}²`;
    case 'force':
      return u.force;
    case 'stress':
      return u.stress;
    case 'angle':
      return '°';
    case 'perLength':
      return `${u.force}/${u.length}`;
    case 'none':
      return '';
  }
}

export type Dimension = 'length' | 'area' | 'force' | 'stress' | 'angle' | 'perLength' | 'none';
