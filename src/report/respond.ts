/**
 * The sheet formats on the HTTP side: which requests want a sheet (format=html or pdf, or an
 * Accept header that prefers text/html), the contract's description of those answers, and the
 * reply itself (HTML, PDF, or the problem that says why a PDF cannot be made).
 */
import type { FastifyReply } from 'fastify';
import { Type } from 'typebox';
import { problem, sendProblem } from '../plugins/problem.js';
import { PdfRenderError, PdfUnavailableError, renderPdf, type Paper } from './pdf.js';

export { closePdfBrowsers } from './pdf.js';
import { renderSheet, type SheetInput } from './sheet.js';

export const SHEET_FORMATS = ['html', 'pdf'] as const;

export const HTML_TYPE = 'text/html; charset=utf-8';
export const PDF_TYPE = 'application/pdf';

/** The response content the contract lists for the sheet formats. */
export function sheetContent(): Record<string, { schema: unknown }> {
  return {
    'text/html': { schema: Type.String({ description: 'format=html, or Accept: text/html: the calculation sheet, one self-contained HTML document (inline CSS, MathML equations, SVG figure; no scripts, no external requests).' }) },
    'application/pdf': { schema: Type.String({ format: 'binary', description: 'format=pdf: the same sheet printed to PDF by a headless Chromium on the host (A4 for metric requests, Letter for imperial); 501 when the host has none.' }) },
  };
}

/** q-value of a media range in an Accept header for a type, 0 when not accepted. */
function quality(accept: string, type: string): number {
  const [major] = type.split('/');
  let best = -1;
  let q = 0;
  for (const part of accept.split(',')) {
    const [range = '', ...params] = part.trim().toLowerCase().split(';');
    const r = range.trim();
    const specificity = r === type ? 3 : r === `${major}/*` ? 2 : r === '*/*' ? 1 : 0;
    if (specificity === 0 || specificity < best) continue;
    const qp = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
    const value = qp ? Number(qp.slice(2)) : 1;
    if (specificity > best) {
      best = specificity;
      q = Number.isFinite(value) ? value : 0;
    }
  }
  return q;
}

/** An Accept header that names text/html and prefers it to JSON (a browser's does; a client asking for JSON or anything does not). */
export function prefersHtml(accept: string | undefined): boolean {
  if (!accept || !/text\/html/i.test(accept)) return false;
  return quality(accept, 'text/html') > quality(accept, 'application/json');
}

export function paperFor(units: { length: string }): Paper {
  return units.length === 'mm' ? 'A4' : 'Letter';
}

function fileName(input: SheetInput): string {
  const mark = ((input.body as { sheet?: { mark?: string } }).sheet?.mark ?? input.answer.id ?? input.op.kind).replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 80);
  return `${mark || 'sheet'}.pdf`;
}

/**
 * Answers with the sheet when the request asks for one (format=html or pdf, or no format and an
 * Accept header that prefers HTML); returns null otherwise.
 */
export async function replySheet(reply: FastifyReply, input: SheetInput, format: string | undefined, chromiumPath?: string): Promise<FastifyReply | null> {
  const html = format === 'html' || (format === undefined && prefersHtml(reply.request.headers.accept));
  if (html) return reply.type(HTML_TYPE).send(renderSheet(input));
  if (format !== 'pdf') return null;
  try {
    const pdf = await renderPdf(renderSheet(input), paperFor(input.answer.units), { chromiumPath: chromiumPath || undefined });
    return reply.type(PDF_TYPE).header('content-disposition', `inline; filename="${fileName(input)}"`).send(pdf);
  } catch (err) {
    if (err instanceof PdfUnavailableError) return sendProblem(reply, problem(501, 'pdf-unavailable', 'PDF sheets are not available on this host', err.message));
    if (err instanceof PdfRenderError) return sendProblem(reply, problem(503, 'pdf-render-failed', 'The PDF sheet could not be made', `${err.message} format=html gives the same sheet.`));
    throw err;
  }
}
