/**
 * How each strength check of an answer is reached, line by line, for the calculation sheet:
 * symbol = formula = the numbers put in = result, with the provision each line rests on.
 *
 * Built in the report layer from the answer (its checks and `values`) and the request; the
 * engine's numbers are never changed. Every builder also works its own arithmetic out from the
 * numbers it prints (`nominal`), so a test can hold the printed substitution to the engine's
 * result. A check the builders do not know, or an answer without the values a builder needs,
 * still gets the general lines (nominal strength, available strength, ratio).
 */
import type { CheckItemLike, SheetAnswer } from './sheet-types.js';
import { texNum, texQ } from './math.js';
import { parseFraction } from '../engine/units.js';
import { kds } from '../engine/provisions/fillet.js';
import { groupProperties, type Segment } from '../engine/weld-group/geometry.js';
import { loadAngle } from '../engine/weld-group/concentric.js';
import type { UnitNames } from './text.js';

export interface Step {
  /** What the line finds, in words. */
  label: string;
  /** TeX: symbol = formula = substitution = result. */
  tex: string;
  /** The provision the line rests on ("AISC 360-22 §J2.4, Eq. J2-5"), or "" when it is arithmetic. */
  ref: string;
}

export interface Derivation {
  /** Lines up to and including the nominal strength. */
  steps: Step[];
  /** The nominal strength worked out from the printed numbers (full precision), or null when the lines only state it. */
  nominal: number | null;
  /** Intermediate quantities worked out here beside the engine's own: [what, worked out, engine]. */
  agreements?: Array<[string, number, number]>;
}

export interface DerivationContext {
  kind: string;
  // The request as received (validated against the operation's schema).
  body: Record<string, unknown>;
  answer: SheetAnswer;
  u: UnitNames;
  metric: boolean;
}

type Any = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

const SPEC = 'AISC 360-22';
const eq = (...parts: Array<string | null | undefined | false>): string => parts.filter((p): p is string => typeof p === 'string' && p !== '').join(' = ');

/** A length field of the request: a number, or an imperial fraction string. */
function len(v: unknown): number {
  if (typeof v === 'number') return v;
  if (typeof v === 'string') return parseFraction(v) ?? Number.NaN;
  return Number.NaN;
}

/** Stress × area → force in the request's units (MPa·mm² = N, shown in kN). */
function stressArea(ctx: DerivationContext): number {
  return ctx.metric ? 0.001 : 1;
}

function q(ctx: DerivationContext, x: number, dim: Parameters<typeof texQ>[2], sig = 4): string {
  return texQ(x, ctx.u, dim, sig);
}

// ------------------------------------------------------------------ fillet weld metal (fillet check)

function filletWeldMetal(ctx: DerivationContext): Derivation | null {
  const v = ctx.answer.values as Any;
  const welds = ctx.body.welds as Any[] | undefined;
  if (!v || !Array.isArray(v.welds) || !Array.isArray(welds)) return null;
  const steps: Step[] = [];
  const multi = v.welds.length > 1;
  const FEXX = v.fexx as number;
  const sa = stressArea(ctx);
  const rule = v.groupRule as string;
  const mixed = rule === 'mixed-J2-6a' || rule === 'mixed-J2-6b';
  const lineNominal: number[] = [];
  const agreements: Array<[string, number, number]> = [];
  let Rnwl = 0;
  let Rnwt = 0;
  v.welds.forEach((w: Any, i: number) => {
    const bw = welds[i] ?? {};
    const s = multi ? `,${i + 1}` : '';
    const line = multi ? ` (line ${i + 1})` : '';
    const [a, b] = w.legs as [number, number];
    let throat: number;
    if (Math.abs(a - b) <= 1e-12 * Math.max(a, b)) {
      throat = a / Math.SQRT2;
      steps.push({ label: `Effective throat${line}`, tex: eq(`t_{e${s}}`, '\\dfrac{w}{\\sqrt{2}}', `\\dfrac{${q(ctx, a, 'length')}}{\\sqrt{2}}`, q(ctx, w.throat, 'length')), ref: `${SPEC} §J2.2a` });
    } else {
      throat = (a * b) / Math.hypot(a, b);
      steps.push({ label: `Effective throat, unequal legs${line}`, tex: eq(`t_{e${s}}`, '\\dfrac{a\\,b}{\\sqrt{a^{2}+b^{2}}}', `\\dfrac{${texNum(a)}\\times ${texNum(b)}}{\\sqrt{${texNum(a)}^{2}+${texNum(b)}^{2}}}`, q(ctx, w.throat, 'length')), ref: `${SPEC} §J2.2a` });
    }
    const l = len(bw.length);
    if (w.effectiveSize < w.size * (1 - 1e-12)) {
      throat = throat * (w.effectiveSize / w.size);
      steps.push({ label: `Short weld: effective size${line}`, tex: eq(`w_{\\mathrm{eff}${s}}`, '\\dfrac{l}{4}', `\\dfrac{${q(ctx, l, 'length')}}{4}`, q(ctx, w.effectiveSize, 'length')), ref: `${SPEC} §J2.2b` });
      steps.push({ label: `Effective throat on the effective size${line}`, tex: eq(`t_{e${s}}`, `t_{e}\\,\\dfrac{w_{\\mathrm{eff}}}{w}`, q(ctx, w.effectiveThroat, 'length')), ref: `${SPEC} §J2.2b` });
    }
    const count = typeof bw.count === 'number' ? bw.count : 1;
    const segments = bw.intermittent && typeof bw.intermittent.segments === 'number' ? bw.intermittent.segments : 1;
    const n = count * segments;
    let le = l;
    if (w.beta < 1 - 1e-12) {
      const ratio = l / w.size;
      if (ratio > 300) {
        le = 180 * w.size;
        steps.push({ label: `End-loaded weld over 300w: effective length${line}`, tex: eq(`l_{e${s}}`, '180\\,w', `180\\times ${q(ctx, w.size, 'length')}`, q(ctx, le, 'length')), ref: `${SPEC} §J2.2b` });
      } else {
        const beta = 1.2 - 0.002 * ratio;
        le = beta * l;
        steps.push({ label: `End-loaded weld: reduction factor${line}`, tex: eq(`\\beta${s ? `_{${i + 1}}` : ''}`, '1.2-0.002\\,\\dfrac{l}{w}', `1.2-0.002\\times\\dfrac{${texNum(l)}}{${texNum(w.size)}}`, texNum(w.beta, 3)), ref: `${SPEC} Eq. J2-1` });
        steps.push({ label: `Effective length of one line${line}`, tex: eq(`l_{e${s}}`, '\\beta\\,l', `${texNum(w.beta, 3)}\\times ${q(ctx, l, 'length')}`, q(ctx, le, 'length')), ref: `${SPEC} Eq. J2-1` });
      }
    }
    const nText = segments > 1 ? `${count}\\times ${segments}` : `${count}`;
    const Lw = n * le;
    steps.push({
      label: `Effective length${n > 1 ? `, ${count} line${count > 1 ? 's' : ''}${segments > 1 ? ` of ${segments} segments` : ''}` : ''}${line}`,
      tex: eq(`L_{w${s}}`, n > 1 ? `n\\,l${w.beta < 1 - 1e-12 ? '_{e}' : ''}` : null, `${n > 1 ? `${nText}\\times ` : ''}${q(ctx, le, 'length')}`, q(ctx, w.effectiveLength, 'length')),
      ref: '',
    });
    const area = throat * Lw;
    agreements.push([`effective throat${line}`, throat, w.effectiveThroat], [`effective length${line}`, Lw, w.effectiveLength], [`effective area${line}`, area, w.area]);
    steps.push({ label: `Effective area${line}`, tex: eq(`A_{we${s}}`, `t_{e}\\,L_{w}`, `${q(ctx, throat, 'length')}\\times ${q(ctx, Lw, 'length')}`, q(ctx, w.area, 'area')), ref: `${SPEC} §J2.2a` });
    const angle = typeof bw.angle === 'number' ? bw.angle : 0;
    const factor = w.kds as number;
    let Fn: number;
    if (factor > 1 + 1e-12) {
      Fn = 0.6 * FEXX * kds(angle);
      steps.push({
        label: `Weld stress with the directional increase, θ = ${angle}°${line}`,
        tex: eq(`F_{nw${s}}`, '0.60\\,F_{\\mathrm{EXX}}\\left(1.0+0.50\\sin^{1.5}\\theta\\right)', `0.60\\times ${q(ctx, FEXX, 'stress')}\\times\\left(1.0+0.50\\sin^{1.5}${texNum(angle)}^{\\circ}\\right)`, q(ctx, Fn, 'stress')),
        ref: `${SPEC} Eq. J2-5`,
      });
    } else {
      Fn = 0.6 * FEXX;
      steps.push({ label: `Weld stress${line}`, tex: eq(`F_{nw${s}}`, '0.60\\,F_{\\mathrm{EXX}}', `0.60\\times ${q(ctx, FEXX, 'stress')}`, q(ctx, Fn, 'stress')), ref: `${SPEC} Table J2.5` });
    }
    const Rn = Fn * area * sa;
    lineNominal.push(Rn);
    if (mixed) {
      if (angle === 0) Rnwl += Rn;
      else Rnwt += Rn;
    }
    steps.push({ label: `Nominal strength${line}`, tex: eq(`R_{n${s}}`, `F_{nw}\\,A_{we}`, `${q(ctx, Fn, 'stress')}\\times ${q(ctx, area, 'area')}`, q(ctx, w.nominal, 'force')), ref: `${SPEC} Eq. J2-4` });
  });

  let nominal: number;
  if (mixed) {
    const a = Rnwl + Rnwt;
    const b = 0.85 * Rnwl + 1.5 * Rnwt;
    steps.push({ label: 'Longitudinal lines together', tex: eq('R_{nwl}', '\\sum R_{n,\\theta=0}', q(ctx, Rnwl, 'force')), ref: `${SPEC} §J2.4` });
    steps.push({ label: 'Transverse lines together', tex: eq('R_{nwt}', '\\sum R_{n,\\theta=90^{\\circ}}', q(ctx, Rnwt, 'force')), ref: `${SPEC} §J2.4` });
    steps.push({ label: 'Mixed group, first rule', tex: eq('R_{n,a}', 'R_{nwl}+R_{nwt}', `${texNum(Rnwl)}+${texNum(Rnwt)}`, q(ctx, a, 'force')), ref: `${SPEC} Eq. J2-6a` });
    steps.push({ label: 'Mixed group, second rule', tex: eq('R_{n,b}', '0.85\\,R_{nwl}+1.5\\,R_{nwt}', `0.85\\times ${texNum(Rnwl)}+1.5\\times ${texNum(Rnwt)}`, q(ctx, b, 'force')), ref: `${SPEC} Eq. J2-6b` });
    nominal = Math.max(a, b);
    steps.push({ label: 'Nominal strength of the group: the larger', tex: eq('R_{n}', '\\max\\left(R_{n,a},\\,R_{n,b}\\right)', q(ctx, nominal, 'force')), ref: `${SPEC} Eq. J2-6${rule === 'mixed-J2-6a' ? 'a' : 'b'}` });
  } else {
    nominal = lineNominal.reduce((x, y) => x + y, 0);
    if (multi) steps.push({ label: 'Nominal strength of the group', tex: eq('R_{n}', '\\sum R_{n,i}', lineNominal.map((x) => texNum(x)).join('+'), q(ctx, v.weldMetalNominal, 'force')), ref: rule === 'no-increase' ? `${SPEC} Eq. J2-4` : `${SPEC} §J2.4` });
  }
  return { steps, nominal, agreements };
}

// ------------------------------------------------------------------ base metal, every family

interface PlaneArea {
  steps: Step[];
  area: number;
  fy: number;
  fu: number;
}

/** The failure plane of the part a base-metal check is about, by family. */
function baseMetalPlane(ctx: DerivationContext, check: CheckItemLike, areaSymbol: string): PlaneArea | null {
  const v = ctx.answer.values as Any;
  const pi = check.part ?? 0;
  const steps: Step[] = [];
  switch (ctx.kind) {
    case 'fillet': {
      const p = v?.parts?.[pi];
      const bp = (ctx.body.parts as Any[] | undefined)?.[pi];
      if (!p || !bp) return null;
      const faces = bp.faces === 2 ? 2 : 1;
      const sum = p.planeLength * faces;
      if (faces === 2) steps.push({ label: `Failure plane length, welds on both faces of part ${pi + 1}`, tex: eq('L_{p}', '\\dfrac{\\sum l}{2}', `\\dfrac{${q(ctx, sum, 'length')}}{2}`, q(ctx, p.planeLength, 'length')), ref: '' });
      else steps.push({ label: `Failure plane length along the welds on part ${pi + 1}`, tex: eq('L_{p}', '\\sum l', q(ctx, p.planeLength, 'length')), ref: '' });
      const area = p.thickness * p.planeLength;
      steps.push({ label: 'Area of the failure plane', tex: eq(areaSymbol, 't\\,L_{p}', `${q(ctx, p.thickness, 'length')}\\times ${q(ctx, p.planeLength, 'length')}`, q(ctx, p.area, 'area')), ref: `${SPEC} §J4.2` });
      return { steps, area, fy: p.fy, fu: p.fu };
    }
    case 'base-metal': {
      const part = ctx.body.part as Any | undefined;
      if (!v || !part) return null;
      const t = len(part.thickness);
      const faces = part.faces === 2 ? 2 : 1;
      steps.push({ label: 'Total weld length on the part', tex: eq('\\sum l', q(ctx, v.weldLength, 'length')), ref: '' });
      if (faces === 2) steps.push({ label: 'Failure plane length, welds on both faces', tex: eq('L_{p}', '\\dfrac{\\sum l}{2}', `\\dfrac{${q(ctx, v.weldLength, 'length')}}{2}`, q(ctx, v.planeLength, 'length')), ref: '' });
      const area = t * v.planeLength;
      steps.push({ label: 'Area of the failure plane', tex: eq(areaSymbol, 't\\,L_{p}', `${q(ctx, t, 'length')}\\times ${q(ctx, v.planeLength, 'length')}`, q(ctx, v.area, 'area')), ref: `${SPEC} §J4` });
      return { steps, area, fy: v.fy, fu: v.fu };
    }
    case 'groove-pjp': {
      const p = v?.parts?.[pi];
      if (!p || !Array.isArray(v.sides)) return null;
      const throats = (v.sides as Any[]).map((s) => Math.min(s.throat as number, p.thickness as number));
      const sumT = throats.reduce((x, y) => x + y, 0);
      const area = sumT * v.length;
      const subst = throats.length > 1 ? `\\left(${throats.map((t) => texNum(t)).join('+')}\\right)\\times ${q(ctx, v.length, 'length')}` : `${q(ctx, throats[0]!, 'length')}\\times ${q(ctx, v.length, 'length')}`;
      steps.push({ label: `Base-metal area at the fusion face of part ${pi + 1}`, tex: eq(areaSymbol, '\\sum \\min(E_{i},\\,t)\\,L', subst, q(ctx, p.fusionArea, 'area')), ref: `${SPEC} Table J2.5` });
      return { steps, area, fy: p.fy, fu: p.fu };
    }
    case 'groove-cjp': {
      const p = v?.parts?.[pi];
      if (!p) return null;
      const area = v.throat * v.length;
      steps.push({ label: 'Effective throat: the thinner part joined', tex: eq('E', 't_{\\min}', q(ctx, v.throat, 'length')), ref: `${SPEC} §J2.1a` });
      steps.push({ label: `Area of part ${pi + 1} on the effective throat`, tex: eq(areaSymbol, 'E\\,L', `${q(ctx, v.throat, 'length')}\\times ${q(ctx, v.length, 'length')}`, q(ctx, v.area, 'area')), ref: `${SPEC} Table J2.5` });
      return { steps, area, fy: p.fy, fu: p.fu };
    }
    case 'plug-slot': {
      const p = v?.parts?.[pi];
      if (!p) return null;
      if (p.plane === 'hole-wall') {
        const area = v.count * v.perimeter * v.fill;
        steps.push({ label: `Wall of the ${v.shape === 'plug' ? 'holes' : 'slots'}, fused over the depth of fill`, tex: eq(areaSymbol, 'n\\,p\\,f', `${v.count}\\times ${q(ctx, v.perimeter, 'length')}\\times ${q(ctx, v.fill, 'length')}`, q(ctx, p.area, 'area')), ref: `${SPEC} §J4.2` });
        return { steps, area, fy: p.fy, fu: p.fu };
      }
      const area = v.count * v.area;
      steps.push({ label: 'Fused face on the faying surface: the welds\' effective area', tex: eq(areaSymbol, 'n\\,A_{1}', `${v.count}\\times ${q(ctx, v.area, 'area')}`, q(ctx, p.area, 'area')), ref: `${SPEC} §J2.3a` });
      return { steps, area, fy: p.fy, fu: p.fu };
    }
    default:
      return null;
  }
}

const BASE_METAL_RULES: Record<string, { factor: string; k: number; stress: 'fy' | 'fu'; symbol: string; area: string; ref: string; label: string }> = {
  BASE_METAL_SHEAR_YIELD: { factor: '0.60\\,', k: 0.6, stress: 'fy', symbol: 'F_{y}', area: 'A_{gv}', ref: 'Eq. J4-3', label: 'Nominal shear yielding strength' },
  BASE_METAL_SHEAR_RUPTURE: { factor: '0.60\\,', k: 0.6, stress: 'fu', symbol: 'F_{u}', area: 'A_{nv}', ref: 'Eq. J4-4', label: 'Nominal shear rupture strength' },
  BASE_METAL_TENSION_YIELD: { factor: '', k: 1, stress: 'fy', symbol: 'F_{y}', area: 'A_{g}', ref: 'Eq. J4-1', label: 'Nominal tension yielding strength' },
  BASE_METAL_TENSION_RUPTURE: { factor: '', k: 1, stress: 'fu', symbol: 'F_{u}', area: 'A_{e}', ref: 'Eq. J4-2', label: 'Nominal tension rupture strength' },
  BASE_METAL_COMPRESSION_YIELD: { factor: '', k: 1, stress: 'fy', symbol: 'F_{y}', area: 'A_{g}', ref: 'Eq. J4-6', label: 'Nominal compression yielding strength' },
  PJP_BASE_METAL_TENSION: { factor: '', k: 1, stress: 'fu', symbol: 'F_{u}', area: 'A_{BM}', ref: 'Eq. J2-2', label: 'Nominal base-metal strength, F_nBM = Fu' },
  PJP_BASE_METAL_COMPRESSION: { factor: '', k: 1, stress: 'fy', symbol: 'F_{y}', area: 'A_{BM}', ref: 'Eq. J2-2', label: 'Nominal base-metal strength, F_nBM = Fy' },
};

function baseMetal(ctx: DerivationContext, check: CheckItemLike): Derivation | null {
  const rule = BASE_METAL_RULES[check.code];
  if (!rule) return null;
  if (ctx.kind === 'weld-group') return weldGroupBaseMetal(ctx, check, rule);
  const plane = baseMetalPlane(ctx, check, rule.area);
  if (!plane) return null;
  const F = rule.stress === 'fy' ? plane.fy : plane.fu;
  const nominal = rule.k * F * plane.area * stressArea(ctx);
  const steps = [...plane.steps];
  const k = rule.k === 1 ? '' : '0.60\\times ';
  steps.push({
    label: rule.label,
    tex: eq('R_{n}', `${rule.factor}${rule.symbol}\\,${rule.area}`, `${k}${q(ctx, F, 'stress')}\\times ${q(ctx, plane.area, 'area')}`, q(ctx, check.nominal, 'force')),
    ref: `${check.clause ? `${check.clause}, ` : ''}${rule.ref}`,
  });
  return { steps, nominal };
}

/** Base metal along the segments of a weld group: the plane along the most loaded segment. */
function weldGroupBaseMetal(ctx: DerivationContext, check: CheckItemLike, rule: (typeof BASE_METAL_RULES)[string]): Derivation | null {
  const v = ctx.answer.values as Any;
  const pi = check.part ?? 0;
  const p = v?.parts?.[pi];
  if (!p || p.governingSegment === null || p.governingSegment === undefined || !(v.demand > 0)) return null;
  const j = p.governingSegment as number;
  const seg = v.segments?.[j];
  if (!seg || !(seg.forcePerLength > 0)) return null;
  const qHat = seg.forcePerLength / v.demand;
  const F = rule.stress === 'fy' ? p.fy : p.fu;
  const nominal = (rule.k * F * p.thickness * stressArea(ctx)) / qHat;
  const steps: Step[] = [
    {
      label: `Largest force per unit length on the part's segments (segment s${j}), per unit load`,
      tex: eq('\\hat q', '\\dfrac{q_{\\max}}{P}', `\\dfrac{${q(ctx, seg.forcePerLength, 'perLength')}}{${q(ctx, v.demand, 'force')}}`, `${texNum(qHat)}\\,\\mathrm{${ctx.u.length}}^{-1}`),
      ref: '',
    },
    {
      label: `${rule.label}, plane t × unit length along segment s${j}`,
      tex: eq('R_{n}', `\\dfrac{${rule.factor}${rule.symbol}\\,t}{\\hat q}`, `\\dfrac{${rule.k === 1 ? '' : '0.60\\times '}${q(ctx, F, 'stress')}\\times ${q(ctx, p.thickness, 'length')}}{${texNum(qHat)}\\,\\mathrm{${ctx.u.length}}^{-1}}`, q(ctx, check.nominal, 'force')),
      ref: `${check.clause ? `${check.clause}, ` : ''}${rule.ref}`,
    },
  ];
  return { steps, nominal };
}

// ------------------------------------------------------------------ groove welds

export const LOAD_CASE_WORDS: Record<string, string> = {
  'tension-normal': 'tension normal to the weld axis',
  'compression-column-bearing': 'compression, column finished to bear',
  'compression-member-bearing': 'compression, member finished to bear',
  'compression-not-bearing': 'compression, not finished to bear',
  parallel: 'tension or compression parallel to the weld axis',
  shear: 'shear',
};

const FLARE_FRACTIONS: Array<[number, string]> = [
  [5 / 8, '\\tfrac{5}{8}'],
  [3 / 4, '\\tfrac{3}{4}'],
  [5 / 16, '\\tfrac{5}{16}'],
  [1 / 2, '\\tfrac{1}{2}'],
];

function pjpThroatSteps(ctx: DerivationContext): { steps: Step[]; throat: number } | null {
  const v = ctx.answer.values as Any;
  if (!v || !Array.isArray(v.sides)) return null;
  const steps: Step[] = [];
  const two = v.sides.length > 1;
  let total = 0;
  (v.sides as Any[]).forEach((s, i) => {
    const sub = two ? `_{${i + 1}}` : '';
    const side = two ? ` (side ${i + 1})` : '';
    total += s.throat;
    if (v.throatSource === 'qualified') {
      steps.push({ label: `Effective throat qualified by procedure tests${side}`, tex: eq(`E${sub}`, q(ctx, s.throat, 'length')), ref: `${SPEC} §J2.1a` });
    } else if (v.throatSource === 'Table J2.2') {
      const k = s.throat / v.radius;
      const frac = FLARE_FRACTIONS.find(([f]) => Math.abs(f - k) < 1e-9)?.[1] ?? texNum(k);
      steps.push({ label: `Flare groove effective throat${side}`, tex: eq(`E${sub}`, `${frac}\\,R`, `${frac}\\times ${q(ctx, v.radius, 'length')}`, q(ctx, s.throat, 'length')), ref: `${SPEC} Table J2.2` });
    } else if (s.deduction > 0) {
      steps.push({ label: `Effective throat, depth of groove less the deduction${side}`, tex: eq(`E${sub}`, `S${sub}-${q(ctx, s.deduction, 'length')}`, `${q(ctx, s.depth, 'length')}-${q(ctx, s.deduction, 'length')}`, q(ctx, s.throat, 'length')), ref: `${SPEC} Table J2.1` });
    } else {
      steps.push({ label: `Effective throat, the depth of groove${side}`, tex: eq(`E${sub}`, `S${sub}`, q(ctx, s.throat, 'length')), ref: `${SPEC} Table J2.1` });
    }
  });
  if (two) steps.push({ label: 'Effective throat of the joint', tex: eq('E', 'E_{1}+E_{2}', (v.sides as Any[]).map((s) => texNum(s.throat)).join('+'), q(ctx, v.throat, 'length')), ref: `${SPEC} §J2.1a` });
  return { steps, throat: total };
}

function pjpWeldMetal(ctx: DerivationContext, check: CheckItemLike): Derivation | null {
  const v = ctx.answer.values as Any;
  const t = pjpThroatSteps(ctx);
  if (!t || v.weldStress === null || v.weldStress === undefined) return null;
  const steps = t.steps;
  const area = t.throat * v.length;
  steps.push({ label: 'Effective area', tex: eq('A_{we}', 'E\\,L', `${q(ctx, t.throat, 'length')}\\times ${q(ctx, v.length, 'length')}`, q(ctx, v.area, 'area')), ref: `${SPEC} §J2.1a` });
  const k = v.weldStress / v.fexx;
  const kText = Math.abs(k - 0.9) < 1e-9 ? '0.90' : '0.60';
  const Fn = Number(kText) * v.fexx;
  steps.push({ label: `Weld stress, ${LOAD_CASE_WORDS[String(v.loadCase)] ?? String(v.loadCase)}`, tex: eq('F_{nw}', `${kText}\\,F_{\\mathrm{EXX}}`, `${kText}\\times ${q(ctx, v.fexx, 'stress')}`, q(ctx, v.weldStress, 'stress')), ref: `${SPEC} Table J2.5` });
  steps.push({ label: 'Nominal strength of the weld metal', tex: eq('R_{n}', 'F_{nw}\\,A_{we}', `${q(ctx, Fn, 'stress')}\\times ${q(ctx, area, 'area')}`, q(ctx, check.nominal, 'force')), ref: `${SPEC} ${check.equation || 'Eq. J2-3'}` });
  return { steps, nominal: Fn * area * stressArea(ctx) };
}

// ------------------------------------------------------------------ plug and slot welds

function plugSlotWeldMetal(ctx: DerivationContext, check: CheckItemLike): Derivation | null {
  const v = ctx.answer.values as Any;
  const hole = ctx.body.hole as Any | undefined;
  if (!v || !hole) return null;
  const steps: Step[] = [];
  let A1: number;
  if (v.shape === 'plug') {
    const d = len(hole.diameter);
    A1 = (Math.PI * d * d) / 4;
    steps.push({ label: 'Area of one plug in the faying plane', tex: eq('A_{1}', '\\dfrac{\\pi d^{2}}{4}', `\\dfrac{\\pi\\times(${q(ctx, d, 'length')})^{2}}{4}`, q(ctx, v.area, 'area')), ref: `${SPEC} §J2.3a` });
  } else {
    const L = len(hole.length);
    const W = len(hole.width);
    const ends = hole.ends === undefined ? ['semicircular', 'semicircular'] : typeof hole.ends === 'string' ? [hole.ends, hole.ends] : hole.ends;
    if (ends[0] === 'semicircular' && ends[1] === 'semicircular') {
      A1 = (L - W) * W + (Math.PI * W * W) / 4;
      steps.push({ label: 'Area of one slot with semicircular ends', tex: eq('A_{1}', '(L-W)\\,W+\\dfrac{\\pi W^{2}}{4}', `(${texNum(L)}-${texNum(W)})\\times ${texNum(W)}+\\dfrac{\\pi\\times ${texNum(W)}^{2}}{4}`, q(ctx, v.area, 'area')), ref: `${SPEC} §J2.3a` });
    } else {
      A1 = v.area;
      steps.push({ label: `Area of one slot (ends: ${ends.join(', ')}): L × W less the ends' cut-outs`, tex: eq('A_{1}', q(ctx, v.area, 'area')), ref: `${SPEC} §J2.3a` });
    }
  }
  const Awe = v.count * A1;
  steps.push({ label: `Effective area of the ${v.count} ${v.shape === 'plug' ? 'plug' : 'slot'}${v.count > 1 ? 's' : ''}`, tex: eq('A_{we}', 'n\\,A_{1}', `${v.count}\\times ${q(ctx, v.area, 'area')}`, q(ctx, v.effectiveArea, 'area')), ref: `${SPEC} §J2.3a` });
  const Fn = 0.6 * v.fexx;
  steps.push({ label: 'Weld stress, shear in the faying plane', tex: eq('F_{nw}', '0.60\\,F_{\\mathrm{EXX}}', `0.60\\times ${q(ctx, v.fexx, 'stress')}`, q(ctx, Fn, 'stress')), ref: `${SPEC} Table J2.5` });
  steps.push({ label: 'Nominal strength of the weld metal', tex: eq('R_{n}', 'F_{nw}\\,A_{we}', `${q(ctx, Fn, 'stress')}\\times ${q(ctx, Awe, 'area')}`, q(ctx, check.nominal, 'force')), ref: `${SPEC} ${check.equation || 'Eq. J2-3'}` });
  return { steps, nominal: Fn * Awe * stressArea(ctx) };
}

// ------------------------------------------------------------------ eccentric weld groups

function groupSegments(v: Any): Segment[] {
  return (v.segments as Any[]).map((s) => ({ from: [s.from[0], s.from[1]] as const, to: [s.to[0], s.to[1]] as const }));
}

function weldGroupIcr(ctx: DerivationContext, check: CheckItemLike): Derivation | null {
  const v = ctx.answer.values as Any;
  if (!v || !v.critical) return null;
  const c = v.critical as Any;
  const w = v.size as number;
  const steps: Step[] = [];
  steps.push({ label: 'Strength of an element of weld (load–deformation law)', tex: 'R_{i}=0.60\\,F_{\\mathrm{EXX}}\\,A_{w,i}\\left(1.0+0.50\\sin^{1.5}\\theta_{i}\\right)\\left[p_{i}\\left(1.9-0.9\\,p_{i}\\right)\\right]^{0.3}', ref: 'AISC Manual Part 8; AISC 360-22 Eq. J2-5' });
  steps.push({ label: 'Deformation of an element at ultimate and at peak load', tex: '\\Delta_{u}=1.087\\left(\\theta+6\\right)^{-0.65}w\\le 0.17\\,w,\\qquad \\Delta_{m}=0.209\\left(\\theta+2\\right)^{-0.32}w', ref: 'AISC Manual Part 8' });
  steps.push({ label: 'Each element deforms in proportion to its distance from the centre', tex: '\\Delta_{i}=\\dfrac{r_{i}}{r_{c}}\\,\\Delta_{u,c},\\qquad p_{i}=\\dfrac{\\Delta_{i}}{\\Delta_{m,i}}', ref: 'AISC Manual Part 8' });
  const du = Math.min(1.087 * Math.pow(c.angle + 6, -0.65) * w, 0.17 * w);
  steps.push({
    label: `Critical element: segment s${c.segment} at (${fmtPlain(c.point[0])}, ${fmtPlain(c.point[1])}), θ = ${fmtPlain(c.angle)}°`,
    tex: eq('\\Delta_{u,c}', '1.087\\left(\\theta_{c}+6\\right)^{-0.65}w', `1.087\\times\\left(${texNum(c.angle)}+6\\right)^{-0.65}\\times ${q(ctx, w, 'length')}`, q(ctx, c.deformation, 'length')),
    ref: 'AISC Manual Part 8',
  });
  if (v.centre) {
    steps.push({ label: 'Instantaneous centre; its distance from the centroid, and from the critical element', tex: eq('(x_{0},\\,y_{0})', `(${texNum(v.centre[0])},\\,${texNum(v.centre[1])})\\,\\mathrm{${ctx.u.length}}`) + `,\\quad ${eq('r_{0}', q(ctx, v.centreDistance, 'length'))},\\quad ${eq('r_{c}', q(ctx, c.radius, 'length'))}`, ref: 'AISC Manual Part 8' });
  }
  steps.push({
    label: `Nominal strength: the load at which the ${v.elements} element forces balance it (two forces, one moment)`,
    tex: `\\sum F_{x}=0,\\ \\sum F_{y}=0,\\ \\sum M=0:\\quad ${eq('R_{n}', 'P', q(ctx, check.nominal, 'force'))}`,
    ref: 'AISC Manual Part 8',
  });
  if (v.coefficient) {
    const k = v.coefficient as Any;
    steps.push({
      label: `Coefficient of the group, kip per sixteenth per inch${ctx.metric ? ' (converted)' : ''}`,
      tex: eq('C', '\\dfrac{R_{n}}{D\\,l}', `\\dfrac{${texNum(ctx.metric ? check.nominal / 4.4482216152605 : check.nominal)}}{${texNum(k.sixteenths)}\\times ${texNum(ctx.metric ? k.referenceLength / 25.4 : k.referenceLength)}}`, texNum(k.C)),
      ref: 'AISC Manual Part 8',
    });
  }
  return { steps, nominal: null, agreements: [['deformation at ultimate of the critical element', du, c.deformation]] };
}

function weldGroupElastic(ctx: DerivationContext, check: CheckItemLike): Derivation | null {
  const v = ctx.answer.values as Any;
  if (!v || !v.elastic || !Array.isArray(v.segments)) return null;
  const steps: Step[] = [];
  if (v.elastic.outOfPlane) {
    steps.push({ label: 'Direct, torsional and bending stresses per unit load, combined at the most stressed point', tex: '\\hat f=\\sqrt{\\hat f_{x}^{2}+\\hat f_{y}^{2}+\\hat f_{z}^{2}}', ref: 'AISC Manual Part 8' });
    steps.push({ label: `Nominal strength at the critical point of segment s${v.elastic.critical.segment}`, tex: eq('R_{n}', '\\dfrac{0.60\\,F_{\\mathrm{EXX}}}{\\hat f}', q(ctx, check.nominal, 'force')), ref: 'AISC Manual Part 8; AISC 360-22 Eq. J2-4' });
    return { steps, nominal: null };
  }
  const segs = groupSegments(v);
  const throats = (v.segments as Any[]).map((s) => s.throat as number);
  const props = groupProperties(segs, throats);
  const [cx, cy] = props.centroid;
  const [dx, dy] = v.direction as [number, number, number];
  const ax = v.loadPoint[0] - cx;
  const ay = v.loadPoint[1] - cy;
  const m = ax * dy - ay * dx; // moment of the unit load about the centroid (counter-clockwise +)
  const [px, py] = v.elastic.critical.point as [number, number];
  const x = px - cx;
  const y = py - cy;
  const fx = dx / props.area - (m * y) / props.polar;
  const fy = dy / props.area + (m * x) / props.polar;
  const f = Math.hypot(fx, fy);
  const Fn = 0.6 * v.fexx;
  const inv = `\\mathrm{${ctx.u.length}}^{-2}`;
  steps.push({ label: 'Effective area of the group', tex: eq('A_{w}', '\\sum t_{e}\\,l', q(ctx, props.area, 'area')), ref: '' });
  steps.push({ label: 'Polar moment of the effective area about the centroid', tex: eq('I_{p}', '\\sum t_{e}\\,l\\left(r^{2}+\\dfrac{l^{2}}{12}\\right)', `${texNum(props.polar)}\\,\\mathrm{${ctx.u.length}}^{4}`), ref: '' });
  steps.push({ label: 'Moment of a unit load about the centroid', tex: eq('\\hat M', 'e', q(ctx, m, 'length')), ref: '' });
  steps.push({
    label: `Stress per unit load at the critical point, (${fmtPlain(x)}, ${fmtPlain(y)}) from the centroid`,
    tex: `${eq('\\hat f_{x}', '\\dfrac{\\cos\\alpha}{A_{w}}-\\dfrac{\\hat M\\,y}{I_{p}}', `${texNum(fx)}\\,${inv}`)},\\quad ${eq('\\hat f_{y}', '\\dfrac{\\sin\\alpha}{A_{w}}+\\dfrac{\\hat M\\,x}{I_{p}}', `${texNum(fy)}\\,${inv}`)}`,
    ref: 'AISC Manual Part 8',
  });
  steps.push({ label: 'Resultant stress per unit load', tex: eq('\\hat f', '\\sqrt{\\hat f_{x}^{2}+\\hat f_{y}^{2}}', `${texNum(f)}\\,${inv}`), ref: '' });
  steps.push({ label: 'Nominal strength, without the directional increase', tex: eq('R_{n}', '\\dfrac{0.60\\,F_{\\mathrm{EXX}}}{\\hat f}', `\\dfrac{0.60\\times ${q(ctx, v.fexx, 'stress')}}{${texNum(f)}\\,${inv}}`, q(ctx, check.nominal, 'force')), ref: 'AISC Manual Part 8; AISC 360-22 Eq. J2-4' });
  return { steps, nominal: (Fn / f) * stressArea(ctx) };
}

function weldGroupConcentric(ctx: DerivationContext, check: CheckItemLike): Derivation | null {
  const v = ctx.answer.values as Any;
  if (!v || !Array.isArray(v.segments)) return null;
  const segs = groupSegments(v);
  const [dx, dy] = v.direction as [number, number, number];
  const angles = segs.map((s) => loadAngle(s, dx, dy));
  const areas = (v.segments as Any[]).map((s) => (s.throat as number) * (s.length as number));
  const sa = stressArea(ctx);
  const Fn = 0.6 * v.fexx;
  const steps: Step[] = [];
  const many = segs.length > 8;
  let nominal: number;
  if (v.concentricRule === 'linear') {
    const parts = angles.map((a, i) => Fn * kds(a) * areas[i]! * sa);
    if (!many) {
      segs.forEach((_, i) => {
        steps.push({
          label: `Segment s${i}: θ = ${fmtPlain(angles[i]!)}°`,
          tex: eq(`R_{n,${i}}`, '0.60\\,F_{\\mathrm{EXX}}\\left(1.0+0.50\\sin^{1.5}\\theta\\right)t_{e}\\,l', `0.60\\times ${q(ctx, v.fexx, 'stress')}\\times\\left(1.0+0.50\\sin^{1.5}${texNum(angles[i]!)}^{\\circ}\\right)\\times ${q(ctx, areas[i]!, 'area')}`, q(ctx, parts[i]!, 'force')),
          ref: `${SPEC} Eq. J2-5`,
        });
      });
    }
    nominal = parts.reduce((a, b) => a + b, 0);
    steps.push({ label: 'Nominal strength of the linear group', tex: eq('R_{n}', '\\sum R_{n,i}', q(ctx, check.nominal, 'force')), ref: `${SPEC} ${check.equation}` });
  } else if (v.concentricRule === 'mixed-J2-6a' || v.concentricRule === 'mixed-J2-6b') {
    let Rnwl = 0;
    let Rnwt = 0;
    angles.forEach((a, i) => {
      if (a <= 1e-7) Rnwl += Fn * areas[i]! * sa;
      else Rnwt += Fn * areas[i]! * sa;
    });
    steps.push({ label: 'Longitudinal segments together', tex: eq('R_{nwl}', '0.60\\,F_{\\mathrm{EXX}}\\sum_{\\theta=0} t_{e}\\,l', q(ctx, Rnwl, 'force')), ref: `${SPEC} §J2.4` });
    steps.push({ label: 'Transverse segments together', tex: eq('R_{nwt}', '0.60\\,F_{\\mathrm{EXX}}\\sum_{\\theta=90^{\\circ}} t_{e}\\,l', q(ctx, Rnwt, 'force')), ref: `${SPEC} §J2.4` });
    const a = Rnwl + Rnwt;
    const b = 0.85 * Rnwl + 1.5 * Rnwt;
    steps.push({ label: 'Mixed group, first rule', tex: eq('R_{n,a}', 'R_{nwl}+R_{nwt}', `${texNum(Rnwl)}+${texNum(Rnwt)}`, q(ctx, a, 'force')), ref: `${SPEC} Eq. J2-6a` });
    steps.push({ label: 'Mixed group, second rule', tex: eq('R_{n,b}', '0.85\\,R_{nwl}+1.5\\,R_{nwt}', `0.85\\times ${texNum(Rnwl)}+1.5\\times ${texNum(Rnwt)}`, q(ctx, b, 'force')), ref: `${SPEC} Eq. J2-6b` });
    nominal = Math.max(a, b);
    steps.push({ label: 'Nominal strength: the larger', tex: eq('R_{n}', '\\max\\left(R_{n,a},\\,R_{n,b}\\right)', q(ctx, check.nominal, 'force')), ref: `${SPEC} ${check.equation}` });
  } else {
    const Awe = areas.reduce((x, y) => x + y, 0);
    nominal = Fn * Awe * sa;
    steps.push({ label: 'Effective area of the group', tex: eq('A_{we}', '\\sum t_{e}\\,l', q(ctx, Awe, 'area')), ref: '' });
    steps.push({ label: 'Nominal strength, no directional increase', tex: eq('R_{n}', '0.60\\,F_{\\mathrm{EXX}}\\,A_{we}', `0.60\\times ${q(ctx, v.fexx, 'stress')}\\times ${q(ctx, Awe, 'area')}`, q(ctx, check.nominal, 'force')), ref: `${SPEC} Eq. J2-4` });
  }
  return { steps, nominal };
}

function fmtPlain(x: number): string {
  if (Math.abs(x) < 1e-9) return '0';
  return Number(x.toPrecision(4)).toString();
}

// ------------------------------------------------------------------ dispatch

/**
 * A sizing answer (fillet-size) is the fillet check of the weld it recommends: the same lines,
 * read from that weld and the check's values.
 */
export function checkedWeldContext(ctx: DerivationContext): DerivationContext {
  if (ctx.kind !== 'fillet-size') return ctx;
  const v = ctx.answer.values as Any;
  const welds = v?.recommended?.welds;
  if (!v?.check || !Array.isArray(welds)) return ctx;
  return { ...ctx, kind: 'fillet', body: { ...ctx.body, welds }, answer: { ...ctx.answer, values: v.check } };
}

/** The lines that reach a check's nominal strength, or null when only the general lines apply. */
export function derive(context: DerivationContext, check: CheckItemLike): Derivation | null {
  if (check.applicable === false) return null;
  const ctx = checkedWeldContext(context);
  try {
    switch (check.code) {
      case 'FILLET_WELD_METAL':
        if (ctx.kind === 'fillet') return filletWeldMetal(ctx);
        if (ctx.kind === 'weld-group') return weldGroupConcentric(ctx, check);
        return null;
      case 'PJP_WELD_METAL':
        return pjpWeldMetal(ctx, check);
      case 'PLUG_SLOT_WELD_METAL':
        return plugSlotWeldMetal(ctx, check);
      case 'WELD_GROUP_ICR':
        return weldGroupIcr(ctx, check);
      case 'WELD_GROUP_ELASTIC':
        return weldGroupElastic(ctx, check);
      default:
        return baseMetal(ctx, check);
    }
  } catch {
    // A request shape the builder did not foresee: the general lines still carry the check.
    return null;
  }
}

/** The line from nominal to available strength. */
export function availableStep(ctx: DerivationContext, check: CheckItemLike): Step {
  if (check.phi !== undefined) {
    return { label: 'Design strength (LRFD)', tex: eq('\\phi R_{n}', `${check.phi.toFixed(2)}\\times ${q(ctx, check.nominal, 'force')}`, q(ctx, check.available, 'force')), ref: `${check.clause}` };
  }
  const omega = check.omega ?? Number.NaN;
  return { label: 'Allowable strength (ASD)', tex: eq('\\dfrac{R_{n}}{\\Omega}', `\\dfrac{${q(ctx, check.nominal, 'force')}}{${omega.toFixed(2)}}`, q(ctx, check.available, 'force')), ref: `${check.clause}` };
}

/** The line comparing the demand with the available strength, or null with no demand. */
export function ratioStep(ctx: DerivationContext, check: CheckItemLike): Step | null {
  if (!(check.demand > 0)) return null;
  const lrfd = check.phi !== undefined;
  const d = lrfd ? 'R_{u}' : 'R_{a}';
  const a = lrfd ? '\\phi R_{n}' : 'R_{n}/\\Omega';
  const ok = check.pass;
  return {
    label: ok ? 'Demand over available strength: adequate' : 'Demand over available strength: NOT adequate',
    tex: `${eq(`\\dfrac{${d}}{${a}}`, `\\dfrac{${q(ctx, check.demand, 'force')}}{${q(ctx, check.available, 'force')}}`, texNum(check.ratio, 3))}\\ ${ok ? '\\le' : '>'}\\ 1.0`,
    ref: '',
  };
}
