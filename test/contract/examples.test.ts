/**
 * Every request example the contract shows works: the examples each operation declares and the
 * JSON files under openapi/examples/ answer 200, and they appear in the OpenAPI document as
 * request-body examples (so the reference page and generated clients show them).
 *
 * A file under openapi/examples/ is named after the POST route it is for: the path without
 * /v1/, slashes as dashes (fillet-check.json is for POST /v1/fillet/check), optionally with a
 * suffix after a dot (fillet-check.metric.json). Files named batch-*.json are batch exports and
 * their expected summaries (batch-workshop.json, batch-workshop.summary.json), not request
 * examples of one route: test/http/workshop-batch.test.ts runs them.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { OPERATIONS } from '../../src/operations/index.js';
import { app as build } from '../helpers.js';

const EXAMPLES_DIR = fileURLToPath(new URL('../../openapi/examples/', import.meta.url));
const FILES = readdirSync(EXAMPLES_DIR)
  .filter((f) => f.endsWith('.json') && !f.startsWith('batch-'))
  .sort();

interface MediaType {
  schema?: unknown;
  example?: unknown;
  examples?: Record<string, { summary?: string; value?: unknown }>;
}
interface Doc {
  paths: Record<string, Record<string, { requestBody?: { content?: Record<string, MediaType> } }>>;
}

let app: FastifyInstance;
let doc: Doc;
beforeAll(async () => {
  app = await build();
  doc = app.swagger() as unknown as Doc;
});
afterAll(async () => {
  await app.close();
});

function requestExamples(path: string): Array<{ name: string; summary?: string; value: unknown }> {
  const media = doc.paths[path]?.post?.requestBody?.content?.['application/json'];
  const named = Object.entries(media?.examples ?? {}).map(([name, e]) => ({ name, summary: e.summary, value: e.value }));
  return media && 'example' in media ? [...named, { name: 'example', value: media.example }] : named;
}

/** The POST route a file under openapi/examples/ is for. */
function routeOfFile(file: string): string | undefined {
  const stem = file.replace(/\.json$/, '').split('.')[0]!;
  return Object.keys(doc.paths).find((p) => doc.paths[p]?.post && p.replace(/^\/v1\//, '').replace(/\//g, '-') === stem);
}

describe('examples declared by the operations', () => {
  const cases = OPERATIONS.flatMap((op) => Object.entries(op.examples).map(([name, e]) => ({ op, name, e })));

  it('every operation declares at least one example, with a summary in the workshop scenario', () => {
    for (const op of OPERATIONS) {
      const examples = Object.values(op.examples);
      expect(examples.length, op.path).toBeGreaterThan(0);
      for (const e of examples) expect(e.summary, op.path).toMatch(/^WS-[A-Z]+\d+/);
    }
  });

  for (const { op, name, e } of cases) {
    it(`${op.path} example "${name}" answers 200 with a check`, async () => {
      const res = await app.inject({ method: 'POST', url: op.path, payload: e.value as object });
      expect(res.statusCode, res.body.slice(0, 500)).toBe(200);
      const body = res.json() as { status: string; checks: unknown[]; id?: string };
      expect(['pass', 'fail']).toContain(body.status);
      expect(body.checks.length).toBeGreaterThan(0);
      if ((e.value as { id?: string }).id !== undefined) expect(body.id).toBe((e.value as { id?: string }).id);
    });

    it(`${op.path} example "${name}" is a request-body example of the contract, with its summary`, () => {
      const found = requestExamples(op.path).find((x) => x.name === name);
      expect(found, `no example "${name}" in the request body of POST ${op.path}`).toBeDefined();
      expect(found!.summary).toBe(e.summary);
      expect(found!.value).toEqual(e.value);
    });
  }
});

describe('example files under openapi/examples/', () => {
  it('there is at least one', () => {
    expect(FILES.length).toBeGreaterThan(0);
  });

  for (const file of FILES) {
    it(`${file} names a POST route of the contract`, () => {
      expect(routeOfFile(file), `${file}: name it after its route, e.g. fillet-check.json for POST /v1/fillet/check`).toBeDefined();
    });

    it(`${file} answers 200`, async () => {
      const path = routeOfFile(file);
      if (!path) return expect.fail(`${file} names no POST route`);
      const payload = JSON.parse(readFileSync(join(EXAMPLES_DIR, file), 'utf8')) as object;
      const res = await app.inject({ method: 'POST', url: path, payload });
      expect(res.statusCode, res.body.slice(0, 500)).toBe(200);
    });

    it(`${file} is one of the contract's request-body examples of its route`, () => {
      const path = routeOfFile(file);
      if (!path) return expect.fail(`${file} names no POST route`);
      const payload = JSON.parse(readFileSync(join(EXAMPLES_DIR, file), 'utf8')) as unknown;
      const values = requestExamples(path).map((x) => x.value);
      expect(values, `${file} is not among the examples of POST ${path}: add it to the operation's examples`).toContainEqual(payload);
    });
  }
});
