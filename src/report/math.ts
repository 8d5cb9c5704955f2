/**
 * Equations for the sheets: TeX written by the report layer, typeset on the server to MathML
 * by temml, so the sheet needs no script and no font from anywhere else. Browsers with MathML
 * Core (Chromium, Firefox, Safari) lay it out natively; the sheet's CSS names the usual math
 * fonts.
 */
import temml from 'temml';
import { fmt, type Dimension, type UnitNames } from './text.js';

/** Rendered equations, by TeX source: a sheet repeats many of them. Bounded, cleared when full. */
const cache = new Map<string, string>();
const CACHE_MAX = 2000;

/** MathML for a TeX expression (inline, or display when `display`). */
export function mathml(texSource: string, display = false): string {
  const key = `${display ? 'D' : 'I'}${texSource}`;
  const hit = cache.get(key);
  if (hit !== undefined) return hit;
  // throwOnError false: a symbol temml does not know is shown in colour rather than failing the sheet.
  const out = temml.renderToString(texSource, { displayMode: display, throwOnError: false, xml: false });
  if (cache.size >= CACHE_MAX) cache.clear();
  cache.set(key, out);
  return out;
}

/** TeX for a unit by dimension. */
export function texUnit(u: UnitNames, dim: Dimension): string {
  switch (dim) {
    case 'length':
      return `\\mathrm{${u.length}}`;
    case 'area':
      return `\\mathrm{${u.length}}^{2}`;
    case 'force':
      return `\\mathrm{${u.force}}`;
    case 'stress':
      return `\\mathrm{${u.stress}}`;
    case 'angle':
      return '^{\\circ}';
    case 'perLength':
      return `\\mathrm{${u.force}/${u.length}}`;
    case 'none':
      return '';
  }
}

/** TeX for a number: the sheet's four significant figures, exponents typeset. */
export function texNum(x: number, sig = 4): string {
  const s = fmt(x, sig);
  const m = /^(−?)(\d(?:\.\d+)?)e([+-])(\d+)$/.exec(s);
  if (m) return `${m[1] === '−' ? '-' : ''}${m[2]}\\times 10^{${m[3] === '-' ? '-' : ''}${m[4]}}`;
  return s.replace('−', '-').replace('∞', '\\infty');
}

/** TeX for a quantity with its unit: 139.2 kip. */
export function texQ(x: number, u: UnitNames, dim: Dimension, sig = 4): string {
  const unit = texUnit(u, dim);
  if (!unit) return texNum(x, sig);
  return dim === 'angle' ? `${texNum(x, sig)}${unit}` : `${texNum(x, sig)}\\,${unit}`;
}
