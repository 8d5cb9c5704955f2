/**
 * A client generated from the committed contract works: openapi-typescript turns
 * openapi/openapi.json into types, a small usage file calls POST /v1/fillet/check through
 * openapi-fetch with those types and must type-check without a single diagnostic, and the same
 * usage file then runs against the service listening on an ephemeral port.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import openapiTS, { astToString } from 'openapi-typescript';
import ts from 'typescript';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DOC_PATH = join(ROOT, 'openapi', 'openapi.json');

/**
 * The usage file. Besides the calls, it holds lines that must NOT type-check (each marked with
 * @ts-expect-error): if the generated types were loose (any), those markers would themselves be
 * reported as unused, so the check below can fail both ways.
 */
const USAGE = `import createClient from 'openapi-fetch';
import type { components, paths } from './schema.js';

type Problem = components['schemas']['Problem'];
type GoverningCode = paths['/v1/fillet/check']['post']['responses'][200]['content']['application/json']['governing']['code'];
type FilletBody = NonNullable<paths['/v1/fillet/check']['post']['requestBody']>['content']['application/json'];

/** JSON answers only: the check routes also declare text/csv and text/plain for format=csv|value. */
type Json = \`application/\${string}json\`;

export function client(baseUrl: string) {
  return createClient<paths, Json>({ baseUrl });
}

/** WS-B12-like fillet: 5/16 in E70, 10 in, two lines, on a 1/2 in A572-50 gusset. */
export const body: FilletBody = {
  id: 'WS-B12',
  method: 'LRFD',
  units: 'imperial',
  electrode: 'E70',
  welds: [{ size: '5/16', length: 10, angle: 0, count: 2 }],
  load: { force: 120 },
  parts: [
    { thickness: 0.5, steel: 'A572-50', faces: 2 },
    { thickness: 0.75, steel: 'A992' },
  ],
};

export async function governingCode(baseUrl: string): Promise<string> {
  const { data, error, response } = await client(baseUrl).POST('/v1/fillet/check', { body });
  if (error !== undefined || data === undefined) throw new Error(\`fillet check failed with \${response.status}\`);
  const code: GoverningCode = data.governing.code;
  const status: 'pass' | 'fail' = data.status;
  const ratio: number = data.governing.ratio;
  return \`\${code} \${status} \${ratio > 0 ? 'loaded' : 'unloaded'}\`;
}

export async function badRequest(baseUrl: string): Promise<{ status: number; problem: Problem | undefined; contentType: string | null }> {
  // A body that passes the types but not the service: a negative force.
  const { error, response } = await client(baseUrl).POST('/v1/fillet/check', { body: { ...body, load: { force: -1 } } });
  const problem: Problem | undefined = error;
  return { status: response.status, problem, contentType: response.headers.get('content-type') };
}

export function typeErrorsThatMustBeCaught(c: ReturnType<typeof client>): void {
  // @ts-expect-error governing codes are an enum, not any string
  const notACode: GoverningCode = 'NOT_A_CODE';
  const aCode: GoverningCode = 'FILLET_WELD_METAL';
  void notACode;
  void aCode;
  // @ts-expect-error a path the contract does not have
  void c.POST('/v1/fillet/no-such-route', { body });
  // @ts-expect-error method is required
  const noMethod: FilletBody = { electrode: 'E70', welds: [{ size: 0.25, length: 4 }], parts: [{ thickness: 0.5, steel: 'A36' }] };
  // @ts-expect-error LRFD or ASD only
  const badMethod: FilletBody = { ...body, method: 'WSD' };
  // @ts-expect-error the answer has no such field
  void c.POST('/v1/fillet/check', { body }).then((r) => r.data?.governing.noSuchField);
  void noMethod;
  void badMethod;
}
`;

const COMPILER_OPTIONS: ts.CompilerOptions = {
  target: ts.ScriptTarget.ES2023,
  lib: ['lib.es2023.d.ts'],
  module: ts.ModuleKind.NodeNext,
  moduleResolution: ts.ModuleResolutionKind.NodeNext,
  strict: true,
  noUncheckedIndexedAccess: true,
  noUnusedLocals: true,
  skipLibCheck: true,
  noEmit: true,
  types: ['node'],
};

/** What the usage file exports, as this test calls it at run time. */
interface Usage {
  governingCode(baseUrl: string): Promise<string>;
  badRequest(baseUrl: string): Promise<{ status: number; problem?: { status: number; type: string; errors?: Array<{ pointer: string }> }; contentType: string | null }>;
}

let dir: string;
let app: FastifyInstance;
let baseUrl: string;

beforeAll(async () => {
  // Under the project (in the ignored .tmp/) so that openapi-fetch resolves from node_modules.
  mkdirSync(join(ROOT, '.tmp'), { recursive: true });
  dir = mkdtempSync(join(ROOT, '.tmp', 'typed-client-'));
  writeFileSync(join(dir, 'package.json'), '{ "type": "module" }\n');
  const ast = await openapiTS(JSON.parse(readFileSync(DOC_PATH, 'utf8')));
  writeFileSync(join(dir, 'schema.ts'), astToString(ast));
  writeFileSync(join(dir, 'usage.ts'), USAGE);

  app = await buildApp({ config: { DOCS: false } });
  const address = await app.listen({ port: 0, host: '127.0.0.1' });
  baseUrl = address;
});

afterAll(async () => {
  await app?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

function diagnostics(files: string[]): string[] {
  const program = ts.createProgram(files, COMPILER_OPTIONS);
  return ts.getPreEmitDiagnostics(program).map((d) => {
    const text = ts.flattenDiagnosticMessageText(d.messageText, '\n');
    if (!d.file || d.start === undefined) return text;
    const { line, character } = d.file.getLineAndCharacterOfPosition(d.start);
    return `${d.file.fileName.slice(dir.length + 1)}:${line + 1}:${character + 1} ${text}`;
  });
}

describe('typed client from the committed contract', () => {
  it('the generated types describe the check routes', () => {
    const schema = readFileSync(join(dir, 'schema.ts'), 'utf8');
    expect(schema).toContain('export interface paths');
    expect(schema).toContain('"/v1/fillet/check"');
    expect(schema).toContain('FILLET_WELD_METAL');
  });

  it('the generated types and the usage file type-check with no diagnostic', () => {
    expect(diagnostics([join(dir, 'schema.ts'), join(dir, 'usage.ts')])).toEqual([]);
  });

  it('a misuse of the generated types is caught (the type check can fail)', () => {
    const bad = join(dir, 'misuse.ts');
    writeFileSync(bad, `import type { paths } from './schema.js';\nexport const m: paths['/v1/fillet/check']['post']['requestBody'] = { content: { 'application/json': { method: 'LRFD' } } };\n`);
    const found = diagnostics([join(dir, 'schema.ts'), bad]);
    expect(found.length).toBeGreaterThan(0);
  });

  it('checks a fillet through openapi-fetch against the running service', async () => {
    const usage = (await import(pathToFileURL(join(dir, 'usage.ts')).href)) as Usage;
    // The gusset of WS-B12 on both faces: the weld metal governs (hand arithmetic from AISC 360-22
    // Eq. J2-4: 0.75 × 0.60 × 70 ksi × 0.707 × 5/16 in × 20 in = 139.2 kip, against base-metal
    // shear rupture of the 1/2 in gusset 0.75 × 0.60 × 65 ksi × 0.5 in × 10 in = 146.3 kip).
    expect(await usage.governingCode(baseUrl)).toBe('FILLET_WELD_METAL pass loaded');
  });

  it('a bad request comes back as the problem document', async () => {
    const usage = (await import(pathToFileURL(join(dir, 'usage.ts')).href)) as Usage;
    const { status, problem, contentType } = await usage.badRequest(baseUrl);
    expect(status).toBe(400);
    expect(contentType).toMatch(/^application\/problem\+json/);
    expect(problem?.status).toBe(400);
    expect(problem?.type).toMatch(/^urn:throatline:problem:/);
    expect(problem?.errors?.map((e) => e.pointer)).toContain('/load/force');
  });
});
