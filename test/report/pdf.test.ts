/**
 * The PDF path without a browser: a host with no Chromium answers format=pdf with a 501 problem
 * that says so; the Accept header negotiation; the paper size by unit system. (Printing itself
 * is tested in test/e2e/browser.test.ts, where a Chromium is present.)
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Fastify from 'fastify';
import { describe, expect, it } from 'vitest';
import { Problem } from '../../src/schemas/common.js';
import { OPERATIONS } from '../../src/operations/index.js';
import problemDetails from '../../src/plugins/problem.js';
import { validatorCompiler } from '../../src/plugins/validation.js';
import { registerCheck } from '../../src/routes/v1/checks.js';
import { findChromium, PdfUnavailableError, renderPdf } from '../../src/report/pdf.js';
import { paperFor, prefersHtml } from '../../src/report/respond.js';

const MISSING = '/nonexistent/throatline-test/chromium';

describe('format=pdf on a host without Chromium', () => {
  it('findChromium refuses a configured path that is not an executable file', () => {
    expect(findChromium(MISSING)).toBeNull();
    const plain = join(mkdtempSync(join(tmpdir(), 'throatline-pdf-')), 'chromium');
    writeFileSync(plain, '#!/bin/sh\n', { mode: 0o644 });
    expect(findChromium(plain)).toBeNull();
  });

  it('renderPdf throws PdfUnavailableError naming the path', async () => {
    await expect(renderPdf('<!DOCTYPE html><title>x</title>', 'A4', { chromiumPath: MISSING })).rejects.toThrow(PdfUnavailableError);
    await expect(renderPdf('<!DOCTYPE html><title>x</title>', 'A4', { chromiumPath: MISSING })).rejects.toThrow(MISSING);
  });

  it('the route answers 501 with a problem document, and format=html still works', async () => {
    const op = OPERATIONS.find((o) => o.kind === 'fillet')!;
    const app = Fastify();
    app.setValidatorCompiler(validatorCompiler);
    app.addSchema(Problem);
    app.addSchema(op.response);
    await app.register(problemDetails);
    registerCheck(app, op, { chromiumPath: MISSING });
    await app.ready();
    try {
      const body = Object.values(op.examples)[0]!.value;
      const r = await app.inject({ method: 'POST', url: `${op.path}?format=pdf`, payload: body });
      expect(r.statusCode).toBe(501);
      expect(r.headers['content-type']).toMatch(/^application\/problem\+json/);
      const p = r.json();
      expect(p.status).toBe(501);
      expect(p.type).toMatch(/pdf-unavailable/);
      expect(p.detail).toContain('CHROMIUM_PATH');
      const h = await app.inject({ method: 'POST', url: `${op.path}?format=html`, payload: body });
      expect(h.statusCode).toBe(200);
    } finally {
      await app.close();
    }
  });
});

describe('Accept negotiation', () => {
  it.each([
    ['text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8', true], // a browser's navigation
    ['text/html', true],
    ['text/html;q=0.9, application/json;q=0.5', true],
    ['application/json', false],
    ['*/*', false],
    ['application/json, text/html;q=0.5', false],
    ['text/html;q=0.5, application/json', false],
    ['text/html;q=0, */*', false],
    ['', false],
  ])('%s → html %s', (accept, html) => {
    expect(prefersHtml(accept || undefined)).toBe(html);
  });
});

describe('paper', () => {
  it('is A4 for metric requests and Letter for imperial ones', () => {
    // ISO 216 A4 where millimetres are used; ANSI Letter where inches are (common practice, no source)
    expect(paperFor({ length: 'mm' })).toBe('A4');
    expect(paperFor({ length: 'in' })).toBe('Letter');
  });
});
