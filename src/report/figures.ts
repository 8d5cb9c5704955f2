/**
 * The sheets' figures, in SVG, each drawn to one scale from the answer and the request:
 * - fillet: a section through the joint (a T-joint, or a lap joint when a lap is given) with
 *   the legs, the effective throat and the failure plane through it;
 * - PJP groove: a section with the depth of groove S and the effective throat E;
 * - CJP groove: a section with the effective throat, the thinner part;
 * - plug or slot: the holes in plan, and a section through one with its depth of fill;
 * - base metal: a section through the part with the failure plane along the weld.
 * The eccentric weld group keeps its own figure (weld-group-svg.ts), drawn by its operation.
 */
import { ACCENT, GREY, INK, View, legend, numText, openFigure, textAt, type Pt } from './sketch.js';

type Any = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

export interface FigureContext {
  kind: string;
  body: Any;
  values: Any;
  u: { length: string; force: string; stress: string };
  /** Prefix of every id in the figure (unique on the page). */
  ids: string;
}

export interface Figure {
  svg: string;
  caption: string;
}

const W = 680;
const H = 330;
const DRAW = { left: 50, top: 24, width: 410, height: 258 };
const NOTES_X = 490;

/** Points from a to b (both included) with a break mark (a small zigzag) in the middle: a cut-off part. */
function broken(a: Pt, b: Pt, amp: number): Pt[] {
  const m: Pt = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l = Math.hypot(dx, dy) || 1;
  const ux = dx / l;
  const uy = dy / l;
  const nx = -uy;
  const ny = ux;
  const h = Math.min(amp, l / 6);
  return [
    a,
    [m[0] - ux * h, m[1] - uy * h],
    [m[0] - ux * h * 0.3 + nx * h, m[1] - uy * h * 0.3 + ny * h],
    [m[0] + ux * h * 0.3 - nx * h, m[1] + uy * h * 0.3 - ny * h],
    [m[0] + ux * h, m[1] + uy * h],
    b,
  ];
}

/** The notes beside a drawing, wrapped to the column (about 32 characters a line). */
function notes(out: string[], lines: string[], y0 = 44): void {
  const max = 32;
  let y = y0;
  lines.forEach((t, i) => {
    const words = t.split(' ');
    let line = '';
    const flush = (): void => {
      textAt(out, NOTES_X + (line === words.join(' ') || y === y0 ? 0 : 0), y, line, { size: 10.5, bold: i === 0 });
      y += 16;
    };
    for (const w of words) {
      if (line && (line + ' ' + w).length > max) {
        flush();
        line = `  ${w}`;
      } else line = line ? `${line} ${w}` : w;
    }
    if (line) flush();
  });
}

function steelText(body: Any, i: number): string {
  const s = body.parts?.[i]?.steel;
  if (typeof s === 'string') return s;
  if (s && typeof s === 'object') return `Fy ${s.fy}, Fu ${s.fu}`;
  return '';
}

function lengthText(x: number, lu: string): string {
  return `${numText(x)} ${lu}`;
}

// ------------------------------------------------------------------ fillet

/** The foot of the perpendicular from the root R to the face of a fillet from P1 to P2: the throat. */
function throatFoot(R: Pt, P1: Pt, P2: Pt): Pt {
  const ex = P2[0] - P1[0];
  const ey = P2[1] - P1[1];
  const t = ((R[0] - P1[0]) * ex + (R[1] - P1[1]) * ey) / (ex * ex + ey * ey);
  return [P1[0] + t * ex, P1[1] + t * ey];
}

export function filletFigure(ctx: FigureContext): Figure | null {
  const v = ctx.values;
  const w0 = v?.welds?.[0];
  const p0 = v?.parts?.[0];
  if (!w0 || !p0) return null;
  const lu = ctx.u.length;
  const p1 = v.parts[1];
  const [a, b] = w0.legs as [number, number];
  const t0 = p0.thickness as number;
  const t1 = (p1?.thickness as number | undefined) ?? t0;
  const out: string[] = [];
  const lapGiven = ctx.body.lap;
  const lap = typeof lapGiven === 'number' ? lapGiven : typeof lapGiven === 'string' ? parseLen(lapGiven) : null;
  const title = lap !== null ? 'Section through the lap joint: the fillet at the end of part 1' : 'Section through the fillet weld';
  openFigure(out, ctx.ids, W, H, `${title}, to scale`);
  const m = Math.max(a, b, t0, t1);
  const te = w0.throat as number;
  const amp = 0.16 * m;
  let view: View;
  let notesTop = 44;
  if (lap === null) {
    // a T-joint: part 1 (parts[0]) stands on part 2 (parts[1])
    const half = t0 / 2;
    const faces = ctx.body.parts?.[0]?.faces === 2 ? 2 : 1;
    const B = half + b + 1.3 * m;
    const Ht = Math.max(2.2 * t1, 3 * a, 1.4 * m);
    view = new View(out, DRAW, { xmin: -B - 0.5 * m, xmax: B + 0.35 * m, ymin: -t1 - 0.55 * m, ymax: Ht + 0.45 * m }, ctx.ids);
    view.part([...broken([-B, -t1], [-B, 0], amp), [B, 0], ...broken([B, 0], [B, -t1], amp)], { ghost: !p1 });
    view.part([[-half, 0], [-half, Ht], ...broken([-half, Ht], [half, Ht], amp).slice(1), [half, 0]]);
    view.weld([[half, 0], [half + b, 0], [half, a]]);
    if (faces === 2) view.weld([[-half, 0], [-half - b, 0], [-half, a]]);
    const R: Pt = [half, 0];
    const F = throatFoot(R, [half, a], [half + b, 0]);
    view.plane(R, F);
    view.leader([(R[0] + 1.6 * F[0]) / 2.6, (R[1] + 1.6 * F[1]) / 2.6], 46, -view.s * a - 40, `failure plane, tₑ = ${numText(te)}`, ACCENT);
    view.dim([half, 0], [half, a], -(b * view.s + 14), numText(a));
    view.dim([half, 0], [half + b, 0], -(t1 * view.s + 14), numText(b));
    view.dim([-half, Ht], [half, Ht], 14, `t = ${numText(t0)}`);
    view.dim([-B, -t1], [-B, 0], 16, `t = ${numText(t1)}`);
    view.text([-half, Ht * 0.6], 'part 1', { dx: -10, anchor: 'end', bold: true });
    view.text([-half, Ht * 0.6], steelText(ctx.body, 0), { dx: -10, dy: 14, anchor: 'end', fill: GREY });
    view.text([-B * 0.5, -t1], p1 ? 'part 2' : 'part 2 (not given)', { dy: 16, anchor: 'middle', bold: true });
    if (p1) view.text([-B * 0.5, -t1], steelText(ctx.body, 1), { dy: 30, anchor: 'middle', fill: GREY });
  } else {
    // detail at the end of part 1 (on top), lapped on part 2 (below)
    const ext = Math.max(2.6 * m, 3 * b);
    view = new View(out, DRAW, { xmin: -b - ext - 0.7 * m, xmax: 2.2 * m + 0.5 * m, ymin: -0.5 * m, ymax: t1 + t0 + 0.8 * m }, ctx.ids);
    view.part([...broken([-b - ext, 0], [-b - ext, t1], amp), ...broken([2.2 * m - 0.1 * m, t1], [2.2 * m - 0.1 * m, 0], amp).slice(0)], { ghost: !p1 });
    view.part([[0, t1], [0, t1 + t0], ...broken([2.2 * m - 0.1 * m, t1 + t0], [2.2 * m - 0.1 * m, t1], amp)]);
    const aa = Math.min(a, t0);
    view.weld([[0, t1], [-b, t1], [0, t1 + aa]]);
    const R: Pt = [0, t1];
    const F = throatFoot(R, [0, t1 + aa], [-b, t1]);
    view.plane(R, F);
    view.leader([(R[0] + 1.6 * F[0]) / 2.6, (R[1] + 1.6 * F[1]) / 2.6], -40, -view.s * (t0 + 0.3 * m) - 10, `failure plane, tₑ = ${numText(te)}`, ACCENT);
    view.dim([-b, t1], [0, t1], -(t1 * view.s + 14), numText(b));
    view.dim([0, t1 + aa], [0, t1], -(b * view.s + 14), numText(aa));
    view.dim([-b - ext, 0], [-b - ext, t1], 16, `t = ${numText(t1)}`);
    view.dim([2.1 * m, t1], [2.1 * m, t1 + t0], -16, `t = ${numText(t0)}`);
    view.text([m, t1 + t0], 'part 1', { dy: -10, anchor: 'middle', bold: true });
    view.text([-b - ext * 0.5, 0], p1 ? 'part 2' : 'part 2 (not given)', { dy: 16, anchor: 'middle', bold: true });
    // key: the whole lap, to a scale of its own
    const E = Math.max(0.45 * lap, 2 * m);
    const keyFrame = { left: NOTES_X, top: 34, width: 175, height: 64 };
    textAt(out, NOTES_X, 24, 'Key: the lap (own scale)', { size: 10, bold: true });
    const key = new View(out, keyFrame, { xmin: -E, xmax: lap + E, ymin: -0.2 * m, ymax: t1 + t0 + 0.2 * m }, ctx.ids);
    key.part([[-E, 0], [-E, t1], [lap, t1], [lap, 0]], { ghost: !p1 });
    key.part([[0, t1], [0, t1 + t0], [lap + E, t1 + t0], [lap + E, t1]]);
    key.weld([[0, t1], [-Math.max(b, 0.06 * lap), t1], [0, t1 + Math.min(a, t0)]]);
    key.weld([[lap, t1], [lap, t1 - Math.min(b, t1)], [lap + Math.max(a, 0.06 * lap), t1]]);
    key.dim([0, t1 + t0], [lap, t1 + t0], 10, `lap ${numText(lap)}`);
    notesTop = 132;
  }
  view.scaleBar(DRAW.left, H - 22, lu);
  const welds = (ctx.body.welds as Any[] | undefined) ?? [];
  const n = welds.reduce((s: number, w: Any) => s + (typeof w.count === 'number' ? w.count : 1), 0);
  notes(
    out,
    [
      'Fillet weld, line 1',
      Math.abs(a - b) < 1e-12 ? `leg w = ${lengthText(a, lu)}` : `legs ${numText(a)} × ${numText(b)} ${lu}`,
      `effective throat tₑ = ${lengthText(te, lu)}`,
      `FEXX = ${numText(v.fexx)} ${ctx.u.stress}; ${n} line${n === 1 ? '' : 's'}`,
      `part 1: t = ${lengthText(t0, lu)}`,
      p1 ? `part 2: t = ${lengthText(t1, lu)}` : 'part 2: not given',
      `dimensions in ${lu}`,
    ].slice(0, lap === null ? 7 : 5),
    notesTop,
  );
  legend(out, NOTES_X, H - 46, [{ kind: 'weld', text: 'weld' }, { kind: 'part', text: 'part' }], ctx.ids);
  legend(out, NOTES_X, H - 26, [{ kind: 'plane', text: 'failure plane' }], ctx.ids);
  out.push('</svg>');
  return {
    svg: out.join('\n'),
    caption: `${title}, to scale: the legs of line 1, its effective throat tₑ and the failure plane through it. Part 1 is parts[0], which carries the first leg.`,
  };
}

// ------------------------------------------------------------------ groove welds

type Edge = { shape: 'square' } | { shape: 'chamfer'; run: number } | { shape: 'J'; r: number; run: number } | { shape: 'flare'; R: number };

/**
 * The edge of the part on the left of a groove opening on the top face (y = 0), as points from
 * the face down to the root at depth d (x <= 0: into the part). Arcs as short chords.
 */
function profile(edge: Edge, d: number): Pt[] {
  const arc = (c: Pt, r: number, a0: number, a1: number): Pt[] => {
    const n = 12;
    const pts: Pt[] = [];
    for (let i = 0; i <= n; i++) {
      const a = a0 + ((a1 - a0) * i) / n;
      pts.push([c[0] + r * Math.cos(a), c[1] + r * Math.sin(a)]);
    }
    return pts;
  };
  switch (edge.shape) {
    case 'chamfer':
      return [[-edge.run, 0], [0, -d]];
    case 'J':
      return [[-edge.run, 0], ...arc([0, -d + edge.r], edge.r, Math.PI, 1.5 * Math.PI)];
    case 'flare':
      return arc([-edge.R, -edge.R], edge.R, 0.5 * Math.PI, 0);
    default:
      return [[0, 0], [0, -d]];
  }
}

function edgeFor(type: string, depth: number, prepared: boolean, radius: number | null): Edge {
  const deg = Math.PI / 180;
  switch (type) {
    case 'bevel-45':
      return prepared ? { shape: 'chamfer', run: depth * Math.tan(45 * deg) } : { shape: 'square' };
    case 'bevel-60':
      return prepared ? { shape: 'chamfer', run: depth * Math.tan(60 * deg) } : { shape: 'square' };
    case 'V-60':
      return { shape: 'chamfer', run: depth * Math.tan(30 * deg) };
    case 'J':
      return prepared ? { shape: 'J', r: 0.4 * depth, run: 0.4 * depth + 0.6 * depth * Math.tan(20 * deg) } : { shape: 'square' };
    case 'U':
      return { shape: 'J', r: 0.4 * depth, run: 0.4 * depth + 0.6 * depth * Math.tan(10 * deg) };
    case 'flare-bevel':
      return prepared ? { shape: 'flare', R: radius ?? depth } : { shape: 'square' };
    case 'flare-V':
      return { shape: 'flare', R: radius ?? depth };
    default:
      return { shape: 'square' };
  }
}

const mirrorX = (pts: Pt[]): Pt[] => pts.map(([x, y]) => [-x, y]);
/** A profile for a groove opening on the bottom face y = -t instead of the top. */
const toBottom = (pts: Pt[], t: number): Pt[] => pts.map(([x, y]) => [x, -t - y]);

/**
 * A flare groove in section: the rounded corner of an HSS wall (outer radius R, wall t) against
 * the flat face of the other part (flare bevel), or two rounded corners face to face (flare V);
 * the weld fills the flare from the surface to the tangent point, and E is measured from the
 * surface.
 */
function flareFigure(ctx: FigureContext): Figure | null {
  const v = ctx.values;
  const lu = ctx.u.length;
  const g = (ctx.body.groove ?? {}) as Any;
  const bodyParts = (ctx.body.parts as Any[] | undefined) ?? [];
  const R = v.radius as number;
  if (!(R > 0)) return null;
  const thick = (v.parts as Any[]).map((p) => p.thickness as number);
  const hi = Math.max(0, bodyParts.findIndex((p) => p?.hss === true));
  const pi = typeof g.part === 'number' ? g.part : bodyParts.some((p) => p?.hss === true) ? hi : thick.indexOf(Math.min(...thick));
  const oi = v.parts.length > 1 ? 1 - pi : -1;
  const t = thick[pi]!;
  const tO = oi >= 0 ? thick[oi]! : t;
  const vee = g.type === 'flare-V';
  const E = ((v.sides as Any[])?.[0]?.throat as number | undefined) ?? 0;
  const out: string[] = [];
  const title = `Section through the ${vee ? 'flare-V' : 'flare-bevel'} groove weld`;
  openFigure(out, ctx.ids, W, H, `${title}, to scale`);
  const L = Math.max(2.2 * R, 3 * t);
  const down = Math.max(2.2 * R, 3 * t);
  const amp = 0.15 * Math.max(R, t);
  const arc = (c: Pt, r: number, a0: number, a1: number): Pt[] => {
    const pts: Pt[] = [];
    for (let i = 0; i <= 16; i++) {
      const a = a0 + ((a1 - a0) * i) / 16;
      pts.push([c[0] + r * Math.cos(a), c[1] + r * Math.sin(a)]);
    }
    return pts;
  };
  // the corner of the HSS wall: outer arc radius R, inner radius R - t (or a sharp inner corner)
  const corner = (mirror: boolean): Pt[] => {
    const sx = mirror ? -1 : 1;
    const ri = Math.max(R - t, 0);
    const outer = arc([-R, -R], R, 0.5 * Math.PI, 0);
    const inner = ri > 0 ? arc([-R, -R], ri, 0, 0.5 * Math.PI) : [[-t, -t] as Pt];
    const pts: Pt[] = [...broken([-R - L, -t], [-R - L, 0], amp), ...outer, [0, -R - down], ...broken([0, -R - down], [-t, -R - down], amp).slice(1), ...inner, [-R - L, -t]];
    return pts.map(([x, y]) => [sx * x, y]);
  };
  const xmax = vee ? R + L : tO + 0.8 * R;
  const view = new View(out, DRAW, { xmin: -R - L - 0.35 * R, xmax: xmax + 0.35 * R, ymin: -R - down - 0.4 * R, ymax: 0.9 * R }, ctx.ids);
  view.part(corner(false));
  if (vee) view.part(corner(true));
  else view.part([[0, 0.7 * R], [0, -R - down], ...broken([tO, -R - down], [tO, 0.7 * R], amp).slice(0)], { ghost: oi < 0 });
  // weld metal in the flare, flush with the surface
  const flareLeft = arc([-R, -R], R, 0.5 * Math.PI, 0);
  const fill: Pt[] = vee ? [...flareLeft, ...arc([R, -R], R, Math.PI, 0.5 * Math.PI)] : [...flareLeft, [0, 0]];
  view.weld(fill);
  view.plane([0, 0], [0, -Math.min(E, R)]);
  view.dim([0, -Math.min(E, R)], [0, 0], vee ? -(R * view.s * 0.5 + 10) : -(tO * view.s + 16), `E = ${numText(E)}`, { color: ACCENT });
  view.line([-R, -R], [-R + R * Math.cos(Math.PI / 4), -R + R * Math.sin(Math.PI / 4)], GREY, 0.8);
  view.text([-R, -R], `R = ${numText(R)}`, { dx: -4, dy: 14, anchor: 'end' });
  view.dim([-R - L, -t], [-R - L, 0], 14, `t = ${numText(t)}`);
  view.text([-R - L * 0.5, 0], `part ${pi + 1} (HSS wall)`, { dy: -8, anchor: 'middle', bold: true });
  if (oi >= 0) view.text([vee ? R + L * 0.5 : tO, vee ? 0 : -R - down], `part ${oi + 1}`, vee ? { dy: -8, anchor: 'middle', bold: true } : { dx: 8, dy: -6, bold: true });
  view.scaleBar(DRAW.left, H - 22, lu);
  notes(out, [
    `PJP ${vee ? 'flare-V' : 'flare-bevel'} groove weld`,
    `radius R = ${lengthText(R, lu)}${v.radiusAssumed ? ' (2t assumed)' : ''}`,
    `effective throat E = ${(v.sides as Any[]).map((x) => numText(x.throat)).join(' + ')} ${lu}`,
    `throat from ${String(v.throatSource ?? '')}`,
    `${g.process ?? ''}${g.position ? `, ${g.position}` : ''}; ${(v.sides as Any[]).length} side${(v.sides as Any[]).length > 1 ? 's' : ''}`,
    `length L = ${lengthText(v.length, lu)}`,
    `dimensions in ${lu}`,
  ]);
  legend(out, NOTES_X, H - 46, [{ kind: 'weld', text: 'weld' }, { kind: 'part', text: 'part' }], ctx.ids);
  legend(out, NOTES_X, H - 26, [{ kind: 'plane', text: 'effective throat' }], ctx.ids);
  out.push('</svg>');
  return { svg: out.join('\n'), caption: `${title}, to scale (one side shown): the flare between the rounded corner of radius R and the ${vee ? 'other corner' : 'flat face'}, and the effective throat E measured from the surface.` };
}

export function grooveFigure(ctx: FigureContext): Figure | null {
  const v = ctx.values;
  if (!v || !Array.isArray(v.parts) || v.parts.length === 0) return null;
  const lu = ctx.u.length;
  const cjp = ctx.kind === 'groove-cjp';
  const g = (ctx.body.groove ?? {}) as Any;
  const type: string = cjp ? 'V-60' : String(g.type ?? 'V-60');
  if (type === 'flare-bevel' || type === 'flare-V') return flareFigure(ctx);
  const thick = (v.parts as Any[]).map((p) => p.thickness as number);
  const tMin = Math.min(...thick);
  // the prepared part: the one named, else the thinner
  const pi = cjp ? thick.indexOf(tMin) : typeof g.part === 'number' ? g.part : thick.indexOf(tMin);
  const oi = v.parts.length > 1 ? 1 - pi : -1;
  const tP = thick[pi]!;
  const tO = oi >= 0 ? thick[oi]! : tP;
  const flare = type === 'flare-bevel' || type === 'flare-V';
  let depths: number[];
  let throats: number[];
  if (cjp) {
    depths = [tMin / 2, tMin / 2];
    throats = [tMin];
  } else {
    const sides = (v.sides as Any[]) ?? [];
    depths = sides.map((s) => (flare ? (v.radius as number) : (s.depth as number)));
    throats = sides.map((s) => s.throat as number);
  }
  const two = depths.length > 1;
  const d1 = Math.min(depths[0] ?? tMin / 2, tP);
  const d2 = two ? Math.min(depths[1]!, tP - d1) : 0;
  const radius = flare ? (v.radius as number) : null;
  const out: string[] = [];
  const title = cjp ? 'Section through the CJP groove weld' : 'Section through the PJP groove weld';
  openFigure(out, ctx.ids, W, H, `${title}, to scale`);
  const m = Math.max(tP, tO);
  const Wd = Math.max(1.6 * m, 3 * Math.max(d1, d2));
  const view = new View(out, DRAW, { xmin: -Wd - 0.45 * m, xmax: Wd + 0.45 * m, ymin: -m - 0.5 * m, ymax: 0.55 * m }, ctx.ids);
  const amp = 0.12 * m;
  // edges: the prepared part on the left (x <= 0), the other on the right
  const lTop = profile(edgeFor(type, d1, true, radius), d1);
  const rTop = mirrorX(profile(edgeFor(type, d1, false, radius), d1));
  const lBot = two ? toBottom(profile(edgeFor(type, d2, true, radius), d2), tP) : [[0, -tP]] as Pt[];
  const rBot = two ? toBottom(mirrorX(profile(edgeFor(type, d2, false, radius), d2)), tP) : [[0, -tO]] as Pt[];
  view.part([...broken([-Wd, -tP], [-Wd, 0], amp), ...lTop, ...[...lBot].reverse(), [-Wd, -tP]]);
  // a thicker other part steps down to the prepared thickness at the joint, at 1 in 2.5
  const step: Pt[] = two && tO > tP + 1e-12 ? [[Math.min(Wd * 0.8, (rBot[0]?.[0] ?? 0) + 2.5 * (tO - tP)), -tO]] : [];
  const right: Pt[] = [...broken([Wd, 0], [Wd, -tO], amp), ...step, ...(two ? rBot : [[0, -tO] as Pt]), ...[...rTop].reverse()];
  view.part(right, { ghost: oi < 0 });
  // weld metal between the edges
  view.weld([...lTop, ...[...rTop].reverse()]);
  if (two) view.weld([...lBot, ...[...rBot].reverse()]);
  // unfused root between the grooves
  const rootTop = -d1;
  const rootBottom = two ? -tP + d2 : -Math.min(tP, tO);
  if (!cjp && rootBottom < rootTop - 1e-9) {
    view.line([0, rootTop], [0, rootBottom], INK, 2.2);
    view.leader([0, (rootTop + rootBottom) / 2], -60, 0.5 * (tP - (rootTop - rootBottom)) * view.s + 30, 'unfused root');
  }
  // effective throat: the plane through the weld the strength uses, from the face
  const E1 = throats[0] ?? 0;
  view.plane([0, 0], [0, -Math.min(E1, tMin)]);
  const xDim = Wd * 0.55;
  view.dim([xDim, -Math.min(E1, tMin)], [xDim, 0], 12, `E = ${numText(E1)}`, { color: ACCENT });
  if (two && !cjp) {
    const E2 = throats[1] ?? 0;
    view.plane([0, -tP], [0, -tP + E2]);
    view.dim([xDim, -tP], [xDim, -tP + E2], 12, `E = ${numText(E2)}`, { color: ACCENT });
  }
  if (!cjp) {
    const run1 = Math.abs(lTop[0]?.[0] ?? 0);
    view.dim([-run1, 0], [-run1, -d1], -12, `S = ${numText(d1)}`);
    if (two) {
      const run2 = Math.abs(lBot[0]?.[0] ?? 0);
      view.dim([-run2, -tP + d2], [-run2, -tP], -12, `S = ${numText(d2)}`);
    }
  }
  view.dim([-Wd, -tP], [-Wd, 0], 16, `t = ${numText(tP)}`);
  if (oi >= 0) view.dim([Wd, 0], [Wd, -tO], 16, `t = ${numText(tO)}`);
  view.text([-Wd * 0.55, 0], `part ${pi + 1}${cjp ? '' : ' (prepared)'}`, { dy: -10, anchor: 'middle', bold: true });
  if (oi >= 0) view.text([Wd * 0.55, 0], `part ${oi + 1}`, { dy: -10, anchor: 'middle', bold: true });
  view.scaleBar(DRAW.left, H - 22, lu);
  const lines = cjp
    ? ['CJP groove weld', `effective throat E = ${lengthText(v.throat, lu)}`, '(the thinner part joined)', `length L = ${lengthText(v.length, lu)}`, `FEXX = ${numText(v.fexx)} ${ctx.u.stress}`, 'groove drawn as a double V', `dimensions in ${lu}`]
    : [
        `PJP groove weld, ${type}`,
        flare ? `radius R = ${lengthText(v.radius, lu)}` : `depth of groove S = ${depths.map((d) => numText(d)).join(' + ')} ${lu}`,
        `effective throat E = ${throats.map((t) => numText(t)).join(' + ')} ${lu}`,
        `throat from ${String(v.throatSource ?? '')}`,
        `${g.process ?? ''}${g.position ? `, ${g.position}` : ''}`,
        `length L = ${lengthText(v.length, lu)}`,
        `dimensions in ${lu}`,
      ];
  notes(out, lines);
  legend(out, NOTES_X, H - 46, [{ kind: 'weld', text: 'weld' }, { kind: 'part', text: 'part' }], ctx.ids);
  legend(out, NOTES_X, H - 26, [{ kind: 'plane', text: 'effective throat' }], ctx.ids);
  out.push('</svg>');
  return {
    svg: out.join('\n'),
    caption: cjp
      ? `${title}, to scale: the effective throat E is the thinner part joined; the base metal of each part is checked on E × L.`
      : `${title}, to scale: the depth of groove S (or the flare radius R) and the effective throat E the strength uses; below E the root is not counted.`,
  };
}

// ------------------------------------------------------------------ plug and slot welds

export function plugSlotFigure(ctx: FigureContext): Figure | null {
  const v = ctx.values;
  const hole = ctx.body.hole as Any | undefined;
  if (!v || !hole || !Array.isArray(v.parts)) return null;
  const lu = ctx.u.length;
  const plug = v.shape === 'plug';
  const num = (x: unknown): number => (typeof x === 'number' ? x : typeof x === 'string' ? parseLen(x) : Number.NaN);
  const d = plug ? num(hole.diameter) : Number.NaN;
  const L = plug ? d : num(hole.length);
  const Wd = plug ? d : num(hole.width);
  if (!(L > 0) || !(Wd > 0)) return null;
  const count = v.count as number;
  const sAlong = typeof hole.spacing === 'number' || typeof hole.spacing === 'string' ? num(hole.spacing) : null;
  const sAcross = typeof hole.spacingAcross === 'number' || typeof hole.spacingAcross === 'string' ? num(hole.spacingAcross) : null;
  // one row along x, or one column when only the spacing across is given
  const along = sAlong !== null || sAcross === null;
  const pitch = (along ? sAlong : sAcross) ?? 2 * L;
  const shown = Math.min(count, 5);
  const out: string[] = [];
  openFigure(out, ctx.ids, W, H, `${plug ? 'Plug' : 'Slot'} welds in plan and in section, to scale`);
  // ---- plan, left half ----
  const spanX = along ? (shown - 1) * pitch + L : L;
  const spanY = along ? Wd : (shown - 1) * pitch + Wd;
  const margin = 0.9 * Math.max(L, Wd);
  const planFrame = { left: 40, top: 34, width: 270, height: 215 };
  const plan = new View(out, planFrame, { xmin: -margin, xmax: spanX + margin, ymin: -margin, ymax: spanY + margin }, ctx.ids);
  textAt(out, planFrame.left, 20, `Plan of part ${v.holePart + 1} (with the ${plug ? 'holes' : 'slots'})`, { size: 10.5, bold: true });
  plan.part([[-margin * 0.7, -margin * 0.7], [spanX + margin * 0.7, -margin * 0.7], [spanX + margin * 0.7, spanY + margin * 0.7], [-margin * 0.7, spanY + margin * 0.7]]);
  for (let i = 0; i < shown; i++) {
    const cx = along ? i * pitch + L / 2 : L / 2;
    const cy = along ? Wd / 2 : i * pitch + Wd / 2;
    const r = plug ? d / 2 : Wd / 2;
    const x0 = plan.X(cx - L / 2);
    const y0 = plan.Y(cy + Wd / 2);
    const rx = (plug ? r : Math.min(r, L / 2)) * plan.s;
    out.push(`<rect x="${x0.toFixed(1)}" y="${y0.toFixed(1)}" width="${(L * plan.s).toFixed(1)}" height="${(Wd * plan.s).toFixed(1)}" rx="${rx.toFixed(1)}" fill="#3b4450" stroke="${INK}" stroke-width="1"/>`);
    out.push(`<rect x="${x0.toFixed(1)}" y="${y0.toFixed(1)}" width="${(L * plan.s).toFixed(1)}" height="${(Wd * plan.s).toFixed(1)}" rx="${rx.toFixed(1)}" fill="none" stroke="${ACCENT}" stroke-width="2"/>`);
  }
  if (plug) plan.dim([0, Wd], [d, Wd], 12, `d = ${numText(d)}`);
  else {
    plan.dim([0, Wd], [L, Wd], 12, `L = ${numText(L)}`);
    plan.dim([L, 0], [L, Wd], -12, `W = ${numText(Wd)}`);
  }
  if (shown > 1) {
    if (along) plan.dim([L / 2, 0], [pitch + L / 2, 0], -14, `s = ${numText(pitch)}`);
    else plan.dim([0, Wd / 2], [0, pitch + Wd / 2], 14, `s = ${numText(pitch)}`);
  }
  if (count > shown) textAt(out, planFrame.left, planFrame.top + planFrame.height + 8, `${shown} of ${count} shown`, { size: 10, fill: GREY });
  plan.scaleBar(planFrame.left, H - 22, lu, 80);
  // ---- section through one hole, right half ----
  const hp = v.holePart as number;
  const op = 1 - hp;
  const t = v.parts[hp].thickness as number;
  const t2 = (v.parts[op]?.thickness as number | undefined) ?? t;
  const fill = v.fill as number;
  const width = plug ? d : Wd;
  const ext = 1.3 * Math.max(width, t);
  const secFrame = { left: 350, top: 34, width: 262, height: 190 };
  const sec = new View(out, secFrame, { xmin: -width / 2 - ext, xmax: width / 2 + ext, ymin: -t2 - 0.2 * t, ymax: t + 0.35 * t }, ctx.ids);
  textAt(out, secFrame.left, 20, `Section through one ${plug ? 'plug' : 'slot'}`, { size: 10.5, bold: true });
  const amp = 0.12 * Math.max(t, t2);
  // part with the hole above the faying surface (y = 0), the other below
  sec.part([...broken([-width / 2 - ext, 0], [-width / 2 - ext, t], amp), [-width / 2, t], [-width / 2, 0]]);
  sec.part([[width / 2, 0], [width / 2, t], ...broken([width / 2 + ext, t], [width / 2 + ext, 0], amp)]);
  sec.part([...broken([-width / 2 - ext, -t2], [-width / 2 - ext, 0], amp), [width / 2 + ext, 0], ...broken([width / 2 + ext, 0], [width / 2 + ext, -t2], amp).slice(1)]);
  sec.weld([[-width / 2, 0], [width / 2, 0], [width / 2, fill], [-width / 2, fill]]);
  sec.plane([-width / 2, 0], [width / 2, 0]);
  sec.plane([-width / 2, 0], [-width / 2, fill]);
  sec.plane([width / 2, 0], [width / 2, fill]);
  sec.dim([-width / 2, t], [width / 2, t], 12, `${plug ? 'd' : 'W'} = ${numText(width)}`);
  sec.dim([-width / 2 - ext, 0], [-width / 2 - ext, t], 14, `t = ${numText(t)}`);
  sec.dim([width / 2 + ext * 0.4, 0], [width / 2 + ext * 0.4, fill], -10, `f = ${numText(fill)}`);
  sec.dim([width / 2 + ext, 0], [width / 2 + ext, -t2], 14, `t = ${numText(t2)}`);
  sec.leader([width / 2 + ext * 0.55, 0], -20, 30, 'faying surface', GREY);
  textAt(out, secFrame.left + secFrame.width / 2, secFrame.top + secFrame.height + 16, `part ${hp + 1} above, part ${op + 1} below; dimensions in ${lu}`, { size: 10, anchor: 'middle', fill: GREY });
  legend(out, 350, H - 26, [{ kind: 'weld', text: 'weld' }, { kind: 'part', text: 'part' }, { kind: 'plane', text: 'failure planes' }], ctx.ids);
  out.push('</svg>');
  return {
    svg: out.join('\n'),
    caption: `${plug ? 'Plug' : 'Slot'} welds, to scale: the pattern in plan, and a section through one with the depth of fill f. The weld metal shears in the faying plane; the part with the ${plug ? 'holes' : 'slots'} on the fused wall, the other part on the faying surface (failure planes in red).`,
  };
}

function parseLen(s: string): number {
  const m = /^\s*(?:(\d+)[ -])?(\d+)\/(\d+)\s*$/.exec(s);
  if (m) return (m[1] ? Number(m[1]) : 0) + Number(m[2]) / Number(m[3]);
  return Number(s);
}

// ------------------------------------------------------------------ base metal

export function baseMetalFigure(ctx: FigureContext): Figure | null {
  const v = ctx.values;
  const part = ctx.body.part as Any | undefined;
  if (!v || !part) return null;
  const lu = ctx.u.length;
  const t = typeof part.thickness === 'number' ? part.thickness : parseLen(String(part.thickness));
  if (!(t > 0)) return null;
  const faces = part.faces === 2 ? 2 : 1;
  const tension = part.loading === 'tension';
  const out: string[] = [];
  openFigure(out, ctx.ids, W, H, 'Section through the part along its weld lines, to scale');
  const w = 0.6 * t;
  const Ht = 3 * t;
  const B = 2.2 * t;
  const view = new View(out, DRAW, { xmin: -B - 0.5 * t, xmax: B + 0.3 * t, ymin: -1.2 * t, ymax: Ht + 0.5 * t }, ctx.ids);
  const amp = 0.15 * t;
  view.part([...broken([-B, -t], [-B, 0], amp), [B, 0], ...broken([B, 0], [B, -t], amp)], { ghost: true });
  view.part([[-t / 2, 0], [-t / 2, Ht], ...broken([-t / 2, Ht], [t / 2, Ht], amp).slice(1), [t / 2, Ht], [t / 2, 0]]);
  view.weld([[t / 2, 0], [t / 2 + w, 0], [t / 2, w]]);
  if (faces === 2) view.weld([[-t / 2, 0], [-t / 2 - w, 0], [-t / 2, w]]);
  const yPlane = tension ? w * 1.05 : w * 1.05;
  view.plane([-t / 2, yPlane], [t / 2, yPlane]);
  view.leader([0.2 * t, yPlane], 60, -40, tension ? 'failure plane, t × Lₚ' : 'shear plane, t × Lₚ', ACCENT);
  view.dim([-t / 2, Ht], [t / 2, Ht], 16, `t = ${numText(t)}`);
  view.text([-t / 2, Ht * 0.62], 'the part', { dx: -10, anchor: 'end', bold: true });
  view.text([0, -t], 'other part (not checked here)', { dy: 16, anchor: 'middle', fill: GREY });
  view.scaleBar(DRAW.left, H - 22, lu);
  notes(out, [
    'Base metal along the welds',
    `t = ${lengthText(t, lu)}, ${typeof part.steel === 'string' ? part.steel : 'steel given by Fy, Fu'}`,
    `welds on ${faces === 2 ? 'both faces' : 'one face'}`,
    `total weld length ${lengthText(v.weldLength, lu)}`,
    `plane length Lₚ = ${lengthText(v.planeLength, lu)}`,
    `loading: ${tension ? 'tension across the welds' : 'shear along the welds'}`,
    'weld size not given: drawn for scale only',
  ]);
  legend(out, NOTES_X, H - 46, [{ kind: 'weld', text: 'weld' }, { kind: 'part', text: 'part' }], ctx.ids);
  legend(out, NOTES_X, H - 26, [{ kind: 'plane', text: 'failure plane' }], ctx.ids);
  out.push('</svg>');
  return { svg: out.join('\n'), caption: 'Section through the part, to scale in its thickness: the failure plane t × Lₚ on which the part is checked (the weld size is not part of this check and is drawn only to show where the welds are).' };
}

/** The figure for an answer of the given kind, or null when the kind has none of its own. */
export function figureFor(ctx: FigureContext): Figure | null {
  try {
    switch (ctx.kind) {
      case 'fillet':
        return filletFigure(ctx);
      case 'groove-pjp':
      case 'groove-cjp':
        return grooveFigure(ctx);
      case 'plug-slot':
        return plugSlotFigure(ctx);
      case 'base-metal':
        return baseMetalFigure(ctx);
      default:
        return null;
    }
  } catch {
    return null;
  }
}
