/**
 * The figure of an eccentric weld group answer: a plain engineering drawing in SVG, to scale.
 * Thin dark lines, the welds as thick lines, the load as an arrow on its dash-dot line of
 * action, the centroid and the instantaneous centre marked and labelled, the element forces at
 * capacity as thin vectors, overall dimensions, the eccentricity and a scale bar, and a short
 * caption with the result. Our own layout: monochrome, one accent for the load.
 */
import type { WeldGroupFigure, WeldGroupValues } from '../engine/weld-group/check.js';

export interface WeldGroupSheet {
  id?: string;
  status: 'pass' | 'fail';
  utilization: number;
  units: { length: string; force: string };
  basis: { method: 'LRFD' | 'ASD' };
  values: WeldGroupValues;
}

const W = 820;
const H = 660;
const BOX = { left: 90, right: W - 60, top: 96, bottom: H - 150 };
const INK = '#1d1d1f';
const GREY = '#6e6e73';
const LIGHT = '#b8b8bd';
const ACCENT = '#a3321f';
const FONT = 'Helvetica, Arial, sans-serif';
/** Segments are numbered on the drawing up to this many. */
const MAX_SEGMENT_LABELS = 12;
/** At most this many element vectors are drawn (evenly picked). */
const MAX_VECTORS = 140;

type P = [number, number];

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** A number for a label: 3 significant figures, no exponent for ordinary sizes. */
function num(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return String(x);
  if (Math.abs(x) < 1e-9) return '0'; // rounding noise of a coordinate on an axis
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) return x.toExponential(2);
  return Number(x.toPrecision(digits)).toString();
}

const f1 = (x: number): string => (Math.round(x * 10) / 10).toFixed(1);

/** A round length near `target`: 1, 2 or 5 × 10^k. */
function niceLength(target: number): number {
  const k = Math.pow(10, Math.floor(Math.log10(target)));
  const m = target / k;
  return (m >= 5 ? 5 : m >= 2 ? 2 : 1) * k;
}

export function renderWeldGroupSvg(answer: WeldGroupSheet, figure: WeldGroupFigure): string {
  const v = answer.values;
  const lu = answer.units.length;
  const fu = answer.units.force;
  const [cx, cy] = v.centroid;
  const [dx, dy] = v.direction;
  const inPlane = Math.hypot(dx, dy);
  const ux = inPlane > 1e-12 ? dx / inPlane : 0;
  const uy = inPlane > 1e-12 ? dy / inPlane : 0;

  // ---- world extent ----
  let xmin = Number.POSITIVE_INFINITY;
  let xmax = Number.NEGATIVE_INFINITY;
  let ymin = Number.POSITIVE_INFINITY;
  let ymax = Number.NEGATIVE_INFINITY;
  for (const s of figure.segments) {
    for (const p of [s.from, s.to]) {
      xmin = Math.min(xmin, p[0]);
      xmax = Math.max(xmax, p[0]);
      ymin = Math.min(ymin, p[1]);
      ymax = Math.max(ymax, p[1]);
    }
  }
  const weld = { xmin, xmax, ymin, ymax };
  const E = Math.max(xmax - xmin, ymax - ymin, 1e-9);
  const reach = 6 * E;
  const near = (p: P): boolean => Math.hypot(p[0] - cx, p[1] - cy) <= reach;
  const include = (p: P): void => {
    xmin = Math.min(xmin, p[0]);
    xmax = Math.max(xmax, p[0]);
    ymin = Math.min(ymin, p[1]);
    ymax = Math.max(ymax, p[1]);
  };
  include([cx, cy]);

  // where the load arrow's tip goes: the point given, or the foot of the perpendicular from the centroid
  let tip: P | null = null;
  let loadNote = '';
  if (inPlane > 1e-12) {
    const lp = v.loadPoint as P;
    if (near(lp)) tip = lp;
    else if (Math.abs(v.eccentricity) <= reach) {
      const t = (cx - lp[0]) * ux + (cy - lp[1]) * uy;
      tip = [lp[0] + t * ux, lp[1] + t * uy];
    } else loadNote = `load line ${num(Math.abs(v.eccentricity))} ${lu} from the centroid, off the figure`;
  } else if (near(v.loadPoint as P)) tip = v.loadPoint as P;
  const arrowLen = 0.35 * E;
  if (tip) {
    include(tip);
    if (inPlane > 1e-12) include([tip[0] - ux * arrowLen, tip[1] - uy * arrowLen]);
  }
  const centre = v.centre as P | null;
  const centreShown = centre !== null && near(centre);
  if (centre && centreShown) include(centre);

  // pad for the force vectors and labels
  const pad = 0.12 * Math.max(xmax - xmin, ymax - ymin, E);
  xmin -= pad;
  xmax += pad;
  ymin -= pad;
  ymax += pad;
  const sx = (BOX.right - BOX.left) / (xmax - xmin);
  const sy = (BOX.bottom - BOX.top) / (ymax - ymin);
  const s = Math.min(sx, sy);
  const ox = BOX.left + ((BOX.right - BOX.left) - s * (xmax - xmin)) / 2;
  const oy = BOX.top + ((BOX.bottom - BOX.top) - s * (ymax - ymin)) / 2;
  const X = (x: number): number => ox + (x - xmin) * s;
  const Y = (y: number): number => oy + (ymax - y) * s;

  const out: string[] = [];
  const line = (a: P, b: P, stroke: string, width: number, extra = ''): void => {
    out.push(`<line x1="${f1(X(a[0]))}" y1="${f1(Y(a[1]))}" x2="${f1(X(b[0]))}" y2="${f1(Y(b[1]))}" stroke="${stroke}" stroke-width="${width}"${extra}/>`);
  };
  const text = (x: number, y: number, t: string, attrs = ''): void => {
    out.push(`<text x="${f1(x)}" y="${f1(y)}"${attrs}>${esc(t)}</text>`);
  };

  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="${FONT}" font-size="12" fill="${INK}">`);
  out.push(`<title>${esc(`Weld group${answer.id ? ` ${answer.id}` : ''}: ${v.method}, capacity ${num(v.capacityNominal)} ${fu} nominal`)}</title>`);
  out.push('<defs>');
  out.push(`<marker id="wg-head" viewBox="0 0 10 10" refX="10" refY="5" markerWidth="9" markerHeight="9" orient="auto-start-reverse"><path d="M0,1.5 L10,5 L0,8.5 z" fill="${ACCENT}"/></marker>`);
  out.push(`<marker id="wg-vec" viewBox="0 0 10 10" refX="10" refY="5" markerWidth="5" markerHeight="5" orient="auto"><path d="M0,2 L10,5 L0,8 z" fill="${GREY}"/></marker>`);
  out.push(`<marker id="wg-dim" viewBox="0 0 10 10" refX="5" refY="5" markerWidth="8" markerHeight="8" orient="auto"><path d="M2,8 L8,2" stroke="${INK}" stroke-width="1.4"/></marker>`);
  out.push(`<clipPath id="wg-frame"><rect x="9" y="${BOX.top - 12}" width="${W - 18}" height="${BOX.bottom - BOX.top + 40}"/></clipPath>`);
  out.push('</defs>');
  out.push(`<rect x="0" y="0" width="${W}" height="${H}" fill="#ffffff"/>`);
  out.push(`<rect x="8" y="8" width="${W - 16}" height="${H - 16}" fill="none" stroke="${LIGHT}" stroke-width="1"/>`);

  // ---- header ----
  const methodName: Record<WeldGroupValues['method'], string> = {
    icr: 'instantaneous centre method',
    'concentric-rule': 'concentric rule of AISC 360-22 §J2.4',
    elastic: 'elastic method',
    'elastic-out-of-plane': 'elastic method with bending (load out of plane)',
  };
  text(24, 34, `Eccentric weld group${answer.id ? ` ${answer.id}` : ''}`, ' font-size="17" font-weight="bold"');
  text(24, 56, `${num(v.size)} ${lu} fillet, FEXX ${num(v.fexx)}, ${figure.segments.length} segment${figure.segments.length === 1 ? '' : 's'}, ${num(v.totalLength)} ${lu} of weld; ${answer.basis.method}, ${methodName[v.method]}`);
  const factor = answer.basis.method === 'LRFD' ? 'φPn' : 'Pn/Ω';
  text(24, 76, `Pn = ${num(v.capacityNominal)} ${fu}, ${factor} = ${num(v.capacityAvailable)} ${fu} for P = ${num(v.demand)} ${fu}: utilization ${num(answer.utilization)}, ${answer.status}`);

  // ---- element force vectors (at capacity), behind the welds ----
  if (figure.elements.length) {
    // elements are of about one length (spread over the segments by length), so forces compare directly
    const mag = figure.elements.map((e) => Math.hypot(e.fx, e.fy));
    const maxF = Math.max(...mag, 1e-300);
    const k = (0.14 * E) / maxF;
    const stride = Math.max(1, Math.ceil(figure.elements.length / MAX_VECTORS));
    out.push(`<g stroke="${GREY}" stroke-width="0.9">`);
    for (let i = Math.floor(stride / 2); i < figure.elements.length; i += stride) {
      const e = figure.elements[i]!;
      if (!(mag[i]! > 0)) continue;
      line([e.x, e.y], [e.x + e.fx * k, e.y + e.fy * k], GREY, 0.9, ' marker-end="url(#wg-vec)"');
    }
    out.push('</g>');
  }

  // ---- welds ----
  out.push(`<g stroke="${INK}" stroke-width="5" stroke-linecap="square">`);
  figure.segments.forEach((sg) => line(sg.from as P, sg.to as P, INK, 5));
  out.push('</g>');
  // segment numbers, where they can be read
  if (figure.segments.length <= MAX_SEGMENT_LABELS) figure.segments.forEach((sg, i) => {
    const mx = (sg.from[0] + sg.to[0]) / 2;
    const my = (sg.from[1] + sg.to[1]) / 2;
    const l = Math.hypot(sg.to[0] - sg.from[0], sg.to[1] - sg.from[1]);
    const nx = -(sg.to[1] - sg.from[1]) / l;
    const ny = (sg.to[0] - sg.from[0]) / l;
    text(X(mx) + nx * 14 - 6, Y(my) - ny * 14 + 4, `s${i}`, ` fill="${GREY}" font-size="10"`);
  });

  // ---- overall dimensions of the welds ----
  const dimGap = 26;
  if (weld.xmax - weld.xmin > 1e-9 * E) {
    const yb = Y(weld.ymin) + dimGap;
    out.push(`<line x1="${f1(X(weld.xmin))}" y1="${f1(Y(weld.ymin) + 4)}" x2="${f1(X(weld.xmin))}" y2="${f1(yb + 6)}" stroke="${INK}" stroke-width="0.6"/>`);
    out.push(`<line x1="${f1(X(weld.xmax))}" y1="${f1(Y(weld.ymin) + 4)}" x2="${f1(X(weld.xmax))}" y2="${f1(yb + 6)}" stroke="${INK}" stroke-width="0.6"/>`);
    out.push(`<line x1="${f1(X(weld.xmin))}" y1="${f1(yb)}" x2="${f1(X(weld.xmax))}" y2="${f1(yb)}" stroke="${INK}" stroke-width="0.6" marker-start="url(#wg-dim)" marker-end="url(#wg-dim)"/>`);
    text((X(weld.xmin) + X(weld.xmax)) / 2, yb + 15, `${num(weld.xmax - weld.xmin)} ${lu}`, ' text-anchor="middle"');
  }
  if (weld.ymax - weld.ymin > 1e-9 * E) {
    const xl = X(weld.xmin) - dimGap;
    out.push(`<line x1="${f1(X(weld.xmin) - 4)}" y1="${f1(Y(weld.ymin))}" x2="${f1(xl - 6)}" y2="${f1(Y(weld.ymin))}" stroke="${INK}" stroke-width="0.6"/>`);
    out.push(`<line x1="${f1(X(weld.xmin) - 4)}" y1="${f1(Y(weld.ymax))}" x2="${f1(xl - 6)}" y2="${f1(Y(weld.ymax))}" stroke="${INK}" stroke-width="0.6"/>`);
    out.push(`<line x1="${f1(xl)}" y1="${f1(Y(weld.ymin))}" x2="${f1(xl)}" y2="${f1(Y(weld.ymax))}" stroke="${INK}" stroke-width="0.6" marker-start="url(#wg-dim)" marker-end="url(#wg-dim)"/>`);
    const ym = (Y(weld.ymin) + Y(weld.ymax)) / 2;
    out.push(`<text x="${f1(xl - 8)}" y="${f1(ym)}" text-anchor="middle" transform="rotate(-90 ${f1(xl - 8)} ${f1(ym)})">${esc(`${num(weld.ymax - weld.ymin)} ${lu}`)}</text>`);
  }

  // ---- load: line of action, arrow, eccentricity ----
  if (tip && inPlane > 1e-12) {
    const far = 2 * Math.hypot(xmax - xmin, ymax - ymin);
    line([tip[0] - ux * far, tip[1] - uy * far], [tip[0] + ux * far, tip[1] + uy * far], ACCENT, 0.7, ' stroke-dasharray="12 3 2 3" opacity="0.7" clip-path="url(#wg-frame)"');
    const tail: P = [tip[0] - ux * arrowLen, tip[1] - uy * arrowLen];
    line(tail, tip, ACCENT, 2.4, ' marker-end="url(#wg-head)"');
    text(X(tail[0]) + 8, Y(tail[1]) - 6, `P = ${num(v.demand)} ${fu}`, ` fill="${ACCENT}" font-weight="bold"`);
    if (Math.abs(v.eccentricity) > 1e-9 * E) {
      // perpendicular from the centroid to the load line
      const foot: P = [cx + v.eccentricity * uy, cy - v.eccentricity * ux];
      line([cx, cy], foot, INK, 0.7, ' stroke-dasharray="4 3"');
      text((X(cx) + X(foot[0])) / 2 + 6, (Y(cy) + Y(foot[1])) / 2 - 6, `e = ${num(Math.abs(v.eccentricity))} ${lu}`);
    }
  }
  if (tip && Math.abs(v.direction[2]) > 1e-12) {
    // a force normal to the sheet: a circle with a dot (towards the viewer) or a cross (away)
    const tx = X(tip[0]);
    const ty = Y(tip[1]);
    out.push(`<circle cx="${f1(tx)}" cy="${f1(ty)}" r="8" fill="none" stroke="${ACCENT}" stroke-width="1.6"/>`);
    if (v.direction[2] > 0) out.push(`<circle cx="${f1(tx)}" cy="${f1(ty)}" r="2.2" fill="${ACCENT}"/>`);
    else out.push(`<path d="M${f1(tx - 5)},${f1(ty - 5)} L${f1(tx + 5)},${f1(ty + 5)} M${f1(tx - 5)},${f1(ty + 5)} L${f1(tx + 5)},${f1(ty - 5)}" stroke="${ACCENT}" stroke-width="1.6"/>`);
    text(tx + 12, ty + 16, `Pz = ${num(v.direction[2] * v.demand)} ${fu}`, ` fill="${ACCENT}"`);
  }

  // ---- centroid ----
  {
    const px = X(cx);
    const py = Y(cy);
    const r = 6;
    out.push(`<circle cx="${f1(px)}" cy="${f1(py)}" r="${r}" fill="#ffffff" stroke="${INK}" stroke-width="1.2"/>`);
    out.push(`<path d="M${f1(px)},${f1(py)} L${f1(px + r)},${f1(py)} A${r},${r} 0 0 0 ${f1(px)},${f1(py - r)} z M${f1(px)},${f1(py)} L${f1(px - r)},${f1(py)} A${r},${r} 0 0 0 ${f1(px)},${f1(py + r)} z" fill="${INK}"/>`);
    text(px + 10, py + 16, 'centroid', ` font-size="11"`);
  }

  // ---- critical point ----
  if (v.critical) {
    const px = X(v.critical.point[0]);
    const py = Y(v.critical.point[1]);
    out.push(`<rect x="${f1(px - 5)}" y="${f1(py - 5)}" width="10" height="10" fill="none" stroke="${INK}" stroke-width="1.2"/>`);
    text(px + 9, py - 8, 'critical', ` font-size="11"`);
  }

  // ---- instantaneous centre ----
  if (centre && centreShown) {
    const px = X(centre[0]);
    const py = Y(centre[1]);
    out.push(`<g stroke="${INK}" stroke-width="1.2"><line x1="${f1(px - 9)}" y1="${f1(py)}" x2="${f1(px + 9)}" y2="${f1(py)}"/><line x1="${f1(px)}" y1="${f1(py - 9)}" x2="${f1(px)}" y2="${f1(py + 9)}"/></g>`);
    out.push(`<circle cx="${f1(px)}" cy="${f1(py)}" r="3.5" fill="${INK}"/>`);
    text(px - 24, py - 10, 'IC', ' font-weight="bold"');
  } else if (centre) {
    // off the figure: a pointer from the centroid towards it, at the edge of the drawing
    const ddx = centre[0] - cx;
    const ddy = centre[1] - cy;
    const d = Math.hypot(ddx, ddy);
    const a: P = [cx + (ddx / d) * 0.55 * E, cy + (ddy / d) * 0.55 * E];
    const b: P = [cx + (ddx / d) * 0.95 * E, cy + (ddy / d) * 0.95 * E];
    line(a, b, INK, 1, ' stroke-dasharray="3 2" marker-end="url(#wg-vec)"');
    text(X(b[0]) + 6, Y(b[1]) + 4, `to IC, ${num(d)} ${lu} away`, ' font-size="11"');
  }

  // ---- scale bar ----
  {
    const worldWidth = (BOX.right - BOX.left) / s;
    const bar = niceLength(worldWidth / 6);
    const px = bar * s;
    const x0 = W - 60 - px;
    const y0 = H - 128;
    out.push(`<rect x="${f1(x0)}" y="${f1(y0)}" width="${f1(px / 2)}" height="5" fill="${INK}"/>`);
    out.push(`<rect x="${f1(x0 + px / 2)}" y="${f1(y0)}" width="${f1(px / 2)}" height="5" fill="#ffffff" stroke="${INK}" stroke-width="0.8"/>`);
    text(x0, y0 + 18, '0', ' font-size="10" text-anchor="middle"');
    text(x0 + px, y0 + 18, `${num(bar)} ${lu}`, ' font-size="10" text-anchor="middle"');
    text(x0 + px / 2, y0 - 6, 'scale', ` font-size="10" fill="${GREY}" text-anchor="middle"`);
  }

  // ---- caption ----
  const cap: string[] = [];
  if (v.method === 'icr' || v.icrCapacityNominal !== null) {
    cap.push(
      centre
        ? `Instantaneous centre (${num(centre[0])}, ${num(centre[1])}) ${lu}; ${v.elements} elements, equilibrium residual ${num(v.residuals?.relative ?? 0, 2)} of the load.`
        : `Instantaneous centre at infinity (pure translation); ${v.elements} elements.`,
    );
  }
  if (v.method === 'concentric-rule') cap.push(`Load through the centroid: ${v.concentricRule === 'linear' ? 'linear group, Eq. J2-5' : v.concentricRule === 'no-increase' ? 'no directional increase, Eq. J2-4' : `mixed group, Eq. J2-6${v.concentricRule === 'mixed-J2-6a' ? 'a' : 'b'}`} (AISC 360-22 §J2.4).`);
  if (v.critical) cap.push(`Critical point on segment s${v.critical.segment} at (${num(v.critical.point[0])}, ${num(v.critical.point[1])}) ${lu}, theta = ${num(v.critical.angle)}°.`);
  cap.push(`Elastic method: Pn = ${num(v.elastic.capacityNominal)} ${fu} without directional increase${v.elastic.capacityNominalDirectional !== null ? `, ${num(v.elastic.capacityNominalDirectional)} ${fu} with it` : ''}.`);
  if (v.coefficient) cap.push(`C = Pn/(D·l) = ${num(v.coefficient.C)} (kip, in, sixteenths) with l = ${num(v.coefficient.referenceLength)} ${lu}.`);
  if (loadNote) cap.push(`Note: ${loadNote}.`);
  cap.push('Element vectors: forces at capacity, to a common scale. For review by a licensed engineer.');
  cap.forEach((c, i) => text(24, H - 98 + i * 16, c, i === cap.length - 1 ? ` fill="${GREY}" font-size="11"` : ' font-size="11.5"'));
  out.push('</svg>');
  return out.join('\n') + '\n';
}
