/**
 * A small drawing kit for the sheets' figures: world coordinates (in or mm, y up) mapped to one
 * scale inside a frame, parts with a light fill and 45-degree section lines, weld metal solid,
 * failure planes in the one accent colour, dimension lines with slash ticks, and a scale bar.
 * Our own plain drafting style.
 */
import { esc } from './text.js';

export type Pt = [number, number];

export const INK = '#20242a';
export const GREY = '#6b7078';
export const PART_FILL = '#eeece6';
export const HATCH = '#a29e94';
export const WELD_FILL = '#3b4450';
export const ACCENT = '#b3261e';
export const FONT = "'DejaVu Sans', 'Liberation Sans', Helvetica, Arial, sans-serif";

const f1 = (x: number): string => (Math.round(x * 10) / 10).toFixed(1);

/** A round length near `target`: 1, 2 or 5 × 10^k. */
export function niceLength(target: number): number {
  const k = Math.pow(10, Math.floor(Math.log10(target)));
  const m = target / k;
  return (m >= 5 ? 5 : m >= 2 ? 2 : 1) * k;
}

export function numText(x: number): string {
  if (Math.abs(x) < 1e-9) return '0';
  return Number(x.toPrecision(4)).toString();
}

export interface Frame {
  left: number;
  top: number;
  width: number;
  height: number;
}

/** One drawing to one scale inside a frame of the figure. */
export class View {
  readonly s: number;
  private readonly ox: number;
  private readonly oy: number;
  private readonly xmin: number;
  private readonly ymax: number;
  constructor(
    readonly out: string[],
    readonly frame: Frame,
    world: { xmin: number; xmax: number; ymin: number; ymax: number },
    readonly ids: string,
    scale?: number,
  ) {
    const w = Math.max(world.xmax - world.xmin, 1e-9);
    const h = Math.max(world.ymax - world.ymin, 1e-9);
    this.s = scale ?? Math.min(frame.width / w, frame.height / h);
    this.xmin = world.xmin;
    this.ymax = world.ymax;
    this.ox = frame.left + (frame.width - this.s * w) / 2;
    this.oy = frame.top + (frame.height - this.s * h) / 2;
  }

  X(x: number): number {
    return this.ox + (x - this.xmin) * this.s;
  }

  Y(y: number): number {
    return this.oy + (this.ymax - y) * this.s;
  }

  P(p: Pt): string {
    return `${f1(this.X(p[0]))},${f1(this.Y(p[1]))}`;
  }

  /** A cut part: light fill, section lines, outline. */
  part(points: Pt[], opts: { ghost?: boolean } = {}): void {
    const d = `M${points.map((p) => this.P(p)).join(' L')} Z`;
    if (opts.ghost) {
      this.out.push(`<path d="${d}" fill="none" stroke="${GREY}" stroke-width="0.9" stroke-dasharray="6 3"/>`);
      return;
    }
    this.out.push(`<path d="${d}" fill="${PART_FILL}" stroke="none"/>`);
    this.out.push(`<path d="${d}" fill="url(#${this.ids}-hatch)" stroke="none"/>`);
    this.out.push(`<path d="${d}" fill="none" stroke="${INK}" stroke-width="1.3" stroke-linejoin="round"/>`);
  }

  /** A path given in world coordinates with SVG commands (M, L, A radii in world units). */
  pathWorld(cmds: Array<['M' | 'L', Pt] | ['A', number, Pt, 0 | 1] | ['Z']>, fill: string, stroke: string, width: number, extra = ''): void {
    const d = cmds
      .map((c) => {
        if (c[0] === 'Z') return 'Z';
        if (c[0] === 'A') return `A${f1(c[1] * this.s)},${f1(c[1] * this.s)} 0 0 ${c[3]} ${this.P(c[2])}`;
        return `${c[0]}${this.P(c[1])}`;
      })
      .join(' ');
    this.out.push(`<path d="${d}" fill="${fill}" stroke="${stroke}" stroke-width="${width}" stroke-linejoin="round"${extra}/>`);
  }

  weld(points: Pt[]): void {
    this.out.push(`<path d="M${points.map((p) => this.P(p)).join(' L')} Z" fill="${WELD_FILL}" stroke="${INK}" stroke-width="1" stroke-linejoin="round"/>`);
  }

  line(a: Pt, b: Pt, stroke = INK, width = 1, extra = ''): void {
    this.out.push(`<line x1="${f1(this.X(a[0]))}" y1="${f1(this.Y(a[1]))}" x2="${f1(this.X(b[0]))}" y2="${f1(this.Y(b[1]))}" stroke="${stroke}" stroke-width="${width}"${extra}/>`);
  }

  /** The failure plane: a thick accent line. */
  plane(a: Pt, b: Pt): void {
    this.line(a, b, ACCENT, 2.6, ' stroke-linecap="round"');
  }

  text(p: Pt, t: string, opts: { dx?: number; dy?: number; anchor?: 'start' | 'middle' | 'end'; size?: number; fill?: string; bold?: boolean; italic?: boolean } = {}): void {
    const x = this.X(p[0]) + (opts.dx ?? 0);
    const y = this.Y(p[1]) + (opts.dy ?? 0);
    textAt(this.out, x, y, t, opts);
  }

  /**
   * A dimension between two world points, drawn `offset` px to the left of the direction a→b
   * (screen coordinates), with extension lines, slash ticks and the label at the middle.
   */
  dim(a: Pt, b: Pt, offset: number, label: string, opts: { color?: string; labelSide?: 1 | -1 } = {}): void {
    const color = opts.color ?? INK;
    const ax = this.X(a[0]);
    const ay = this.Y(a[1]);
    const bx = this.X(b[0]);
    const by = this.Y(b[1]);
    const len = Math.hypot(bx - ax, by - ay);
    if (len < 1e-6) return;
    const ux = (bx - ax) / len;
    const uy = (by - ay) / len;
    // left normal in screen coordinates (y down)
    const nx = uy;
    const ny = -ux;
    const a2 = [ax + nx * offset, ay + ny * offset];
    const b2 = [bx + nx * offset, by + ny * offset];
    const ext = Math.sign(offset) * 5;
    this.out.push(`<g stroke="${color}" stroke-width="0.7" fill="none">`);
    this.out.push(`<line x1="${f1(ax + nx * Math.sign(offset) * 3)}" y1="${f1(ay + ny * Math.sign(offset) * 3)}" x2="${f1(a2[0]! + nx * ext)}" y2="${f1(a2[1]! + ny * ext)}"/>`);
    this.out.push(`<line x1="${f1(bx + nx * Math.sign(offset) * 3)}" y1="${f1(by + ny * Math.sign(offset) * 3)}" x2="${f1(b2[0]! + nx * ext)}" y2="${f1(b2[1]! + ny * ext)}"/>`);
    // overrun past the extension lines when the dimension is short, so the ticks can be seen
    const over = len < 24 ? 10 : 3;
    this.out.push(`<line x1="${f1(a2[0]! - ux * over)}" y1="${f1(a2[1]! - uy * over)}" x2="${f1(b2[0]! + ux * over)}" y2="${f1(b2[1]! + uy * over)}"/>`);
    // slash ticks at 45 degrees to the dimension line
    const tx = (ux + nx) * 3.5;
    const ty = (uy + ny) * 3.5;
    this.out.push(`<line x1="${f1(a2[0]! - tx)}" y1="${f1(a2[1]! - ty)}" x2="${f1(a2[0]! + tx)}" y2="${f1(a2[1]! + ty)}" stroke-width="1.3"/>`);
    this.out.push(`<line x1="${f1(b2[0]! - tx)}" y1="${f1(b2[1]! - ty)}" x2="${f1(b2[0]! + tx)}" y2="${f1(b2[1]! + ty)}" stroke-width="1.3"/>`);
    this.out.push('</g>');
    const mx = (a2[0]! + b2[0]!) / 2;
    const my = (a2[1]! + b2[1]!) / 2;
    const side = opts.labelSide ?? 1;
    const gap = 6 * Math.sign(offset || 1) * side;
    let angle = (Math.atan2(uy, ux) * 180) / Math.PI;
    if (angle > 90) angle -= 180;
    if (angle <= -90) angle += 180;
    const lx = mx + nx * gap;
    const ly = my + ny * gap;
    if (Math.abs(angle) < 1) {
      // horizontal: the label above or below the line, on the side away from the part
      textAt(this.out, mx, my + (ny * gap > 0 ? 12 : -4), label, { anchor: 'middle', fill: color });
    } else if (Math.abs(Math.abs(angle) - 90) < 1) {
      // vertical: the label beside the line
      textAt(this.out, mx + (nx * gap > 0 ? 5 : -5), my + 4, label, { anchor: nx * gap > 0 ? 'start' : 'end', fill: color });
    } else {
      this.out.push(`<text x="${f1(lx)}" y="${f1(ly)}" text-anchor="middle" fill="${color}" paint-order="stroke" stroke="#ffffff" stroke-width="3" transform="rotate(${f1(angle)} ${f1(lx)} ${f1(ly)})">${esc(label)}</text>`);
    }
  }

  /** A leader from a label to a world point. */
  leader(target: Pt, dx: number, dy: number, label: string, color = INK): void {
    const x = this.X(target[0]);
    const y = this.Y(target[1]);
    const lx = x + dx;
    const ly = y + dy;
    this.out.push(`<polyline points="${f1(x)},${f1(y)} ${f1(lx)},${f1(ly)} ${f1(lx + (dx >= 0 ? 10 : -10))},${f1(ly)}" fill="none" stroke="${color}" stroke-width="0.8"/>`);
    this.out.push(`<circle cx="${f1(x)}" cy="${f1(y)}" r="1.8" fill="${color}"/>`);
    textAt(this.out, lx + (dx >= 0 ? 13 : -13), ly + 4, label, { anchor: dx >= 0 ? 'start' : 'end', fill: color });
  }

  /** A scale bar of a round length, its left end at (x, y) px. */
  scaleBar(x: number, y: number, unit: string, targetPx = 110): void {
    const bar = niceLength(targetPx / this.s);
    const px = bar * this.s;
    this.out.push(`<rect x="${f1(x)}" y="${f1(y)}" width="${f1(px / 2)}" height="4" fill="${INK}"/>`);
    this.out.push(`<rect x="${f1(x + px / 2)}" y="${f1(y)}" width="${f1(px / 2)}" height="4" fill="#ffffff" stroke="${INK}" stroke-width="0.7"/>`);
    textAt(this.out, x, y + 15, '0', { anchor: 'middle', size: 9.5 });
    textAt(this.out, x + px, y + 15, `${numText(bar)} ${unit}`, { anchor: 'middle', size: 9.5 });
  }
}

export function textAt(out: string[], x: number, y: number, t: string, opts: { anchor?: 'start' | 'middle' | 'end'; size?: number; fill?: string; bold?: boolean; italic?: boolean } = {}): void {
  const attrs = [
    opts.anchor && opts.anchor !== 'start' ? ` text-anchor="${opts.anchor}"` : '',
    opts.size ? ` font-size="${opts.size}"` : '',
    opts.fill ? ` fill="${opts.fill}"` : '',
    opts.bold ? ' font-weight="bold"' : '',
    opts.italic ? ' font-style="italic"' : '',
  ].join('');
  // a white halo keeps a label readable where it crosses section lines
  out.push(`<text x="${f1(x)}" y="${f1(y)}"${attrs} paint-order="stroke" stroke="#ffffff" stroke-width="3" stroke-linejoin="round">${esc(t)}</text>`);
}

/** Opens a figure: the svg element, its title and the shared patterns. */
export function openFigure(out: string[], ids: string, width: number, height: number, title: string): void {
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" class="figure-svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="${FONT}" font-size="11" fill="${INK}" role="img" aria-labelledby="${ids}-title">`);
  out.push(`<title id="${ids}-title">${esc(title)}</title>`);
  out.push('<defs>');
  out.push(`<pattern id="${ids}-hatch" patternUnits="userSpaceOnUse" width="7" height="7" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="7" stroke="${HATCH}" stroke-width="0.8"/></pattern>`);
  out.push('</defs>');
  out.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`);
}

/** A legend line under a figure: the accent swatch and what it shows. */
export function legend(out: string[], x: number, y: number, items: Array<{ kind: 'plane' | 'weld' | 'part'; text: string }>, ids: string): void {
  let cx = x;
  for (const it of items) {
    if (it.kind === 'plane') out.push(`<line x1="${f1(cx)}" y1="${f1(y - 4)}" x2="${f1(cx + 18)}" y2="${f1(y - 4)}" stroke="${ACCENT}" stroke-width="2.6" stroke-linecap="round"/>`);
    else if (it.kind === 'weld') out.push(`<rect x="${f1(cx)}" y="${f1(y - 9)}" width="18" height="10" fill="${WELD_FILL}"/>`);
    else out.push(`<rect x="${f1(cx)}" y="${f1(y - 9)}" width="18" height="10" fill="${PART_FILL}" stroke="${INK}" stroke-width="0.8"/><rect x="${f1(cx)}" y="${f1(y - 9)}" width="18" height="10" fill="url(#${ids}-hatch)"/>`);
    textAt(out, cx + 24, y, it.text, { size: 10, fill: GREY });
    cx += 24 + it.text.length * 5.6 + 18;
  }
}
