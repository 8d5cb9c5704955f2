/**
 * POST /v1/batch: many calculations of any kind in one request, for BIM export pipelines.
 *
 * - application/json: an array of items `{ kind, id?, ...inputs }`; answers
 *   `{ results: [...], summary }` in the same order. Each item stands alone: a bad item gets a
 *   problem document in its slot and the others are answered. Such batches are computed
 *   BATCH_CONCURRENCY at a time, each body parsed when its turn comes (./lanes.ts).
 * - application/x-ndjson: one item per line in, one result per line out, streamed both ways, so
 *   the first result leaves before the last item arrives. The framework's body limit does not
 *   cover a raw stream, so the item, line and byte limits are counted here; past a limit the
 *   stream ends with a problem line.
 *
 * Items are validated with the operations' precompiled validators and answers serialized with
 * precompiled serializers, once per kind, not through the per-request route machinery.
 */
import { Readable } from 'node:stream';
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fastJson from 'fast-json-stringify';
import { lazyFunction } from '../../plugins/lazy-compile.js';
import { withNullable } from '../../plugins/serializers.js';
import { Type, type TSchema } from 'typebox';
import type { Config } from '../../config.js';
import type { Operation } from '../../operations/shared.js';
import { RequestFieldError } from '../../operations/shared.js';
import { bodyValidator, RequestValidationError, validatorCompiler } from '../../plugins/validation.js';
import { problem, PROBLEM_TYPE, ProblemError, sendProblem, toProblem } from '../../plugins/problem.js';
import { Problem, StringEnum } from '../../schemas/common.js';
import { pickValue } from '../../formats.js';
import { batchHtml, MAX_HTML_BATCH_ITEMS } from '../../report/batch-sheet.js';
import { HTML_TYPE, prefersHtml } from '../../report/respond.js';
import { batchBodyFault, tooDeep } from '../../plugins/json-body.js';
import { STALL_MS, type Lanes, type Lease } from './lanes.js';

/** IFC GlobalId: 22 characters of the IFC base-64 alphabet; the first encodes 2 bits (0-3). */
export const IFC_GLOBAL_ID = /^[0-3][0-9A-Za-z_$]{21}$/;

type Outcome = 'pass' | 'fail' | 'error';

interface Runner {
  /** Answers one item; with `fields`, a compact result holding only those answer fields. */
  run(item: unknown, index: number, fields?: readonly string[] | null, idFormat?: 'any' | 'ifc'): { json: string; outcome: Outcome };
}

/** Compact results: `fields=status,utilization,governing.code` keeps only those answer fields. */
export const FIELD_NAME = /^[A-Za-z][A-Za-z0-9_]*(\.[A-Za-z0-9_]+)*$/;
export const MAX_FIELDS = 30;

function project(answer: object, id: string | undefined, kind: string, fields: readonly string[]): string {
  const out: Record<string, unknown> = {};
  if (id !== undefined) out.id = id;
  out.kind = kind;
  const segments = splitFields(fields);
  for (let i = 0; i < fields.length; i++) {
    const f = fields[i]!;
    let v: unknown = null;
    try {
      v = pickValue(answer, f, segments[i]);
    } catch {
      v = null; // a field this kind of answer does not have
    }
    out[f] = v;
  }
  return JSON.stringify(out);
}

/** The fields of a request split at dots, once per request (a batch asks for the same ones for every item). */
const splitCache = new WeakMap<readonly string[], string[][]>();
function splitFields(fields: readonly string[]): string[][] {
  let s = splitCache.get(fields);
  if (s === undefined) splitCache.set(fields, (s = fields.map((f) => f.split('.'))));
  return s;
}

export function batchRunner(operations: readonly Operation[], defaultIds: 'any' | 'ifc' = 'any'): Runner {
  // Items are validated as they come, with `kind` allowed beside the operation's own fields, so
  // no per-item copy is made to strip it (the operations read only their own fields).
  const kinds = new Map(
    operations.map((op) => {
      const body = op.body as unknown as { properties: Record<string, unknown> };
      const withKind = { ...op.body, $id: undefined, properties: { ...body.properties, kind: { type: 'string' } } } as unknown as TSchema;
      return [op.kind, { op, validate: bodyValidator(withKind), serialize: lazyFunction(() => fastJson(withNullable(op.response) as object) as (x: unknown) => string) }] as const;
    }),
  );
  const BatchProblem = Type.Object(
    { ...Problem.properties, index: Type.Integer(), id: Type.Optional(Type.String()), kind: Type.Optional(Type.String()) },
    { additionalProperties: false },
  );
  const serializeProblem = lazyFunction(() => fastJson(BatchProblem as object) as (x: unknown) => string);
  const kindList = [...kinds.keys()].join(', ');

  return {
    run(item, index, fields, idFormat = defaultIds) {
      let id: string | undefined;
      let kind: string | undefined;
      try {
        if (item === null || typeof item !== 'object' || Array.isArray(item)) throw new RequestFieldError('', 'Each item must be an object { kind, id?, ...inputs }.');
        const body = item as Record<string, unknown>;
        const k = body.kind;
        if (typeof body.id === 'string') id = body.id;
        if (typeof k !== 'string' || !kinds.has(k)) throw new RequestFieldError('/kind', `kind must be one of: ${kindList}.`);
        kind = k;
        if (idFormat === 'ifc' && (typeof body.id !== 'string' || !IFC_GLOBAL_ID.test(body.id))) {
          throw new RequestFieldError('/id', 'id must be an IFC GlobalId: 22 characters of 0-9, A-Z, a-z, _ and $, the first 0-3.');
        }
        const entry = kinds.get(k)!;
        if (!entry.validate(body)) throw new RequestValidationError(entry.validate.errors ?? [], 'body');
        const answer = entry.op.run(body as never);
        return { json: fields ? project(answer, id, k, fields) : entry.serialize(answer), outcome: answer.status };
      } catch (err) {
        const p = toProblem(err);
        const out: Record<string, unknown> = { ...p, index };
        if (id !== undefined) out.id = id;
        if (kind !== undefined) out.kind = kind;
        return { json: serializeProblem(out), outcome: 'error' };
      }
    },
  };
}

const BatchQuery = Type.Object(
  {
    ids: Type.Optional(StringEnum(['any', 'ifc'] as const, { description: 'ifc: every item id must be an IFC GlobalId (22 characters of the IFC base-64 alphabet).' })),
    summary: Type.Optional(Type.Boolean({ description: 'NDJSON only: end the stream with one line { "summary": {...} }.' })),
    format: Type.Optional(StringEnum(['json', 'html'] as const, { description: `html (or Accept: text/html) with a JSON array: one page with a summary table, failing items first, and every item's calculation sheet (at most ${MAX_HTML_BATCH_ITEMS} items).` })),
    fields: Type.Optional(Type.String({ maxLength: 2000, description: `Compact results: a comma list of answer fields (dotted, e.g. status,utilization,governing.code,governing.ratio; at most ${MAX_FIELDS}). Each result is then { id, kind, <field>: value } with null where an answer has no such field; problems are unchanged.` })),
  },
  { additionalProperties: false },
);

const Summary = Type.Object(
  { items: Type.Integer(), pass: Type.Integer(), fail: Type.Integer(), error: Type.Integer() },
  { additionalProperties: false },
);

/**
 * A JSON batch body as received: its text, checked for depth, parsed when the request's turn
 * comes (routes/v1/lanes.ts).
 */
class BatchText {
  constructor(readonly text: string) {}
}

/** Most members of an array or object inside a JSON batch body (checked on its text, before parsing). */
export const MAX_MEMBERS = 1000;

/** Seconds a batch refused for want of room is told to wait (batches take seconds to answer). */
export const BUSY_RETRY_S = 5;

export default async function batchRoutes(app: FastifyInstance, opts: { config: Config; operations: readonly Operation[]; lanes: Lanes }): Promise<void> {
  const { config, operations } = opts;
  // One set of compiled validators and serializers serves both id formats.
  const shared = batchRunner(operations);
  const runners: Record<'any' | 'ifc', Runner> = {
    any: shared,
    ifc: { run: (item, index, fields) => shared.run(item, index, fields, 'ifc') },
  };
  const kinds = operations.map((o) => o.kind);

  const { lanes } = opts;
  // JSON bodies of this route are kept as text until the request's turn: checked on their text
  // now (depth as every JSON body, and the item and member counts, see batchBodyFault), the
  // framework's parser (and its errors) then.
  const parseJson = app.getDefaultJsonParser('error', 'error');
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'string' }, (_request, body, done) => {
    const text = body as string;
    const fault = batchBodyFault(text, config.JSON_MAX_DEPTH, config.BATCH_MAX_ITEMS, MAX_MEMBERS);
    if (fault === null) done(null, new BatchText(text));
    else if (fault.kind === 'deep') done(tooDeep(config.JSON_MAX_DEPTH), undefined);
    else if (fault.kind === 'items') done(new ProblemError(problem(413, 'batch-too-large', 'Batch too large', `At most ${config.BATCH_MAX_ITEMS} items per batch; this one has more.`)), undefined);
    else {
      const detail = `holds an array or object of more than ${MAX_MEMBERS} members; no input of this service has more than 50.`;
      done(new ProblemError(problem(400, 'too-wide', 'List too long', `/${fault.item}: ${detail}`, { errors: [{ pointer: `/${fault.item}`, detail }] })), undefined);
    }
  });
  const parseTurn = (request: FastifyRequest, text: string): Promise<unknown> =>
    new Promise((resolve, reject) => parseJson(request, text, (err, value) => (err ? reject(err) : resolve(value))));

  // NDJSON bodies reach the handler as the raw request stream.
  app.addContentTypeParser('application/x-ndjson', (_request, payload, done) => done(null, payload));

  app.post('/v1/batch', {
    bodyLimit: config.BATCH_BODY_LIMIT,
    schema: {
      operationId: 'batch',
      tags: ['batch'],
      summary: 'Many checks of any kind in one request (JSON array, or NDJSON streamed both ways)',
      description:
        `Each item is { "kind": one of ${kinds.join(', ')}, "id"?: ..., ...the inputs of that kind's POST body }. ` +
        'Results keep the order and id of their items; an item that fails gets a problem document (with its index) in its slot. ' +
        `At most ${config.BATCH_MAX_ITEMS} items; NDJSON lines at most ${config.BATCH_MAX_LINE} bytes and streams at most ${config.BATCH_BODY_LIMIT} bytes.`,
      querystring: BatchQuery,
      body: {
        content: {
          'application/json': { schema: Type.Array(Type.Object({ kind: StringEnum(kinds) }, { additionalProperties: true }), { maxItems: config.BATCH_MAX_ITEMS }) },
          'application/x-ndjson': { schema: Type.String({ description: 'One item per line.' }) },
        },
      },
      response: {
        200: {
          description: 'Results in item order.',
          content: {
            'application/json': { schema: Type.Object({ results: Type.Array(Type.Object({}, { additionalProperties: true })), summary: Summary }) },
            'application/x-ndjson': { schema: Type.String({ description: 'One result per line.' }) },
            'text/html': { schema: Type.String({ description: 'format=html: the summary page with every item\'s calculation sheet.' }) },
          },
        },
        400: { description: 'The batch itself is malformed.', content: { [PROBLEM_TYPE]: { schema: Type.Ref('Problem') } } },
        503: {
          description: `A JSON batch that does not fit beside the request bodies this replica already holds (BODY_HOLD_BYTES), read and dropped; retry after Retry-After (${BUSY_RETRY_S} s).`,
          content: { [PROBLEM_TYPE]: { schema: Type.Ref('Problem') } },
        },
      },
    },
    // A batch waits for a lane and takes seconds: a refused one is told to come back later.
    config: { holdRetryS: BUSY_RETRY_S },
    // The ndjson body is a stream, not a value to validate; item validation happens per item.
    validatorCompiler: (route) => (route.httpPart === 'body' ? (value: unknown) => ({ value }) : validatorCompiler(route)),
    handler: async (request: FastifyRequest, reply: FastifyReply) => {
      const q = request.query as { ids?: 'any' | 'ifc'; summary?: boolean | string; fields?: string; format?: 'json' | 'html' };
      const runner = runners[q.ids === 'ifc' ? 'ifc' : 'any'];
      let fields: string[] | null = null;
      if (q.fields !== undefined) {
        fields = q.fields.split(',').map((f) => f.trim()).filter((f) => f !== '');
        const bad = fields.find((f) => !FIELD_NAME.test(f));
        if (fields.length === 0 || fields.length > MAX_FIELDS || bad !== undefined) {
          return sendProblem(reply, problem(400, 'invalid-request', 'Invalid request', `/fields: ${bad !== undefined ? `"${bad}" is not a dotted field name` : `give 1 to ${MAX_FIELDS} field names`}.`, { errors: [{ pointer: '/fields', detail: 'a comma list of dotted answer fields, e.g. status,utilization,governing.code' }] }));
        }
      }
      let body = request.body;
      let lease: Lease | null = null;
      if (body instanceof BatchText) {
        // Its turn; null when the client left, or the deadline answered it, while it waited.
        lease = await lanes.enter(reply.raw);
        if (lease === null) return reply;
        body = await parseTurn(request, body.text);
      }
      if (q.format === 'html' || (q.format === undefined && prefersHtml(request.headers.accept))) {
        if (!Array.isArray(body)) return sendProblem(reply, problem(400, 'invalid-request', 'Invalid request', 'format=html answers a JSON array of items, not NDJSON.', { errors: [{ pointer: '', detail: 'must be an array' }] }));
        if (body.length > MAX_HTML_BATCH_ITEMS) {
          return sendProblem(reply, problem(413, 'batch-too-large', 'Batch too large for one page', `format=html puts every item's sheet on one page: at most ${MAX_HTML_BATCH_ITEMS} items, this batch has ${body.length}. Split it, or ask for JSON or NDJSON.`));
        }
        const page = batchHtml(body, (item, i) => runner.run(item, i, null), operations);
        lease?.release();
        request.holding?.release();
        return reply.type(HTML_TYPE).send(page);
      }
      // BATCH_MAX_ITEMS was checked on the text, before parsing (batchBodyFault).
      if (Array.isArray(body)) {
        const { holding } = request;
        return reply.type('application/json; charset=utf-8').send(Readable.from(jsonResults(body, runner, fields, lease, () => holding?.release())));
      }
      if (body instanceof Readable || (body && typeof (body as NodeJS.ReadableStream).pipe === 'function')) {
        const wantSummary = q.summary === true || q.summary === 'true';
        const out = Readable.from(ndjsonResults(body as AsyncIterable<Buffer>, runner, config, wantSummary, request, fields));
        return reply.type('application/x-ndjson; charset=utf-8').send(out);
      }
      return sendProblem(reply, problem(400, 'invalid-request', 'Invalid request', 'A batch is a JSON array of items, or NDJSON with one item per line.', { errors: [{ pointer: '', detail: 'must be an array' }] }));
    },
  });
}

const NEWLINE = 0x0a;

/** Items answered between two turns of the event loop in a JSON batch (about 1-2 ms of work). */
const YIELD_EVERY = 256;
const yieldToLoop = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

const EMPTY = Buffer.alloc(0);

/**
 * Answer text gathered as UTF-8 bytes, one result at a time, and taken as one Buffer per slice.
 * Each result is encoded as soon as it is made: a serialized answer is a tree of string pieces
 * (several times the size of its text) until something flattens it, and holding a slice's worth
 * of such trees until the slice was joined made them outlive young-generation collections, so
 * garbage collection took a quarter of a full-answer batch's CPU. Encoded at once they die young;
 * the socket then writes bytes without encoding them again. Measured on 1,000 full fillet
 * answers per request: 37-41 ms of CPU per request with joined strings, 27-31 ms so; an
 * NDJSON stream of full answers 29-32 against 25-28 µs per line.
 */
export class Utf8Slices {
  private buf: Buffer = EMPTY;
  private used = 0;

  /** `capacity`: room for a slice of compact results; a slice that outgrows it doubles it, and the next slices start at that size. */
  constructor(private capacity = 64 * 1024) {}

  add(text: string): void {
    // UTF-8 takes at most 3 bytes per UTF-16 unit, so this much room always holds the text.
    const room = text.length * 3;
    if (this.used + room > this.buf.length) {
      // A slice's buffer is made on its first text (none is left over after the last slice).
      this.capacity = this.buf.length === 0 ? Math.max(this.capacity, room) : Math.max(this.capacity * 2, this.used + room);
      const bigger = Buffer.allocUnsafe(this.capacity);
      this.buf.copy(bigger, 0, 0, this.used);
      this.buf = bigger;
    }
    this.used += this.buf.write(text, this.used, 'utf8');
  }

  get empty(): boolean {
    return this.used === 0;
  }

  /** The bytes gathered so far; the next ones go into a fresh buffer (the socket may still be writing these). */
  take(): Buffer {
    const b = this.buf.subarray(0, this.used);
    this.buf = EMPTY;
    this.used = 0;
    return b;
  }
}

/**
 * The JSON answer to an array of items, streamed a slice of results at a time: `{"results":[`,
 * the results, then `],"summary":{...}}`, so that a large batch neither holds every answer
 * until the last item is done nor keeps the event loop for the whole batch. The array (the
 * request's parsed body) is emptied as its items are answered.
 */
async function* jsonResults(items: unknown[], runner: Runner, fields: readonly string[] | null, lease: Lease | null, computed: () => void): AsyncGenerator<Buffer> {
  const counts = { items: items.length, pass: 0, fail: 0, error: 0 };
  const out = new Utf8Slices();
  out.add('{"results":[');
  try {
    for (let i = 0; i < items.length; i++) {
      // Give the event loop a turn between slices, so a large batch does not hold up other
      // requests (or look like an overloaded process to the load-shedding check).
      if (i > 0 && i % YIELD_EVERY === 0) {
        // A slice not taken within STALL_MS: the client reads slowly; let another batch compute.
        const stall = lease ? setTimeout(() => lease.release(), STALL_MS) : undefined;
        yield out.take();
        clearTimeout(stall);
        if (lease !== null && !(await lease.reenter())) return;
        await yieldToLoop();
      }
      const r = runner.run(items[i], i, fields);
      // Let the answered item go: the parsed body is most of what survives each young-generation
      // collection while a batch runs, and is copied on every one (compact 1,000-item batches:
      // 9.1-9.6 -> 8.4-9.1 ms CPU per request, alternating runs).
      items[i] = undefined;
      out.add(i > 0 ? ',' + r.json : r.json);
      counts[r.outcome]++;
    }
    out.add(`],"summary":${JSON.stringify(counts)}}`);
    // Everything is computed: the rest is the client's reading.
    lease?.release();
    computed();
    yield out.take();
  } finally {
    lease?.release();
  }
}

/** Reads NDJSON items from the stream and yields result lines, a chunk's worth at a time. */
async function* ndjsonResults(
  input: AsyncIterable<Buffer>,
  runner: Runner,
  config: Config,
  wantSummary: boolean,
  request: FastifyRequest,
  fields: readonly string[] | null,
): AsyncGenerator<string | Buffer> {
  const counts = { items: 0, pass: 0, fail: 0, error: 0 };
  let pending: Buffer[] = [];
  let pendingBytes = 0;
  let overlong = false;
  let totalBytes = 0;
  let index = 0;
  let stopped: string | null = null;

  const handleLine = (line: string, out: Utf8Slices): void => {
    if (line.trim() === '') return;
    if (index >= config.BATCH_MAX_ITEMS) {
      stopped = stopLine(413, 'batch-too-large', 'Batch too large', `At most ${config.BATCH_MAX_ITEMS} items per batch; the stream was cut after item ${index - 1}.`);
      return;
    }
    let item: unknown;
    let result: { json: string; outcome: Outcome };
    try {
      item = JSON.parse(line);
      result = runner.run(item, index, fields);
    } catch {
      result = { json: JSON.stringify({ ...problem(400, 'malformed-body', 'Malformed item', `Line of item ${index} is not valid JSON.`), index }), outcome: 'error' };
    }
    out.add(result.json + '\n');
    counts.items++;
    counts[result.outcome]++;
    index++;
  };

  for await (const chunk of input) {
    totalBytes += chunk.length;
    if (totalBytes > config.BATCH_BODY_LIMIT) {
      stopped = stopLine(413, 'body-too-large', 'Stream too large', `At most ${config.BATCH_BODY_LIMIT} bytes per stream; the stream was cut after item ${index - 1}.`);
      break;
    }
    const out = new Utf8Slices();
    let start = 0;
    for (;;) {
      const nl = chunk.indexOf(NEWLINE, start);
      const end = nl === -1 ? chunk.length : nl;
      const piece = chunk.subarray(start, end);
      if (!overlong) {
        if (pendingBytes + piece.length > config.BATCH_MAX_LINE) {
          overlong = true;
          pending = [];
          pendingBytes = 0;
        } else if (piece.length > 0) {
          pending.push(piece);
          pendingBytes += piece.length;
        }
      }
      if (nl === -1) break;
      if (overlong) {
        out.add(JSON.stringify({ ...problem(413, 'line-too-long', 'Item line too long', `Item ${index} is longer than ${config.BATCH_MAX_LINE} bytes.`), index }) + '\n');
        counts.items++;
        counts.error++;
        index++;
        overlong = false;
      } else {
        handleLine(Buffer.concat(pending, pendingBytes).toString('utf8'), out);
        pending = [];
        pendingBytes = 0;
      }
      if (stopped) break;
      start = nl + 1;
    }
    if (!out.empty) yield out.take();
    if (stopped) break;
  }
  if (!stopped && (pendingBytes > 0 || overlong)) {
    const out = new Utf8Slices();
    if (overlong) {
      out.add(JSON.stringify({ ...problem(413, 'line-too-long', 'Item line too long', `Item ${index} is longer than ${config.BATCH_MAX_LINE} bytes.`), index }) + '\n');
      counts.items++;
      counts.error++;
    } else {
      handleLine(Buffer.concat(pending, pendingBytes).toString('utf8'), out);
    }
    if (!out.empty) yield out.take();
  }
  if (stopped) {
    yield stopped;
    // Discard the rest of the upload so the connection ends cleanly rather than by a reset.
    request.raw.resume();
  }
  if (wantSummary) yield JSON.stringify({ summary: counts }) + '\n';
}

function stopLine(status: number, slug: string, title: string, detail: string): string {
  return JSON.stringify({ problem: problem(status, slug, title, detail) }) + '\n';
}
