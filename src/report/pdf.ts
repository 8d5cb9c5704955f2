/**
 * PDF sheets: the HTML sheet printed by a headless Chromium that is already on the host, driven
 * by playwright-core (which never downloads a browser). No Chromium: the caller answers 501.
 *
 * The browser stays out of the request's failure modes: one browser per process, started on
 * the first PDF and reused; at most a few pages at a time (the rest wait their turn); every
 * render bounded in time, its page closed whatever happens; a browser that crashed or hung is
 * dropped and started afresh on the next request; close() on shutdown. Pages run with
 * JavaScript off and the network offline: a sheet needs neither.
 */
import { accessSync, constants, statSync } from 'node:fs';
import type { Browser } from 'playwright-core';

/** Where a host's Chromium usually is when no path is configured. */
export const CHROMIUM_PATHS = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/lib/chromium/chromium', '/snap/bin/chromium'];

/** The launch flags: headless, no sandbox (containers), and nothing that phones out. */
export const CHROMIUM_FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Bound on starting the browser, and again on one render: together well inside the request timeout. */
export const PDF_TIMEOUT_MS = 12_000;
export const PDF_CONCURRENCY = 2;

/** No Chromium on this host: the caller answers 501. */
export class PdfUnavailableError extends Error {
  constructor(detail: string) {
    super(detail);
    this.name = 'PdfUnavailableError';
  }
}

/** Chromium is there but the render failed or took too long: the caller answers 503. */
export class PdfRenderError extends Error {
  constructor(detail: string) {
    super(detail);
    this.name = 'PdfRenderError';
  }
}

function executable(path: string): boolean {
  try {
    // a file with an execute bit (root passes X_OK checks on files with none)
    if (!statSync(path).isFile() || (statSync(path).mode & 0o111) === 0) return false;
    accessSync(path, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

/**
 * The Chromium to use: the configured path (CHROMIUM_PATH) when given, else the first of the
 * usual paths that exists. null when there is none.
 */
export function findChromium(configured?: string): string | null {
  if (configured !== undefined && configured !== '') return executable(configured) ? configured : null;
  return CHROMIUM_PATHS.find(executable) ?? null;
}

export type Paper = 'A4' | 'Letter';

interface Shared {
  path: string;
  browser: Promise<Browser> | null;
  active: number;
  waiting: Array<() => void>;
}

/** One browser per executable path, per process. */
const shared = new Map<string, Shared>();

async function launch(path: string): Promise<Browser> {
  const { chromium } = await import('playwright-core');
  // launch() gives every browser a fresh temporary profile (user-data-dir) of its own.
  return chromium.launch({ executablePath: path, headless: true, args: CHROMIUM_FLAGS, timeout: PDF_TIMEOUT_MS, handleSIGINT: false, handleSIGTERM: false, handleSIGHUP: false });
}

function slot(s: Shared): Promise<void> {
  if (s.active < PDF_CONCURRENCY) {
    s.active++;
    return Promise.resolve();
  }
  return new Promise((resolve) => s.waiting.push(() => resolve()));
}

function release(s: Shared): void {
  const next = s.waiting.shift();
  if (next) next();
  else s.active--;
}

async function drop(s: Shared): Promise<void> {
  const b = s.browser;
  s.browser = null;
  if (b) await b.then((x) => x.close()).catch(() => undefined);
}

function withTimeout<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const t = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new PdfRenderError(`${what} took longer than ${ms / 1000} s.`)), ms);
  });
  return Promise.race([p, t]).finally(() => clearTimeout(timer));
}

/**
 * Prints `html` to PDF on `paper`. Throws PdfUnavailableError without a Chromium, and
 * PdfRenderError when the browser fails or the render runs out of time.
 */
export async function renderPdf(html: string, paper: Paper, opts: { chromiumPath?: string; timeoutMs?: number } = {}): Promise<Buffer> {
  const path = findChromium(opts.chromiumPath);
  if (path === null) {
    throw new PdfUnavailableError(
      opts.chromiumPath
        ? `CHROMIUM_PATH names ${opts.chromiumPath}, which is not an executable file on this host.`
        : `No headless Chromium on this host (looked for ${CHROMIUM_PATHS.join(', ')}); install one or set CHROMIUM_PATH. format=html gives the same sheet.`,
    );
  }
  const timeoutMs = opts.timeoutMs ?? PDF_TIMEOUT_MS;
  let s = shared.get(path);
  if (!s) {
    s = { path, browser: null, active: 0, waiting: [] };
    shared.set(path, s);
  }
  const state = s;
  await slot(state);
  try {
    if (!state.browser) {
      state.browser = launch(path);
      state.browser.then((b) => b.on('disconnected', () => { if (state.browser) state.browser = null; }), () => { state.browser = null; });
    }
    let browser: Browser;
    try {
      browser = await withTimeout(state.browser, timeoutMs, 'Starting Chromium');
    } catch (err) {
      await drop(state);
      throw err instanceof PdfRenderError ? err : new PdfRenderError('Chromium could not be started.');
    }
    const context = await browser.newContext({ javaScriptEnabled: false, offline: true });
    try {
      const work = (async () => {
        const page = await context.newPage();
        await page.setContent(html, { waitUntil: 'load', timeout: timeoutMs });
        await page.emulateMedia({ media: 'print' });
        return page.pdf({ format: paper, printBackground: true });
      })();
      return await withTimeout(work, timeoutMs, 'Printing the sheet');
    } catch (err) {
      if (err instanceof PdfRenderError) {
        // a render that hung may have taken the browser with it: start afresh next time
        await drop(state);
        throw err;
      }
      throw new PdfRenderError('Chromium could not print the sheet.');
    } finally {
      await context.close().catch(() => undefined);
    }
  } finally {
    release(state);
  }
}

/** Closes every browser this process started (on shutdown). */
export async function closePdfBrowsers(): Promise<void> {
  await Promise.all([...shared.values()].map((s) => drop(s)));
}
