/**
 * The calculation sheet (format=html) of every operation's examples, parsed with parse5 and
 * held to the JSON answer of the same request: every check with its clause, equation and
 * numbers; the limits as required against provided; the warnings; the governing line; the
 * caution; the request hash; and a document that loads nothing from anywhere else.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { app as build } from '../helpers.js';
import { OPERATIONS } from '../../src/operations/index.js';
import { all, attr, byAttr, byClass, byTag, hasClass, parseHtml, roundsTo, shown, sortedHash, text, type El } from './html.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

interface Answer {
  id?: string;
  status: string;
  utilization: number;
  governing: { code: string; part?: number; ratio: number; demand: number };
  checks: Array<{ code: string; part?: number; clause: string; equation: string; nominal: number; available: number; demand: number; ratio: number; pass: boolean; applicable?: boolean }>;
  limits: Array<{ code: string; required: number; provided: number; sense: 'min' | 'max'; pass: boolean }>;
  warnings: Array<{ code: string; message: string }>;
  notice: string;
}

const HEADER = { project: 'Two-storey workshop, grid B', mark: undefined as string | undefined, preparedBy: 'A. Engineer', checkedBy: 'B. Checker', date: '2025-03-14' };

const cases = OPERATIONS.flatMap((op) => Object.entries(op.examples).map(([name, ex]) => ({ op, name, body: { ...(ex.value as object), sheet: { ...HEADER, mark: `${(ex.value as { id?: string }).id ?? 'X'}-S` } } as Record<string, unknown> })));

async function sheetAndAnswer(path: string, body: Record<string, unknown>): Promise<{ html: string; answer: Answer; type: string }> {
  const [h, j] = await Promise.all([
    app.inject({ method: 'POST', url: `${path}?format=html`, payload: body }),
    app.inject({ method: 'POST', url: path, payload: body }),
  ]);
  expect(h.statusCode, h.body.slice(0, 400)).toBe(200);
  expect(j.statusCode).toBe(200);
  return { html: h.body, answer: j.json() as Answer, type: String(h.headers['content-type']) };
}

describe.each(cases)('$op.kind sheet of example $name', ({ op, body }) => {
  let html: string;
  let answer: Answer;
  let root: ReturnType<typeof parseHtml>['doc'];
  let errors: string[];

  beforeAll(async () => {
    const r = await sheetAndAnswer(op.path, body);
    html = r.html;
    answer = r.answer;
    expect(r.type).toMatch(/^text\/html/);
    ({ doc: root, errors } = parseHtml(html));
  });

  it('is a well-formed HTML document: doctype, no parse errors, unique ids, one title', () => {
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(errors).toEqual([]);
    const ids = all(root).map((e) => attr(e, 'id')).filter((x): x is string => x !== undefined);
    expect(new Set(ids).size).toBe(ids.length);
    expect(byTag(byTag(root, 'head')[0]!, 'title')).toHaveLength(1);
    expect(attr(byTag(root, 'html')[0]!, 'lang')).toBe('en');
    expect(byTag(root, 'meta').some((m) => attr(m, 'charset')?.toLowerCase() === 'utf-8')).toBe(true);
  });

  it('loads nothing from anywhere else: no script, no link, no external src or href, no @import', () => {
    expect(byTag(root, 'script')).toEqual([]);
    expect(byTag(root, 'link')).toEqual([]);
    for (const el of all(root)) {
      for (const a of el.attrs) {
        if (['src', 'href', 'xlink:href', 'action', 'poster', 'srcset'].includes(a.name)) expect(a.value, `${el.tagName} ${a.name}`).toMatch(/^#/);
      }
    }
    const css = byTag(root, 'style').map(text).join('\n');
    expect(css).not.toMatch(/@import/);
    expect(css).not.toMatch(/url\(\s*['"]?(https?:)?\/\//);
    // the only URL-like strings are the SVG namespace
    expect(html.replace(/http:\/\/www\.w3\.org\/[0-9]{4}\/(svg|Math\/MathML)/g, '')).not.toMatch(/https?:\/\//);
  });

  it('puts the governing limit state and utilization plainly at the top', () => {
    const gov = byClass(root, 'governing')[0]!;
    expect(attr(gov, 'data-governing')).toBe(answer.governing.code);
    const t = text(gov);
    expect(t).toMatch(answer.status === 'pass' ? /^PASS/ : /^FAIL/);
    expect(t).toContain('Governing:');
    if (answer.governing.demand > 0) expect(t).toContain(`utilization ${answer.governing.ratio.toFixed(3)}`);
    // it comes before the inputs
    const order = all(root);
    expect(order.indexOf(gov)).toBeLessThan(order.indexOf(byClass(root, 'inputs')[0]!));
  });

  it('shows the header fields from the request', () => {
    const cell = (f: string): string => text(byAttr(root, 'data-field', f)[0]!);
    const sheet = body.sheet as typeof HEADER;
    expect(cell('project')).toBe(sheet.project);
    expect(cell('connection')).toBe(sheet.mark);
    expect(cell('prepared-by')).toBe(sheet.preparedBy);
    expect(cell('checked-by')).toBe(sheet.checkedBy);
    expect(cell('date')).toBe(sheet.date);
  });

  it('lists every input field of the request with its value', () => {
    const values = byAttr(root, 'data-path');
    const paths = values.map((e) => attr(e, 'data-path'));
    // every top-level scalar of the request appears (the sheet header is in the title block)
    for (const [k, v] of Object.entries(body)) {
      if (k === 'sheet' || typeof v === 'object') continue;
      expect(paths, k).toContain(k);
      expect(text(values[paths.indexOf(k)]!)).toContain(String(v));
    }
  });

  it('has every strength check with its clause, equation, typeset lines and the answer\'s numbers', () => {
    const sections = byClass(root, 'check').filter((e) => e.tagName === 'section');
    expect(sections.map((s) => attr(s, 'data-code'))).toEqual(answer.checks.map((c) => c.code));
    answer.checks.forEach((c, i) => {
      const s = sections[i]!;
      expect(attr(s, 'data-part')).toBe(c.part === undefined ? undefined : String(c.part));
      const clause = text(byClass(s, 'clause')[0]!);
      if (c.clause) expect(clause).toContain(c.clause);
      if (c.equation) expect(clause).toContain(c.equation);
      if (c.applicable === false) {
        expect(text(s)).toContain('Need not be checked');
        return;
      }
      // symbol = formula = numbers = result, typeset as MathML: the nominal line, the available line, and the ratio with a demand
      const maths = byTag(s, 'math');
      expect(maths.length).toBeGreaterThanOrEqual(c.demand > 0 ? 3 : 2);
      const field = (f: string): string => text(byAttr(s, 'data-field', f)[0]!);
      expect(roundsTo(shown(field('nominal')), c.nominal), `nominal ${field('nominal')} vs ${c.nominal}`).toBe(true);
      expect(roundsTo(shown(field('available')), c.available), `available ${field('available')} vs ${c.available}`).toBe(true);
      expect(roundsTo(shown(field('demand')), c.demand)).toBe(true);
      if (c.demand > 0) expect(field('ratio')).toBe(c.ratio.toFixed(3));
      expect(field('pass')).toBe(c.pass ? 'OK' : 'NOT OK');
      // the last typeset line of a check with a demand is the ratio against 1.0
      if (c.demand > 0) expect(text(maths[maths.length - 1]!)).toContain(c.ratio.toFixed(3));
    });
  });

  it('gives every detailing limit as required against provided', () => {
    const rows = byAttr(root, 'data-code').filter((e) => e.tagName === 'tr');
    expect(rows.map((r) => attr(r, 'data-code'))).toEqual(answer.limits.map((l) => l.code));
    answer.limits.forEach((l, i) => {
      const r = rows[i]!;
      const req = text(byAttr(r, 'data-field', 'required')[0]!);
      expect(req.startsWith(l.sense === 'min' ? '≥' : '≤')).toBe(true);
      expect(roundsTo(shown(req), l.required), `${l.code} required ${req} vs ${l.required}`).toBe(true);
      expect(roundsTo(shown(text(byAttr(r, 'data-field', 'provided')[0]!)), l.provided)).toBe(true);
      expect(hasClass(r, l.pass ? 'pass' : 'fail')).toBe(true);
    });
  });

  it('lists the warnings with their codes and messages', () => {
    const items = byTag(byClass(root, 'warnings-section')[0]!, 'li');
    expect(items.map((li) => attr(li, 'data-code'))).toEqual(answer.warnings.map((w) => w.code));
    answer.warnings.forEach((w, i) => expect(text(items[i]!)).toContain(w.message));
  });

  it('has a figure in SVG', () => {
    const fig = byTag(root, 'figure')[0];
    expect(fig).toBeDefined();
    expect(byTag(fig!, 'svg').length).toBe(1);
    expect(byTag(fig!, 'figcaption').length).toBe(1);
  });

  it('ends with the caution, then the engine version and the SHA-256 of the canonical request', () => {
    const caution = byClass(root, 'caution')[0]!;
    expect(text(byClass(caution, 'notice')[0]!)).toBe(answer.notice);
    const prov = byClass(root, 'provenance')[0]!;
    const order = all(root);
    expect(order.indexOf(caution)).toBeLessThan(order.indexOf(prov));
    expect(text(prov)).toMatch(/throatline \d+\.\d+\.\d+/);
    expect(text(byAttr(prov, 'data-field', 'request-sha256')[0]!)).toBe(sortedHash(body));
    // the request printed there is the request itself
    expect(JSON.parse(text(byClass(prov, 'request')[0]!))).toEqual(body);
  });
});

describe('asking for a sheet', () => {
  const op = OPERATIONS.find((o) => o.kind === 'fillet')!;
  const body = Object.values(op.examples)[0]!.value as unknown as Record<string, unknown>;

  it('a browser\'s Accept header gets the sheet, a JSON client and */* get JSON', async () => {
    const browser = await app.inject({ method: 'POST', url: op.path, payload: body, headers: { accept: 'text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8' } });
    expect(browser.headers['content-type']).toMatch(/^text\/html/);
    for (const accept of ['application/json', '*/*', 'application/json, text/html;q=0.5']) {
      const r = await app.inject({ method: 'POST', url: op.path, payload: body, headers: { accept } });
      expect(r.headers['content-type'], accept).toMatch(/^application\/json/);
    }
  });

  it('the GET form answers the same sheet as the POST (same request hash), with header fields from the query', async () => {
    const q = 'method=LRFD&units=imperial&electrode=E70&welds.0.size=5/16&welds.0.length=10&welds.0.count=2&load.force=120&parts.0.thickness=0.5&parts.0.steel=A36&sheet.project=Workshop&sheet.date=14 March 2025';
    const get = await app.inject({ method: 'GET', url: `${op.path}?${encodeURI(q)}&format=html` });
    expect(get.statusCode).toBe(200);
    const post = await app.inject({
      method: 'POST',
      url: `${op.path}?format=html`,
      payload: { method: 'LRFD', units: 'imperial', electrode: 'E70', welds: [{ size: '5/16', length: 10, count: 2 }], load: { force: 120 }, parts: [{ thickness: 0.5, steel: 'A36' }], sheet: { project: 'Workshop', date: '14 March 2025' } },
    });
    expect(get.body).toBe(post.body);
  });

  it('the same request gives the same bytes; the sheet fields change the sheet, not the answer', async () => {
    const a = await app.inject({ method: 'POST', url: `${op.path}?format=html`, payload: body });
    const b = await app.inject({ method: 'POST', url: `${op.path}?format=html`, payload: body });
    expect(a.body).toBe(b.body);
    const plain = await app.inject({ method: 'POST', url: op.path, payload: body });
    const headed = await app.inject({ method: 'POST', url: op.path, payload: { ...body, sheet: { project: 'Other', checkedBy: 'C. D.' } } });
    expect(headed.json()).toEqual(plain.json());
  });

  it('refuses an unknown header field (400), like any other unknown field', async () => {
    const r = await app.inject({ method: 'POST', url: `${op.path}?format=html`, payload: { ...body, sheet: { projekt: 'typo' } } });
    expect(r.statusCode).toBe(400);
  });
});

describe('hand-checked substitutions', () => {
  async function lines(path: string, body: Record<string, unknown>, code: string): Promise<string> {
    const r = await app.inject({ method: 'POST', url: `${path}?format=html`, payload: body });
    const { doc } = parseHtml(r.body);
    const s = byClass(doc, 'check').find((e: El) => attr(e, 'data-code') === code)!;
    return byTag(s, 'math').map(text).join(' | ');
  }

  it('fillet, 5/16 in E70, two 10 in lines, LRFD', async () => {
    const t = await lines('/v1/fillet/check', { method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10, count: 2 }], load: { force: 120 }, parts: [{ thickness: 0.5, steel: 'A36' }] }, 'FILLET_WELD_METAL');
    // AISC 360-22 §J2.2a (from memory): te = w/√2 = 0.3125/1.41421 = 0.22097 in
    expect(t).toContain('0.2210');
    // Lw = 2 × 10 = 20.00 in; Awe = 0.22097 × 20 = 4.4194 in²
    expect(t).toContain('20.00');
    expect(t).toContain('4.419');
    // Table J2.5 (from memory): Fnw = 0.60 × 70 = 42.00 ksi; Rn = 42 × 4.4194 = 185.6 kip; φRn = 0.75 × 185.6 = 139.2 kip
    expect(t).toContain('42.00');
    expect(t).toContain('185.6');
    expect(t).toContain('139.2');
    // 120 / 139.2 = 0.862
    expect(t).toContain('0.862');
  });

  it('fillet at 90 degrees: the directional increase of Eq. J2-5', async () => {
    const t = await lines('/v1/fillet/check', { method: 'ASD', electrode: 'E70', welds: [{ size: 0.25, length: 6, angle: 90 }], load: { force: 20 }, parts: [{ thickness: 0.5, steel: 'A36' }] }, 'FILLET_WELD_METAL');
    // AISC 360-22 Eq. J2-5 (from memory): 0.60 × 70 × (1 + 0.5 × 1) = 63.00 ksi
    expect(t).toContain('63.00');
    // te = 0.25/√2 = 0.17678 in; Awe = 0.17678 × 6 = 1.0607 in²; Rn = 63 × 1.0607 = 66.82 kip; Rn/Ω = 66.82/2.00 = 33.41 kip
    expect(t).toContain('1.061');
    expect(t).toContain('66.82');
    expect(t).toContain('33.41');
  });

  it('PJP, 45-degree bevel 1/2 in deep, SMAW vertical, tension normal, ASD (WS-C07)', async () => {
    const op = OPERATIONS.find((o) => o.kind === 'groove-pjp')!;
    const t = await lines(op.path, op.examples.bracketBevel!.value as unknown as Record<string, unknown>, 'PJP_WELD_METAL');
    // AISC 360-22 Table J2.1 (from memory): E = S - 1/8 = 0.500 - 0.125 = 0.3750 in
    expect(t).toContain('0.3750');
    // Awe = 0.375 × 12 = 4.500 in²; Fnw = 0.60 × 70 = 42.00 ksi; Rn = 42 × 4.5 = 189.0 kip
    expect(t).toContain('4.500');
    expect(t).toContain('189.0');
    // Table J2.5 (from memory): Ω = 1.88; 189.0 / 1.88 = 100.5 kip
    expect(t).toContain('1.88');
    expect(t).toContain('100.5');
  });

  it('four 13/16 in plug welds, E70, LRFD (WS-CP2)', async () => {
    const op = OPERATIONS.find((o) => o.kind === 'plug-slot')!;
    const t = await lines(op.path, op.examples.coverPlatePlugs!.value as unknown as Record<string, unknown>, 'PLUG_SLOT_WELD_METAL');
    // AISC 360-22 §J2.3a (from memory): A = π d²/4 = 3.14159 × 0.8125² / 4 = 0.5185 in²
    expect(t).toContain('0.5185');
    // Awe = 4 × 0.51849 = 2.074 in²; Rn = 0.60 × 70 × 2.0739 = 87.11 kip; φRn = 0.75 × 87.106 = 65.33 kip
    expect(t).toContain('2.074');
    expect(t).toContain('87.11');
    expect(t).toContain('65.33');
  });

  it('base metal shear yielding of a 3/8 in A36 tab welded on both faces, 2 × 9 in (WS-B07)', async () => {
    const op = OPERATIONS.find((o) => o.kind === 'base-metal')!;
    const t = await lines(op.path, op.examples.shearTab!.value as unknown as Record<string, unknown>, 'BASE_METAL_SHEAR_YIELD');
    // plane length = 18 / 2 = 9.000 in; Agv = 0.375 × 9 = 3.375 in²
    expect(t).toContain('9.000');
    expect(t).toContain('3.375');
    // AISC 360-22 Eq. J4-3 (from memory): Rn = 0.60 × 36 × 3.375 = 72.90 kip; φ = 1.00, so φRn = 72.90 kip
    expect(t).toContain('36.00');
    expect(t).toContain('72.90');
    expect(t).toContain('1.00');
    // 60 / 72.90 = 0.823
    expect(t).toContain('0.823');
  });
});
