/**
 * The committed contract is a valid OpenAPI 3.1 document, every operation is documented well
 * enough to generate a client from, and the code catalogue is in its enums.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { CODES, type Code } from '../../src/engine/codes.js';
import { OPERATIONS } from '../../src/operations/index.js';

const DOC_PATH = fileURLToPath(new URL('../../openapi/openapi.json', import.meta.url));
const doc = JSON.parse(readFileSync(DOC_PATH, 'utf8')) as OpenApiDoc;

interface Operation {
  operationId?: string;
  summary?: string;
  responses?: Record<string, { description?: string; content?: Record<string, { schema?: unknown }> }>;
}
interface OpenApiDoc {
  openapi: string;
  info: { title: string; version: string };
  paths: Record<string, Record<string, Operation>>;
  components?: { schemas?: Record<string, unknown> };
}

const HTTP_METHODS = ['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace'];

function operations(): Array<{ path: string; method: string; op: Operation }> {
  const out: Array<{ path: string; method: string; op: Operation }> = [];
  for (const [path, item] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(item)) if (HTTP_METHODS.includes(method)) out.push({ path, method, op });
  }
  return out;
}

/** Every value of every `enum` keyword anywhere in the document. */
function enumValues(node: unknown, into = new Set<unknown>()): Set<unknown> {
  if (Array.isArray(node)) {
    for (const x of node) enumValues(x, into);
  } else if (node && typeof node === 'object') {
    for (const [k, v] of Object.entries(node)) {
      if (k === 'enum' && Array.isArray(v)) for (const x of v) into.add(x);
      enumValues(v, into);
    }
  }
  return into;
}

/** Follows a local `#/components/...` reference. */
function deref(schema: unknown): Record<string, unknown> {
  const ref = (schema as { $ref?: string } | undefined)?.$ref;
  if (typeof ref !== 'string') return schema as Record<string, unknown>;
  expect(ref.startsWith('#/')).toBe(true);
  let node: unknown = doc;
  for (const part of ref.slice(2).split('/')) node = (node as Record<string, unknown>)[part];
  expect(node, `unresolved ${ref}`).toBeDefined();
  return node as Record<string, unknown>;
}

describe('OpenAPI 3.1 validity', () => {
  it('validates against the OpenAPI 3.1 schema', async () => {
    const validator = new Validator();
    const result = await validator.validate(doc as unknown as Record<string, unknown>);
    expect(result.errors ?? [], JSON.stringify(result.errors, null, 2)?.slice(0, 2000)).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('declares version 3.1.0 and the package version', () => {
    expect(doc.openapi).toBe('3.1.0');
    const pkg = JSON.parse(readFileSync(fileURLToPath(new URL('../../package.json', import.meta.url)), 'utf8')) as { version: string };
    expect(doc.info.version).toBe(pkg.version);
  });

  it('the validator rejects a broken document (the check can fail)', async () => {
    const broken = structuredClone(doc) as unknown as Record<string, unknown>;
    (broken.paths as Record<string, unknown>)['/v1/fillet/check'] = { post: { responses: 'none' } };
    const result = await new Validator().validate(broken);
    expect(result.valid).toBe(false);
  });
});

describe('operations', () => {
  const ops = operations();

  it('lists the check routes of every operation, POST and GET', () => {
    for (const o of OPERATIONS) {
      expect(doc.paths[o.path]?.post, `POST ${o.path}`).toBeDefined();
      expect(doc.paths[o.path]?.get, `GET ${o.path}`).toBeDefined();
    }
  });

  it('every operation has a unique operationId, a summary and a 200 response', () => {
    expect(ops.length).toBeGreaterThan(0);
    const ids = new Set<string>();
    for (const { path, method, op } of ops) {
      const where = `${method.toUpperCase()} ${path}`;
      expect(op.operationId, `${where} operationId`).toMatch(/^[a-z][A-Za-z0-9]*$/);
      expect(ids.has(op.operationId!), `${where} repeats operationId ${op.operationId}`).toBe(false);
      ids.add(op.operationId!);
      expect(op.summary?.trim().length ?? 0, `${where} summary`).toBeGreaterThan(0);
      expect(op.responses?.['200'], `${where} 200 response`).toBeDefined();
      expect(op.responses?.['200']?.description?.length ?? 0, `${where} 200 description`).toBeGreaterThan(0);
    }
  });

  it('check routes answer 400 and 422 as RFC 9457 problem documents', () => {
    const problem = deref({ $ref: '#/components/schemas/Problem' });
    expect(Object.keys((problem.properties as object) ?? {})).toEqual(expect.arrayContaining(['type', 'title', 'status', 'detail', 'errors', 'code']));
    for (const o of OPERATIONS) {
      for (const method of ['post', 'get']) {
        const responses = doc.paths[o.path]![method]!.responses ?? {};
        for (const status of ['400', '422']) {
          const where = `${method.toUpperCase()} ${o.path} ${status}`;
          const media = responses[status]?.content?.['application/problem+json'];
          expect(media, where).toBeDefined();
          expect(deref(media!.schema), where).toBe(problem);
        }
      }
    }
  });

  it('check routes declare JSON, CSV and plain-text answers for 200', () => {
    for (const o of OPERATIONS) {
      for (const method of ['post', 'get']) {
        const content = doc.paths[o.path]![method]!.responses!['200']!.content ?? {};
        expect(Object.keys(content), `${method.toUpperCase()} ${o.path}`).toEqual(expect.arrayContaining(['application/json', 'text/csv', 'text/plain']));
      }
    }
  });
});

describe('code catalogue in the contract', () => {
  const values = enumValues(doc);

  it('every check, limit, warning and error code is in an enum of the document', () => {
    const missing = (Object.keys(CODES) as Code[]).filter((c) => ['check', 'limit', 'warning', 'error'].includes(CODES[c].kind) && !values.has(c));
    expect(missing, 'codes missing from the contract: run `npm run openapi`').toEqual([]);
  });

  it('the problem document names exactly the error codes', () => {
    const problem = deref({ $ref: '#/components/schemas/Problem' });
    const code = (problem.properties as Record<string, { enum?: string[] }>).code;
    const errors = (Object.keys(CODES) as Code[]).filter((c) => CODES[c].kind === 'error');
    expect([...(code?.enum ?? [])].sort()).toEqual([...errors].sort());
  });

  it('the enums hold no code-like value that the catalogue does not know', () => {
    // Values shaped like our codes (two or more UPPER_SNAKE words) must all be catalogued.
    const codeLike = [...values].filter((v): v is string => typeof v === 'string' && /^[A-Z][A-Z0-9]*(_[A-Z0-9]+)+$/.test(v));
    expect(codeLike.filter((v) => !(v in CODES))).toEqual([]);
  });
});
