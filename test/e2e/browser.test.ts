/**
 * The calculation sheet in a real headless Chromium (Debian's chromium package, driven by
 * playwright-core with executablePath): the app listens on an ephemeral port on the loopback,
 * the browser opens a fillet sheet and a weld-group sheet from the GET form, and the test reads
 * what a person would see: the governing line, the figure, equations laid out as mathematics.
 * Screenshots and PDFs go to this test's temporary folder. Printing to PDF is tested here too.
 *
 * Without a Chromium on the host the whole file is skipped, and says why.
 */
import { existsSync, mkdtempSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { app as build } from '../helpers.js';
import { OPERATIONS } from '../../src/operations/index.js';
import { CHROMIUM_FLAGS, findChromium } from '../../src/report/pdf.js';

const EXECUTABLE = existsSync('/usr/bin/chromium') ? '/usr/bin/chromium' : findChromium();
const SKIP_REASON = 'skipped: no headless Chromium on this host (/usr/bin/chromium, /usr/bin/chromium-browser); `apt-get install chromium` (Debian) runs it';

/** The GET form of a request: dotted names, lists of numbers with commas. */
function query(body: unknown, prefix = ''): string[] {
  if (Array.isArray(body)) {
    if (body.every((x) => typeof x === 'number')) return [`${prefix}=${body.join(',')}`];
    return body.flatMap((x, i) => query(x, `${prefix}.${i}`));
  }
  if (body !== null && typeof body === 'object') return Object.entries(body).flatMap(([k, v]) => query(v, prefix ? `${prefix}.${k}` : k));
  return [`${prefix}=${encodeURIComponent(String(body))}`];
}

const example = (kind: string, name: string) => {
  const op = OPERATIONS.find((o) => o.kind === kind)!;
  return { op, body: op.examples[name]!.value as unknown as Record<string, unknown> };
};

if (!EXECUTABLE) {
  describe('calculation sheets in a headless Chromium', () => {
    it.skip(SKIP_REASON, () => undefined);
  });
} else {
  describe('calculation sheets in a headless Chromium', () => {
    let app: FastifyInstance;
    let base: string;
    let browser: Browser;
    const dir = mkdtempSync(join(tmpdir(), 'throatline-browser-'));

    beforeAll(async () => {
      app = await build();
      await app.listen({ host: '127.0.0.1', port: 0 });
      const addr = app.server.address();
      base = `http://127.0.0.1:${typeof addr === 'object' && addr ? addr.port : 0}`;
      browser = await chromium.launch({ executablePath: EXECUTABLE, headless: true, args: CHROMIUM_FLAGS });
      console.info(`browser test: screenshots and PDFs in ${dir}`);
    });

    afterAll(async () => {
      await browser?.close();
      await app?.close();
    });

    async function open(kind: string, name: string, file: string) {
      const { op, body } = example(kind, name);
      const withHeader = { ...body, sheet: { project: 'Two-storey workshop', preparedBy: 'A. Engineer', checkedBy: 'B. Checker', date: '2025-03-14' } };
      const url = `${base}${op.path}?${query(withHeader).join('&')}`;
      const json = (await (await fetch(`${url}&format=json`)).json()) as { governing: { code: string; ratio: number }; status: string; checks: unknown[] };
      const page = await browser.newPage({ viewport: { width: 1000, height: 1300 } });
      const requests: string[] = [];
      page.on('request', (r) => requests.push(r.url()));
      const res = await page.goto(`${url}&format=html`);
      expect(res?.status()).toBe(200);
      expect(res?.headers()['content-type']).toMatch(/^text\/html/);
      const shot = join(dir, file);
      await page.screenshot({ path: shot, fullPage: true });
      return { page, json, requests, shot, url };
    }

    it('opens a fillet sheet: the governing line, the figure and typeset equations are visible', async () => {
      const { page, json, requests, shot, url } = await open('fillet', 'gussetToColumn', 'fillet-sheet.png');
      try {
        const gov = page.locator('.verdict .governing');
        await expect(gov.isVisible()).resolves.toBe(true);
        const line = (await gov.innerText()).replace(/\s+/g, ' ');
        expect(line).toContain(json.status === 'pass' ? 'PASS' : 'FAIL');
        expect(line).toContain('Governing: Fillet weld metal strength');
        expect(line).toContain(`utilization ${json.governing.ratio.toFixed(3)}`);
        expect(await gov.getAttribute('data-governing')).toBe(json.governing.code);
        // the figure is an SVG drawn at a readable size
        const fig = page.locator('figure svg').first();
        await expect(fig.isVisible()).resolves.toBe(true);
        const box = (await fig.boundingBox())!;
        expect(box.width).toBeGreaterThan(400);
        expect(await page.locator('figure svg text', { hasText: 'failure plane' }).count()).toBeGreaterThan(0);
        // one section per check, each with MathML the browser lays out as mathematics: a subscript sits below its base
        expect(await page.locator('section.check').count()).toBe(json.checks.length);
        const sub = page.locator('section.check msub').first();
        const [b, s] = await Promise.all([sub.locator(':scope > *').nth(0).boundingBox(), sub.locator(':scope > *').nth(1).boundingBox()]);
        const whole = await sub.boundingBox();
        const drop = b && s && whole ? { base: b.y + b.height, script: s.y + s.height, width: whole.width } : null;
        expect(drop).not.toBeNull();
        expect(drop!.width).toBeGreaterThan(0);
        expect(drop!.script).toBeGreaterThan(drop!.base);
        // the caution is on the page, and nothing was fetched but the sheet itself
        await expect(page.locator('.caution').isVisible()).resolves.toBe(true);
        expect(requests).toEqual([`${url}&format=html`]);
        expect(statSync(shot).size).toBeGreaterThan(20_000);
      } finally {
        await page.close();
      }
    });

    it('opens a weld-group sheet with the eccentric-group figure', async () => {
      const { page, json, requests, shot, url } = await open('weld-group', 'bracketPlate', 'weld-group-sheet.png');
      try {
        const gov = page.locator('.verdict .governing');
        await expect(gov.isVisible()).resolves.toBe(true);
        expect((await gov.innerText()).replace(/\s+/g, ' ')).toContain(`utilization ${json.governing.ratio.toFixed(3)}`);
        expect(await gov.getAttribute('data-governing')).toBe(json.governing.code);
        const fig = page.locator('figure svg').first();
        await expect(fig.isVisible()).resolves.toBe(true);
        // the instantaneous centre and the load are marked on it
        expect(await page.locator('figure svg text', { hasText: 'IC' }).count()).toBeGreaterThan(0);
        expect(await page.locator('figure svg text', { hasText: 'P = 30 kip' }).count()).toBeGreaterThan(0);
        expect(requests).toEqual([`${url}&format=html`]);
        expect(statSync(shot).size).toBeGreaterThan(20_000);
      } finally {
        await page.close();
      }
    });

    it('prints the sheet to PDF on Letter (imperial) and A4 (metric)', async () => {
      const cases = [
        { kind: 'fillet', name: 'gussetToColumn', file: 'fillet-sheet.pdf', size: [612, 792] }, // ANSI Letter, 8.5 × 11 in = 612 × 792 pt (common practice, no source)
        { kind: 'fillet', name: 'lapSplice', file: 'lap-sheet.pdf', size: [595.3, 841.9] }, // ISO 216 A4, 210 × 297 mm = 595.3 × 841.9 pt (from memory)
      ];
      // the two at once: the renderer shares one browser between requests
      const out = await Promise.all(
        cases.map(async (c) => {
          const { op, body } = example(c.kind, c.name);
          const r = await fetch(`${base}${op.path}?format=pdf`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
          return { c, status: r.status, type: r.headers.get('content-type'), bytes: Buffer.from(await r.arrayBuffer()) };
        }),
      );
      for (const { c, status, type, bytes } of out) {
        expect(status).toBe(200);
        expect(type).toBe('application/pdf');
        expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
        writeFileSync(join(dir, c.file), bytes);
        const pdf = bytes.toString('latin1');
        const pages = pdf.match(/\/Type\s*\/Page\b/g) ?? [];
        expect(pages.length).toBeGreaterThanOrEqual(2);
        const m = /\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(pdf);
        expect(m).not.toBeNull();
        expect(Math.abs(Number(m![1]) - c.size[0]!)).toBeLessThan(2);
        expect(Math.abs(Number(m![2]) - c.size[1]!)).toBeLessThan(2);
      }
    });
  });
}
