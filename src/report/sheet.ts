/**
 * The calculation sheet of an answer: one self-contained HTML document (inline CSS, MathML and
 * SVG; no script, no request to anywhere) that a reviewer can follow line by line and file.
 *
 * Layout, top to bottom: the title block (project, connection mark, prepared and checked by,
 * date, from the request's `sheet` fields); the answer in one paragraph (status, the governing
 * limit state and its utilization); 1 Inputs; 2 Figure; 3 Strength checks, each as symbol =
 * formula = substituted numbers = result with its clause and equation; 4 Detailing limits,
 * required against provided; 5 Warnings; the caution; and the provenance (engine version, the
 * SHA-256 of the canonical request and the request itself, to reproduce the sheet).
 */
import { availableStep, checkedWeldContext, derive, ratioStep, type DerivationContext, type Step } from './derivations.js';
import { figureFor, type Figure } from './figures.js';
import { canonicalJson, requestHash } from './hash.js';
import { inputRows } from './inputs.js';
import { mathml } from './math.js';
import type { CheckItemLike, LimitItemLike, SheetAnswer, SheetHeader, SheetOperation } from './sheet-types.js';
import { SHEET_CSS } from './style.js';
import { esc, fmt, fmtFactor, fmtRatio, unitText, type Dimension } from './text.js';

export interface SheetInput {
  op: SheetOperation;
  answer: SheetAnswer;
  /** The request as the operation received it. */
  body: Record<string, unknown>;
}

/** The name of each kind of sheet. */
export const SHEET_TITLES: Record<string, string> = {
  fillet: 'Fillet weld check',
  'base-metal': 'Base metal along weld lines',
  'plug-slot': 'Plug and slot weld check',
  'groove-pjp': 'PJP groove weld check',
  'groove-cjp': 'CJP groove weld check',
  'weld-group': 'Eccentric weld group check',
  'fillet-size': 'Fillet weld sizing',
};

function sheetTitle(op: SheetOperation): string {
  return SHEET_TITLES[op.kind] ?? op.summary;
}

const LIMIT_DIMENSION: Record<string, Dimension> = { CJP_FILLER_MATCHING: 'stress' };

/** An imperial length as a fraction of 1/16 or 1/32 in when it is one exactly: 0.1875 → 3/16. */
function fraction(x: number): string | null {
  for (const den of [16, 32]) {
    const n = x * den;
    if (Math.abs(n - Math.round(n)) < 1e-9 && Math.round(n) > 0) {
      let num = Math.round(n);
      let d = den;
      while (num % 2 === 0 && d > 1) {
        num /= 2;
        d /= 2;
      }
      const whole = Math.floor(num / d);
      const rest = num % d;
      if (d === 1) return null;
      return whole > 0 ? `${whole}-${rest}/${d}` : `${rest}/${d}`;
    }
  }
  return null;
}

function quantity(x: number, dim: Dimension, answer: SheetAnswer): string {
  const unit = unitText(answer.units, dim);
  const frac = dim === 'length' && answer.units.length === 'in' ? fraction(x) : null;
  return `${fmt(x)}${unit ? `\u00a0${esc(unit)}` : ''}${frac ? ` <span class="note">(${frac})</span>` : ''}`;
}

function partName(i: number | undefined): string {
  return i === undefined ? '' : `part ${i + 1}`;
}

function checkLabel(c: CheckItemLike): string {
  return `${c.title}${c.part !== undefined ? `, ${partName(c.part)}` : ''}`;
}

function stepRow(s: Step, cls = ''): string {
  return `<tr${cls ? ` class="${cls}"` : ''}><td class="line"><div class="what"><span>${esc(s.label)}</span><span class="ref">${esc(s.ref)}</span></div><div class="eq">${mathml(s.tex)}</div></td></tr>`;
}

/** The id prefix made safe for attributes. */
function idSafe(s: string): string {
  return s.replace(/[^A-Za-z0-9_-]/g, '-');
}

/** Prefixes every id (and every reference to one) in an SVG figure drawn elsewhere. */
export function prefixSvgIds(svg: string, prefix: string): string {
  return svg
    .replace(/\bid="([^"]+)"/g, (_, id: string) => `id="${prefix}-${id}"`)
    .replace(/url\(#([^)]+)\)/g, (_, id: string) => `url(#${prefix}-${id})`)
    .replace(/\bhref="#([^"]+)"/g, (_, id: string) => `href="#${prefix}-${id}"`)
    .replace(/\baria-labelledby="([^"]+)"/g, (_, id: string) => `aria-labelledby="${prefix}-${id}"`);
}

function figureOf(input: SheetInput, prefix: string): Figure | null {
  const { op } = input;
  const c = checkedWeldContext({ kind: op.kind, body: input.body, answer: input.answer, u: input.answer.units, metric: input.answer.units.length === 'mm' });
  const { body, answer } = c;
  const own = figureFor({ kind: c.kind, body: body as Record<string, never>, values: answer.values as Record<string, never>, u: answer.units, ids: `${prefix}-fig` });
  if (own) return own;
  const svg = op.formats?.svg;
  if (svg) {
    try {
      const drawn = (svg.render as unknown as (a: unknown, b: unknown) => string)(answer, body);
      return { svg: prefixSvgIds(drawn.replace(/^<\?xml[^>]*>\s*/, ''), `${prefix}-fig`), caption: 'The weld group to scale with the load, the centroid, the instantaneous centre and the element forces at capacity.' };
    } catch {
      return null;
    }
  }
  return null;
}

function titleBlock(input: SheetInput, header: SheetHeader, hash: string): string {
  const { op, answer } = input;
  const mark = header.mark ?? answer.id ?? '';
  const cell = (k: string, v: string | undefined, cls = ''): string => `<td class="k">${esc(k)}</td><td class="v${cls}" data-field="${esc(k.toLowerCase().replace(/[^a-z]+/g, '-'))}">${v ? esc(v) : ''}</td>`;
  return `<header class="title-block">
<div class="banner"><h1>${esc(sheetTitle(op))}${mark ? ` — ${esc(mark)}` : ''}</h1><span class="what">Calculation sheet · Throatline</span></div>
<table>
<tr>${cell('Project', header.project)}${cell('Standard', `${answer.basis.standard}, ${answer.basis.method}`)}</tr>
<tr>${cell('Connection', mark)}${cell('Units', `${answer.units.length}, ${answer.units.force}, ${answer.units.stress}`)}</tr>
<tr>${cell('Prepared by', header.preparedBy)}${cell('Date', header.date)}</tr>
<tr>${cell('Checked by', header.checkedBy)}${cell('Signature', '')}</tr>
</table>
<div class="banner" style="border-bottom:0;border-top:1.2px solid var(--ink)"><span class="what">Request SHA-256 <span class="mono" style="text-transform:none">${hash.slice(0, 16)}…</span></span><span class="what">${esc(answer.basis.engine)}</span></div>
</header>`;
}

function verdict(answer: SheetAnswer): string {
  const fail = answer.status === 'fail';
  const g = answer.governing;
  const gov = answer.checks.find((c) => c.code === g.code && c.part === g.part) ?? answer.checks.find((c) => c.code === g.code);
  const lrfd = answer.basis.method === 'LRFD';
  const failedChecks = answer.checks.filter((c) => !c.pass);
  const failedLimits = answer.limits.filter((l) => !l.pass);
  const name = gov ? checkLabel(gov) : g.code;
  const demand = g.demand > 0;
  const strength = lrfd ? 'φRn' : 'Rn/Ω';
  const dsym = lrfd ? 'Ru' : 'Ra';
  const head = demand
    ? `Governing: ${esc(name)} — utilization ${fmtRatio(g.ratio)} (${dsym} = ${fmt(g.demand)} ${esc(answer.units.force)} ${g.ratio <= 1 + 1e-9 ? '≤' : '>'} ${strength} = ${fmt(g.available)} ${esc(answer.units.force)})`
    : `Governing: ${esc(name)} — the lowest available strength, ${strength} = ${fmt(g.available)} ${esc(answer.units.force)} (no required strength given)`;
  const subs: string[] = [];
  subs.push(
    `${answer.checks.length} strength check${answer.checks.length === 1 ? '' : 's'}${failedChecks.length ? `, ${failedChecks.length} not adequate` : ', all adequate'}; ` +
      `${answer.limits.length} detailing limit${answer.limits.length === 1 ? '' : 's'}${failedLimits.length ? `, ${failedLimits.length} not met (${failedLimits.map((l) => esc(l.title)).join('; ')})` : answer.limits.length ? ', all met' : ''}; ` +
      `${answer.warnings.length} warning${answer.warnings.length === 1 ? '' : 's'}.`,
  );
  return `<section class="verdict${fail ? ' fail' : ''}" data-status="${answer.status}">
<p class="governing" data-governing="${esc(g.code)}" data-utilization="${g.ratio}"><span class="status">${fail ? 'FAIL' : 'PASS'}</span>${head}</p>
<p class="sub">${subs.join(' ')}</p>
</section>`;
}

function inputsSection(input: SheetInput, n: number): string {
  const { op, answer, body } = input;
  // a sizing answer's materials are in the check of the weld it chose
  const v = checkedWeldContext({ kind: op.kind, body, answer, u: answer.units, metric: answer.units.length === 'mm' }).answer.values as Record<string, unknown> | null;
  const parts = (v && Array.isArray((v as { parts?: unknown }).parts) ? (v as { parts: Array<{ fy?: number; fu?: number }> }).parts : []) as Array<{ fy?: number; fu?: number }>;
  const annotate = (path: string, value: unknown): string => {
    if (typeof value !== 'string') return '';
    const m = /^parts\[(\d+)\]\.steel$/.exec(path);
    const p = m ? parts[Number(m[1])] : path === 'part.steel' ? (v as { fy?: number; fu?: number }) : undefined;
    const plain = (x: number): string => Number(x.toPrecision(4)).toString();
    if (p && typeof p.fy === 'number' && typeof p.fu === 'number') return `Fy ${plain(p.fy)}, Fu ${plain(p.fu)} ${answer.units.stress}`;
    if (path === 'electrode' && v && typeof (v as { fexx?: unknown }).fexx === 'number') return `FEXX ${plain((v as { fexx: number }).fexx)} ${answer.units.stress}`;
    return '';
  };
  const rows = inputRows(body, op.body as never, new Set(['sheet']), annotate);
  const tr = rows
    .map((r) => {
      const pad = `padding-left:${5 + r.depth * 12}px`;
      const note = r.note ? ` <span class="note">(${esc(r.note)})</span>` : '';
      if (r.heading) return `<tr class="heading"><td class="path mono" style="${pad}">${esc(r.path)}</td><td class="value">${esc(r.value)}${note}</td><td class="unit"></td><td class="label">${esc(r.label)}</td></tr>`;
      return `<tr><td class="path mono" style="${pad}">${esc(r.path)}</td><td class="value"><span data-path="${esc(r.path)}">${esc(r.value)}</span>${note}</td><td class="unit">${esc(unitText(answer.units, r.dim))}</td><td class="label">${esc(r.label)}</td></tr>`;
    })
    .join('\n');
  return `<section class="inputs"><h2>${n} Inputs</h2>
<table class="inputs"><thead><tr><th>Field</th><th>Value</th><th>Unit</th><th>What it is</th></tr></thead><tbody>
${tr}
</tbody></table>
<p class="note">As given in the request, in ${esc(answer.units.length)}, ${esc(answer.units.force)} and ${esc(answer.units.stress)}; ${answer.basis.method === 'LRFD' ? 'loads are factored (LRFD)' : 'loads are service loads (ASD)'}. Parts are numbered from 1 (parts[0] is part 1).</p>
</section>`;
}

function checkSection(ctx: DerivationContext, c: CheckItemLike, index: string, anchor: string): string {
  const head = `<div class="head"><h3>${esc(index)} ${esc(checkLabel(c))}</h3><span class="code">${esc(c.code)}</span></div>
<p class="clause">${esc([c.clause, c.equation].filter(Boolean).join(' · ') || 'no clause')}</p>`;
  const attrs = `class="check" id="${anchor}" data-code="${esc(c.code)}"${c.part !== undefined ? ` data-part="${c.part}"` : ''} data-pass="${c.pass}"`;
  if (c.applicable === false) {
    return `<section ${attrs} data-applicable="false">${head}<p class="exempt">Need not be checked: ${esc(c.note ?? 'the Specification exempts this load case.')}</p></section>`;
  }
  const d = derive(ctx, c);
  const steps: string[] = [];
  if (d) steps.push(...d.steps.map((s) => stepRow(s)));
  else steps.push(stepRow({ label: 'Nominal strength, from the engine', tex: `R_{n}=${texNumLocal(c.nominal)}\\,\\mathrm{${ctx.u.force}}`, ref: [c.clause, c.equation].filter(Boolean).join(', ') }));
  steps.push(stepRow(availableStep(ctx, c)));
  const r = ratioStep(ctx, c);
  if (r) steps.push(stepRow(r, 'decisive'));
  const lrfd = c.phi !== undefined;
  const f = lrfd ? c.phi! : c.omega ?? Number.NaN;
  const summary = `<table class="summary"><thead><tr><th>Rn</th><th>${lrfd ? 'φ' : 'Ω'}</th><th>${lrfd ? 'φRn' : 'Rn/Ω'}</th><th>${lrfd ? 'Ru' : 'Ra'}</th><th>ratio</th><th>result</th></tr></thead>
<tbody><tr><td data-field="nominal">${fmt(c.nominal)}</td><td data-field="${lrfd ? 'phi' : 'omega'}">${fmtFactor(f)}</td><td data-field="available">${fmt(c.available)}</td><td data-field="demand">${fmt(c.demand)}</td><td data-field="ratio">${c.demand > 0 ? fmtRatio(c.ratio) : '—'}</td><td data-field="pass">${c.pass ? '<span class="ok">OK</span>' : '<span class="ng">NOT OK</span>'}</td></tr></tbody></table>`;
  return `<section ${attrs}>${head}
<table class="steps"><tbody>
${steps.join('\n')}
</tbody></table>
${summary}
${c.note ? `<p class="note">${esc(c.note)}</p>` : ''}
</section>`;
}

function texNumLocal(x: number): string {
  return fmt(x).replace('−', '-');
}

function limitsSection(answer: SheetAnswer, n: number): string {
  if (answer.limits.length === 0) return `<section class="limits-section"><h2>${n} Detailing limits</h2><p>None apply to this check.</p></section>`;
  const rows = answer.limits
    .map((l: LimitItemLike) => {
      const dim = LIMIT_DIMENSION[l.code] ?? 'length';
      const where = [l.weld !== undefined ? `line ${l.weld + 1}` : '', l.part !== undefined ? partName(l.part) : ''].filter(Boolean).join(', ');
      return `<tr class="${l.pass ? 'pass' : 'fail'}" data-code="${esc(l.code)}"${l.weld !== undefined ? ` data-weld="${l.weld}"` : ''}${l.part !== undefined ? ` data-part="${l.part}"` : ''}>
<td>${esc(l.title)}<br><span class="code">${esc(l.code)}</span>${l.note ? `<br><span class="note">${esc(l.note)}</span>` : ''}</td><td class="note">${esc(l.clause)}</td><td>${esc(where)}</td>
<td class="num" data-field="required">${l.sense === 'min' ? '≥' : '≤'} ${quantity(l.required, dim, answer)}</td><td class="num" data-field="provided">${quantity(l.provided, dim, answer)}</td><td>${l.pass ? '<span class="ok">met</span>' : '<span class="ng">NOT MET</span>'}</td></tr>`;
    })
    .join('\n');
  return `<section class="limits-section"><h2>${n} Detailing limits</h2>
<table class="limits"><thead><tr><th>Rule</th><th>Clause</th><th>Applies to</th><th class="num">Required</th><th class="num">Provided</th><th>Result</th></tr></thead><tbody>
${rows}
</tbody></table></section>`;
}

const SIZING_COLUMNS: Array<[string, string, Dimension]> = [
  ['rank', 'Rank', 'none'],
  ['size', 'Size w', 'length'],
  ['length', 'Length', 'length'],
  ['layout', 'Layout', 'none'],
  ['segments', 'Segments', 'none'],
  ['pitch', 'Pitch', 'length'],
  ['lines', 'Lines', 'none'],
  ['totalLength', 'Total length', 'length'],
  ['passes', 'Passes', 'none'],
  ['utilization', 'Utilization', 'none'],
  ['governing', 'Governing', 'none'],
];

/** For a sizing answer: the weld chosen and the ranked alternatives. */
function sizingSection(answer: SheetAnswer, n: number): string {
  const v = answer.values as { recommended?: Record<string, unknown> | null; alternatives?: Array<Record<string, unknown>>; closest?: Record<string, unknown> | null; blocking?: { message?: string } | null };
  const rows = [v.recommended ?? v.closest, ...(v.alternatives ?? [])].filter((r): r is Record<string, unknown> => !!r && typeof r === 'object');
  if (rows.length === 0) return '';
  const intermittent = rows.some((r) => r.layout === 'intermittent');
  const columns = SIZING_COLUMNS.filter(([k]) => intermittent || (k !== 'segments' && k !== 'pitch'));
  const cell = (r: Record<string, unknown>, [k]: [string, string, Dimension]): string => {
    const x = r[k];
    if (typeof x === 'number') return `<td class="num">${k === 'utilization' ? fmtRatio(x) : fmt(x)}</td>`;
    if (x === null || x === undefined) return '<td class="num">—</td>';
    return `<td${k === 'governing' ? ' class="code"' : ''}>${esc(String(x))}</td>`;
  };
  const head = (c: [string, string, Dimension]): string => {
    const unit = unitText(answer.units, c[2]);
    return `<th${c[2] === 'none' && c[0] !== 'utilization' && c[0] !== 'passes' && c[0] !== 'rank' && c[0] !== 'segments' && c[0] !== 'lines' ? '' : ' class="num"'}>${esc(c[1])}${unit ? ` (${esc(unit)})` : ''}</th>`;
  };
  const body = rows.map((r, i) => `<tr${i === 0 ? ' class="heading"' : ''}>${columns.map((c) => cell(r, c)).join('')}</tr>`).join('\n');
  return `<section class="sizing"><h2>${n} Weld chosen and alternatives</h2>
${v.recommended ? '<p>The first row is the weld the search recommends; the strength checks below are its checks.</p>' : `<p class="ng">No weld complies${v.blocking?.message ? `: ${esc(v.blocking.message)}` : ''}. The first row is the strongest weld searched; the checks below are its checks.</p>`}
<table class="limits"><thead><tr>${columns.map(head).join('')}</tr></thead><tbody>
${body}
</tbody></table></section>`;
}

function warningsSection(answer: SheetAnswer, n: number): string {
  const items = answer.warnings.map((w) => `<li data-code="${esc(w.code)}"><span class="code">${esc(w.code)}</span> ${esc(w.message)}</li>`).join('\n');
  return `<section class="warnings-section"><h2>${n} Warnings</h2>${items ? `<ul class="warnings">\n${items}\n</ul>` : '<p>None.</p>'}</section>`;
}

/** The sheet as an article, for a page of its own or for a batch page; ids are prefixed with `prefix`. */
export function renderSheetArticle(input: SheetInput, prefix = 'sheet'): string {
  const { op, answer, body } = input;
  const header = ((body as { sheet?: SheetHeader }).sheet ?? {}) as SheetHeader;
  const hash = requestHash(body);
  const ctx: DerivationContext = { kind: op.kind, body, answer, u: answer.units, metric: answer.units.length === 'mm' };
  const pre = idSafe(prefix);
  const figure = figureOf(input, pre);
  let n = 1;
  const parts: string[] = [];
  parts.push(titleBlock(input, header, hash));
  parts.push(verdict(answer));
  parts.push(inputsSection(input, n++));
  if (op.kind === 'fillet-size') {
    const sizing = sizingSection(answer, n);
    if (sizing) {
      parts.push(sizing);
      n++;
    }
  }
  if (figure) {
    parts.push(`<section class="figure-section"><h2>${n++} Figure</h2><figure id="${pre}-figure">${figure.svg}<figcaption>${esc(figure.caption)}</figcaption></figure></section>`);
  }
  const checksN = n++;
  parts.push(
    `<section class="checks"><h2>${checksN} Strength checks</h2>
<p class="note">${answer.basis.method === 'LRFD' ? 'LRFD: design strength φRn against the required strength Ru.' : 'ASD: allowable strength Rn/Ω against the required strength Ra.'} Values rounded to four significant figures for display; the arithmetic uses the full values.</p>
${answer.checks.map((c, i) => checkSection(ctx, c, `${checksN}.${i + 1}`, `${pre}-check-${i + 1}`)).join('\n')}
</section>`,
  );
  parts.push(limitsSection(answer, n++));
  parts.push(warningsSection(answer, n++));
  parts.push(`<section class="caution"><h2>Caution</h2><p class="notice">${esc(answer.notice)}</p></section>`);
  parts.push(`<footer class="provenance">
<p>Computed by ${esc(answer.basis.engine)} to ${esc(answer.basis.standard)} (${esc(answer.basis.method)}), ${esc(op.path)}. The same request gives the same numbers from the same engine version.</p>
<p>Request SHA-256 (of the canonical form below: keys sorted, no spaces): <span class="mono hash" data-field="request-sha256">${hash}</span></p>
<pre class="mono request">${esc(canonicalJson(body))}</pre>
</footer>`);
  return `<article class="sheet" id="${pre}" data-kind="${esc(op.kind)}" data-status="${answer.status}" data-request-sha256="${hash}">
${parts.join('\n')}
</article>`;
}

/** CSS for the page footer when printed: the mark, the hash and the page count. */
function pageCss(foot: string): string {
  const s = foot.replace(/["\\\n\r]/g, ' ');
  return `@page { @bottom-left { content: "${s}"; font: 7.5pt sans-serif; color: #5f656d; } @bottom-right { content: "page " counter(page) " of " counter(pages); font: 7.5pt sans-serif; color: #5f656d; } }`;
}

export function htmlDocument(title: string, bodyHtml: string, foot: string, meta: Record<string, string> = {}): string {
  const metas = Object.entries(meta)
    .map(([k, v]) => `<meta name="${esc(k)}" content="${esc(v)}">`)
    .join('\n');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
${metas}
<title>${esc(title)}</title>
<style>${SHEET_CSS}
${pageCss(foot)}</style>
</head>
<body>
${bodyHtml}
</body>
</html>
`;
}

/** The sheet of one answer as a complete HTML document. */
export function renderSheet(input: SheetInput): string {
  const { op, answer, body } = input;
  const header = ((body as { sheet?: SheetHeader }).sheet ?? {}) as SheetHeader;
  const mark = header.mark ?? answer.id ?? '';
  const hash = requestHash(body);
  const title = `${mark ? `${mark} — ` : ''}${sheetTitle(op)} — Throatline calculation sheet`;
  const foot = `${mark ? `${mark} · ` : ''}${sheetTitle(op)} · request ${hash.slice(0, 12)} · ${answer.basis.engine}`;
  return htmlDocument(title, renderSheetArticle(input, 'sheet'), foot, { generator: answer.basis.engine, 'request-sha256': hash });
}
