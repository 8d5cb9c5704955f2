/**
 * A real office suite's spreadsheet engine computes the example workbook against a running
 * service: LibreOffice Calc, headless, driven through its scripting bridge (python3-uno; see
 * calc-read.py beside this file), opens a copy of openapi/examples/workshop-welds.xlsx whose
 * service URL cell points at the app listening on an ephemeral port, and the cell formulas
 * and the size table's array formulas hold the service's numbers.
 *
 * The copy comes from the same generator as the committed file (buildWorkbook with another
 * base URL); workbook.test.ts checks that the committed file is exactly that generator's output.
 * Skipped only when soffice is not installed (.ci/run installs it).
 */
import { execFile, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildWorkbook, CELLS, TABLE_SIZES } from '../../src/bin/make-workbook.js';
import { app as build } from '../helpers.js';

const SCRIPT = fileURLToPath(new URL('./calc-read.py', import.meta.url));
const SOFFICE = spawnSync('sh', ['-c', 'command -v soffice'], { encoding: 'utf8' }).stdout.trim();
const SKIP = SOFFICE === '';
/** A Python that has the bridge (Debian's python3-uno serves the system Python). */
function pythonWithUno(): string | undefined {
  return ['/usr/bin/python3', 'python3'].find((p) => spawnSync(p, ['-c', 'import uno'], { stdio: 'ignore' }).status === 0);
}

interface CellOut {
  type: 'EMPTY' | 'VALUE' | 'TEXT' | 'FORMULA';
  string: string;
  value: number;
  formula: string;
}
interface CalcOut {
  sheet: string;
  cells: Record<string, CellOut>;
  arrays: Record<string, string>;
}

// The workbook's inputs: connection WS-B12 (5/16 in E70 fillets, 2 × 10 in, 120 kip LRFD,
// 1/2 in A572-50 gusset welded on both faces, 3/4 in A992 flange).
const QUERY =
  'method=LRFD&electrode=E70&welds.0.length=10&welds.0.count=2&load.force=120' +
  '&parts.0.thickness=1/2&parts.0.steel=A572-50&parts.0.faces=2&parts.1.thickness=3/4&parts.1.steel=A992';

let app: FastifyInstance;
let work: string;
let calc: CalcOut;
const seen: string[] = [];

/** Kills what is left of the soffice this test started (its process group, by the id it wrote). */
function killOffice(): void {
  const pidFile = join(work, 'soffice.pid');
  if (!existsSync(pidFile)) return;
  const pid = Number(readFileSync(pidFile, 'utf8'));
  try {
    process.kill(-pid, 'SIGKILL');
  } catch {
    // already gone
  }
}

describe.skipIf(SKIP)(`LibreOffice Calc computes the workshop workbook from a running service${SKIP ? ' (skipped: soffice is not installed; .ci/run installs libreoffice-calc-nogui)' : ''}`, () => {
  beforeAll(async () => {
    const python = pythonWithUno();
    if (!python) throw new Error('soffice is installed but no python3 has the uno bridge: install python3-uno');
    app = await build();
    app.server.on('request', (req: { method?: string; url?: string }, res: { statusCode: number; on(e: 'finish', f: () => void): void }) => {
      res.on('finish', () => seen.push(`${req.method} ${res.statusCode} ${req.url ?? ''}`));
    });
    const base = await app.listen({ host: '127.0.0.1', port: 0 });
    work = mkdtempSync(join(tmpdir(), 'calc-e2e-'));
    const book = join(work, 'workshop-welds.xlsx');
    writeFileSync(book, await buildWorkbook({ baseUrl: base }));
    // Building the workbook keeps the event loop busy for a moment; on a loaded machine the
    // service may then shed new work for a short hold (503 until /readyz is 200 again).
    for (let i = 0; i < 100 && (await app.inject({ url: '/readyz' })).statusCode !== 200; i++) await new Promise((r) => setTimeout(r, 100));
    const cells = [CELLS.baseUrl, CELLS.query, CELLS.utilization, CELLS.status, CELLS.governing, CELLS.available, CELLS.tableUrl, CELLS.tableSizes, CELLS.tableUtilization, CELLS.tableStatus, CELLS.tableGoverning];
    const stdout = await new Promise<string>((resolve, reject) => {
      execFile(python, [SCRIPT, join(work, 'profile'), book, ...cells], { timeout: 150_000, killSignal: 'SIGKILL', maxBuffer: 4 << 20, env: { ...process.env, CALC_READ_PID_FILE: join(work, 'soffice.pid') } }, (err, out, errText) => {
        if (err) reject(new Error(`calc-read.py failed: ${err.message}\n${errText}`));
        else resolve(out);
      });
    });
    calc = JSON.parse(stdout) as CalcOut;
  }, 180_000);

  afterAll(async () => {
    if (work) {
      killOffice();
      rmSync(work, { recursive: true, force: true });
    }
    if (app) await app.close();
  });

  const cell = (addr: string): CellOut => {
    const c = calc.cells[addr];
    if (!c) throw new Error(`no cell ${addr} in the output`);
    // An error value (Err:540 when links are held back, #VALUE! when a call fails) says more than a wrong number.
    if (/^(Err:\d+|#[A-Z/0!?]+)$/.test(c.string)) throw new Error(`${addr} shows ${c.string}; requests the service saw:\n${seen.join('\n')}`);
    return c;
  };
  const column = (range: string): CellOut[] => {
    const [from, to] = range.split(':') as [string, string];
    const col = from.replace(/\d+/, '');
    const rows = Array.from({ length: Number(to.replace(/\D+/, '')) - Number(from.replace(/\D+/, '')) + 1 }, (_, i) => Number(from.replace(/\D+/, '')) + i);
    return rows.map((r) => cell(`${col}${r}`));
  };

  it('Calc called the service: one-value cells and the XML range table', () => {
    expect(seen.some((u) => u.startsWith('GET 200 /v1/fillet/check?') && u.includes('format=value') && u.includes('field=utilization')), seen.join('\n')).toBe(true);
    expect(seen.some((u) => u.startsWith('GET 200 /v1/fillet/check?') && u.includes('vary=welds.0.size') && u.includes('format=xml')), seen.join('\n')).toBe(true);
  });

  it('the query cell holds the inputs, with the fraction URL-encoded by ENCODEURL', () => {
    expect(cell(CELLS.query).string).toBe(`${QUERY.replace(/\//g, '%2F')}&welds.0.size=5%2F16`);
  });

  it("the cell formula's number is the service's JSON utilization: 120 / 139.2 = 0.862", async () => {
    const c = cell(CELLS.utilization);
    expect(c.type).toBe('FORMULA');
    expect(c.formula).toMatch(/^=NUMBERVALUE\(WEBSERVICE\(\$B\$2&/);
    const json = (await app.inject({ url: `/v1/fillet/check?${QUERY}&welds.0.size=5/16` })).json() as { utilization: number; governing: { available: number } };
    expect(c.value).toBeCloseTo(json.utilization, 12);
    // 1.392 kip/in per sixteenth × 5 × 2 × 10 in = 139.2 kip (common practice, no source)
    expect(c.value).toBeCloseTo(120 / 139.2, 3);
    expect(cell(CELLS.available).value).toBeCloseTo(json.governing.available, 9);
    expect(cell(CELLS.available).value / 139.2).toBeCloseTo(1, 3);
  });

  it('the status and governing cells hold the words the service answers', () => {
    expect(cell(CELLS.status).string).toBe('pass');
    expect(cell(CELLS.governing).string).toBe('FILLET_WELD_METAL');
  });

  it('each size-table column is one array formula over its six rows', () => {
    for (const r of [CELLS.tableUtilization, CELLS.tableStatus, CELLS.tableGoverning]) {
      expect(calc.arrays[r], r).toMatch(/FILTERXML\(WEBSERVICE\(\$B\$27\)/);
      for (const c of column(r)) expect(c.formula.startsWith('{=')).toBe(true);
    }
    expect(column(CELLS.tableSizes).map((c) => c.string)).toEqual([...TABLE_SIZES]);
  });

  it("the range formula's values are the service's range table", async () => {
    const res = await app.inject({ url: `/v1/fillet/check?${QUERY}&vary=welds.0.size&values=${TABLE_SIZES.join(',')}&columns=utilization,status,governing.code&format=json` });
    const rows = (res.json() as { rows: Array<{ value: string; cells: [number, string, string] }> }).rows;
    expect(rows.map((r) => r.value)).toEqual([...TABLE_SIZES]);
    expect(column(CELLS.tableUtilization).map((c) => c.value)).toEqual(rows.map((r) => expect.closeTo(r.cells[0], 12) as unknown as number));
    expect(column(CELLS.tableStatus).map((c) => c.string)).toEqual(rows.map((r) => r.cells[1]));
    expect(column(CELLS.tableGoverning).map((c) => c.string)).toEqual(rows.map((r) => r.cells[2]));
  });

  it('and those values are the hand-calculated ones', () => {
    // Weld metal, 1.392 kip/in per sixteenth (common practice, no source) × D × 20 in, up to 5/16 in;
    // from 3/8 in the gusset's shear rupture on one plane of 10 in governs:
    // 0.75 · 0.60 · 65 · 0.5 · 10 = 146.25 kip (AISC 360-22 §J4.2).
    const expected = [2, 3, 4, 5].map((d) => 120 / (1.392 * d * 20)).concat([120 / 146.25, 120 / 146.25]);
    column(CELLS.tableUtilization).forEach((c, i) => expect(c.value / expected[i]!).toBeCloseTo(1, 3));
    expect(column(CELLS.tableStatus).map((c) => c.string)).toEqual(['fail', 'fail', 'fail', 'pass', 'pass', 'pass']);
    expect(column(CELLS.tableGoverning).map((c) => c.string)).toEqual([
      'FILLET_WELD_METAL', 'FILLET_WELD_METAL', 'FILLET_WELD_METAL', 'FILLET_WELD_METAL', 'BASE_METAL_SHEAR_RUPTURE', 'BASE_METAL_SHEAR_RUPTURE',
    ]);
  });
});
