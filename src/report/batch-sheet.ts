/**
 * The HTML answer of a batch: one page that opens with a summary table (one row per item: id,
 * kind, status, utilization, governing code; failing items first, then items the service could
 * not answer, then passing ones), each row linking to the item's own sheet further down the
 * same page. Items that could not be answered show their problem instead of a sheet.
 */
import { requestHash } from './hash.js';
import { htmlDocument, renderSheetArticle, SHEET_TITLES } from './sheet.js';
import type { SheetAnswer, SheetOperation } from './sheet-types.js';
import { esc, fmtRatio } from './text.js';

/** Most items a batch may have for an HTML answer: every item's sheet is on the one page. */
export const MAX_HTML_BATCH_ITEMS = 500;

export interface BatchEntry {
  index: number;
  kind?: string;
  id?: string;
  outcome: 'pass' | 'fail' | 'error';
  op?: SheetOperation;
  /** The item's own request (without kind), as it would be posted to its check path. */
  body?: Record<string, unknown>;
  answer?: SheetAnswer;
  problem?: { title: string; detail: string; status: number; code?: string };
}

const ORDER = { fail: 0, error: 1, pass: 2 } as const;

export function renderBatchSheet(entries: BatchEntry[], request: unknown): string {
  const hash = requestHash(request);
  const counts = { pass: 0, fail: 0, error: 0 };
  for (const e of entries) counts[e.outcome]++;
  const sorted = [...entries].sort((a, b) => ORDER[a.outcome] - ORDER[b.outcome] || (b.answer?.utilization ?? 0) - (a.answer?.utilization ?? 0) || a.index - b.index);
  const anchor = (e: BatchEntry): string => `item-${e.index}`;
  const rows = sorted
    .map((e) => {
      const a = e.answer;
      const gov = a?.governing;
      const status = e.outcome === 'error' ? 'ERROR' : e.outcome.toUpperCase();
      const cls = e.outcome === 'pass' ? 'ok' : 'ng';
      return `<tr class="${e.outcome}" data-index="${e.index}" data-outcome="${e.outcome}">
<td class="num">${e.index + 1}</td><td><a href="#${anchor(e)}">${esc(e.id ?? '(no id)')}</a></td><td>${esc(e.kind ? (SHEET_TITLES[e.kind] ?? e.kind) : '—')}</td>
<td><span class="${cls}">${status}</span></td><td class="num" data-field="utilization">${a ? fmtRatio(a.utilization) : '—'}</td>
<td class="code" data-field="governing">${gov ? esc(gov.code) : esc(e.problem?.code ?? e.problem?.title ?? '')}</td><td><a href="#${anchor(e)}">${a ? 'sheet' : 'problem'}</a></td></tr>`;
    })
    .join('\n');
  const summary = `<article class="sheet batch-summary" id="summary">
<header class="title-block"><div class="banner"><h1>Batch of ${entries.length} check${entries.length === 1 ? '' : 's'}</h1><span class="what">Calculation sheets · Throatline</span></div>
<table><tr><td class="k">Failing</td><td class="v" data-field="fail">${counts.fail}</td><td class="k">Not answered</td><td class="v" data-field="error">${counts.error}</td><td class="k">Passing</td><td class="v" data-field="pass">${counts.pass}</td></tr></table></header>
<section class="verdict${counts.fail + counts.error > 0 ? ' fail' : ''}"><p class="governing"><span class="status">${counts.fail + counts.error > 0 ? 'REVIEW' : 'PASS'}</span>${counts.fail} of ${entries.length} fail, ${counts.error} could not be answered, ${counts.pass} pass.</p>
<p class="sub">Failing items first (highest utilization first), then items the service could not answer, then passing items; each row links to its sheet below.</p></section>
<h2>Summary</h2>
<table class="batch"><thead><tr><th class="num">#</th><th>Id</th><th>Check</th><th>Status</th><th class="num">Utilization</th><th>Governing code</th><th></th></tr></thead><tbody>
${rows}
</tbody></table>
<footer class="provenance"><p>Batch request SHA-256 (canonical form): <span class="mono hash">${hash}</span>. Each item's sheet carries the hash of its own request.</p></footer>
</article>`;
  const items = entries
    .map((e) => {
      if (e.op && e.answer && e.body) return renderSheetArticle({ op: e.op, answer: e.answer, body: e.body }, anchor(e)).replace('<header class="title-block">', `<p class="note"><a href="#summary">↑ batch summary</a> · item ${e.index + 1}</p>\n<header class="title-block">`);
      const p = e.problem;
      return `<article class="sheet" id="${anchor(e)}" data-outcome="error"><p class="note"><a href="#summary">↑ batch summary</a> · item ${e.index + 1}</p>
<section class="verdict fail"><p class="governing"><span class="status">ERROR</span>${esc(e.id ?? '(no id)')}${e.kind ? ` (${esc(e.kind)})` : ''}: ${esc(p?.title ?? 'not answered')}</p><p class="sub">${esc(p?.detail ?? '')}${p?.code ? ` <span class="code">${esc(p.code)}</span>` : ''}</p></section></article>`;
    })
    .join('\n');
  return htmlDocument(`Batch of ${entries.length} checks — Throatline calculation sheets`, `${summary}\n${items}`, `Throatline batch · request ${hash.slice(0, 12)}`, { 'request-sha256': hash });
}

/**
 * Runs a JSON batch for its HTML page: `run` answers one item as the JSON route would (the
 * answer or its problem, serialized); the page is built from those answers and the items.
 */
export function batchHtml(items: unknown[], run: (item: unknown, index: number) => { json: string; outcome: 'pass' | 'fail' | 'error' }, operations: readonly SheetOperation[]): string {
  const byKind = new Map(operations.map((op) => [op.kind, op]));
  const entries: BatchEntry[] = items.map((item, index) => {
    const r = run(item, index);
    const out = JSON.parse(r.json) as Record<string, unknown>;
    const raw = item !== null && typeof item === 'object' && !Array.isArray(item) ? (item as Record<string, unknown>) : {};
    const { kind, ...body } = raw;
    const entry: BatchEntry = { index, outcome: r.outcome };
    if (typeof kind === 'string') entry.kind = kind;
    if (typeof raw.id === 'string') entry.id = raw.id;
    if (r.outcome === 'error') {
      entry.problem = { title: String(out.title ?? ''), detail: String(out.detail ?? ''), status: Number(out.status ?? 0) };
      if (typeof out.code === 'string') entry.problem.code = out.code;
    } else {
      const op = typeof kind === 'string' ? byKind.get(kind) : undefined;
      if (op) {
        entry.op = op;
        entry.body = body;
        entry.answer = out as unknown as SheetAnswer;
      }
    }
    return entry;
  });
  return renderBatchSheet(entries, items);
}
