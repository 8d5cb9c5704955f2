/**
 * Registers a calculation as POST (JSON body) and GET (query-string form for spreadsheet cells
 * and links), both answering JSON, CSV or one bare value. Thin: validate, run, format.
 */
import type { FastifyInstance, FastifyReply } from 'fastify';
import { Type } from 'typebox';
import { pickField, toCsv } from '../../formats.js';
import { unflatten, coerce } from '../../query.js';
import { DEFAULT_COLUMNS, MAX_RANGE_VALUES, rangeCsv, rangeTable, rangeXml } from '../../range.js';
import type { CommonBody, Envelope, Operation } from '../../operations/shared.js';
import { StringEnum } from '../../schemas/common.js';
import { bodyValidator, RequestValidationError } from '../../plugins/validation.js';
import { RequestFieldError } from '../../operations/shared.js';
import { PROBLEM_TYPE } from '../../plugins/problem.js';
import { closePdfBrowsers, prefersHtml, replySheet, SHEET_FORMATS, sheetContent } from '../../report/respond.js';

const BASE_FORMATS = ['json', 'csv', 'value'] as const;

export function formatQuery(extra: readonly string[] = []) {
  return Type.Object(
    {
      format: Type.Optional(
        StringEnum([...BASE_FORMATS, ...extra], {
          description: `json (default); csv: a header row and a data row; value: one bare value named by field${extra.length ? `; ${extra.join(', ')}: a rendering of the answer` : ''}.`,
        }),
      ),
      field: Type.Optional(Type.String({ maxLength: 200, description: 'With format=value: dotted path of the value, e.g. utilization, status, governing.available, checks.FILLET_WELD_METAL.ratio.' })),
    },
    { additionalProperties: false },
  );
}

function problemResponses() {
  const ref = { content: { [PROBLEM_TYPE]: { schema: Type.Ref('Problem') } } };
  return {
    400: { description: 'Invalid request: the errors list points at each offending field.', ...ref },
    422: { description: 'Well-formed, but the engineering rules cannot answer it; the code says why.', ...ref },
    501: { description: 'format=pdf on a host without a headless Chromium (format=html gives the same sheet).', ...ref },
    503: { description: 'format=pdf: the browser failed or ran out of time printing the sheet; or the replica already holds as many request bodies as it takes at once (BODY_HOLD_BYTES; Retry-After).', ...ref },
  };
}

function successResponse(op: Operation) {
  const content: Record<string, { schema: unknown }> = {
    'application/json': { schema: Type.Ref((op.response as { $id: string }).$id) },
    'text/csv': { schema: Type.String({ description: 'Header row of dotted field names and one data row.' }) },
    'text/plain': { schema: Type.String({ description: 'One bare value (format=value).' }) },
    ...sheetContent(),
  };
  for (const [name, f] of Object.entries(op.formats ?? {})) {
    content[f.contentType.split(';')[0]!] = { schema: Type.String({ description: `format=${name}` }) };
  }
  return { description: 'The check, in the requested format.', content };
}

/** The GET form also answers a range table as XML (format=xml with vary=). */
function rangeResponse(r: ReturnType<typeof successResponse>) {
  return { ...r, content: { ...r.content, 'application/xml': { schema: Type.String({ description: 'Range table (vary= with format=xml).' }) } } };
}

function answer(op: Operation, reply: FastifyReply, result: Envelope<unknown>, body: CommonBody, format: string | undefined, field: string | undefined, options: CheckRouteOptions): object | Promise<FastifyReply | object> {
  // The usual case first, without a promise: JSON asked for, or nothing asked and no browser.
  if (format === 'json' || (format === undefined && !prefersHtml(reply.request.headers.accept))) return result;
  return answerAs(op, reply, result, body, format, field, options);
}

async function answerAs(op: Operation, reply: FastifyReply, result: Envelope<unknown>, body: CommonBody, format: string | undefined, field: string | undefined, options: CheckRouteOptions): Promise<FastifyReply | object> {
  const extra = format ? op.formats?.[format] : undefined;
  if (extra) return reply.type(extra.contentType).send(extra.render(result, body));
  // The calculation sheet: format=html or pdf, or a browser's Accept header.
  const sheet = await replySheet(reply, { op, answer: result as never, body: body as unknown as Record<string, unknown> }, format, options.chromiumPath);
  if (sheet) return sheet;
  if (format === 'value') {
    if (!field) throw new RequestFieldError('/field', 'format=value needs field=, e.g. field=utilization.');
    return reply.type('text/plain; charset=utf-8').send(pickField(result, field));
  }
  if (format === 'csv') return reply.type('text/csv; charset=utf-8').send(toCsv(result));
  return result;
}

export interface CheckRouteOptions {
  /** Headless Chromium for format=pdf (config CHROMIUM_PATH); empty or absent: the usual paths. */
  chromiumPath?: string;
}

/** Apps that already close the PDF browser on shutdown. */
const closesBrowser = new WeakSet<FastifyInstance>();

export function registerCheck(app: FastifyInstance, op: Operation, options: CheckRouteOptions = {}): void {
  if (!closesBrowser.has(app)) {
    closesBrowser.add(app);
    app.addHook('onClose', async () => closePdfBrowsers());
  }
  // The answer's schema is a shared component (added on the root by buildApp): one copy in the
  // contract for both forms.
  const validate = bodyValidator(op.body);
  const FormatQuery = formatQuery([...Object.keys(op.formats ?? {}), ...SHEET_FORMATS]);

  app.post(op.path, {
    schema: {
      operationId: `${camel(op.kind)}Check`,
      tags: [op.kind],
      summary: op.summary,
      description: op.description,
      querystring: FormatQuery,
      body: op.body,
      response: { 200: successResponse(op), ...problemResponses() },
    },
    // The operation's named examples become the request body's examples in the contract.
    config: { swaggerTransform: ({ schema, url }) => ({ schema: { ...schema, body: { ...(schema.body as object), 'x-examples': op.examples } }, url }) },
    handler: async (request, reply) => {
      const q = request.query as { format?: string; field?: string };
      const body = request.body as CommonBody;
      return answer(op, reply, op.run(body as never), body, q.format, q.field, options);
    },
  });

  app.get(op.path, {
    schema: {
      operationId: `${camel(op.kind)}CheckQuery`,
      tags: [op.kind],
      summary: `${op.summary} (query-string form)`,
      description:
        'The same calculation from query parameters, for spreadsheet cells and links: nested fields as dotted names ' +
        '(welds.0.size=5/16&parts.0.thickness=0.5), lists with commas, fractions accepted in imperial. ' +
        'Every field of the POST body is accepted this way.',
      querystring: Type.Object(
        {
          format: Type.Optional(
            StringEnum([...new Set([...BASE_FORMATS, ...Object.keys(op.formats ?? {}), ...SHEET_FORMATS, 'xml'])], {
              description: `${(FormatQuery.properties.format as { description?: string }).description ?? ''} With vary= (a range table): csv (default), json, or xml (one row element per value, one element per column, for FILTERXML).`,
            }),
          ),
          field: FormatQuery.properties.field,
          vary: Type.Optional(Type.String({ maxLength: 200, description: 'Range table: the dotted name of the one input to vary, e.g. welds.0.size. Answers one row per value (csv by default).' })),
          values: Type.Optional(Type.String({ maxLength: 4000, description: `Range table: comma list of values for the varied input (at most ${MAX_RANGE_VALUES}).` })),
          columns: Type.Optional(Type.String({ maxLength: 2000, description: `Range table: comma list of answer fields, one column each (default ${DEFAULT_COLUMNS.join(',')}).` })),
        },
        { additionalProperties: Type.Union([Type.String(), Type.Array(Type.String())]) },
      ),
      response: { 200: rangeResponse(successResponse(op)), ...problemResponses() },
    },
    handler: async (request, reply) => {
      const { format, field, vary, values, columns, ...rest } = request.query as Record<string, string | string[] | undefined> & { format?: string; field?: string; vary?: string };
      if (vary !== undefined) {
        const table = rangeTable(op, validate, rest, vary, values, columns);
        if (format === 'json') return reply.type('application/json; charset=utf-8').send(JSON.stringify({ vary: table.vary, columns: table.columns, rows: table.rows }));
        if (format === 'xml') return reply.type('application/xml; charset=utf-8').send(rangeXml(table));
        if (format !== undefined && format !== 'csv') throw new RequestFieldError('/format', 'A range table (vary=) answers format=csv (default), json or xml.');
        return reply.type('text/csv; charset=utf-8').send(rangeCsv(table));
      }
      if (format === 'xml' && !op.formats?.xml) throw new RequestFieldError('/format', 'format=xml answers range tables (vary=) only.');
      if (values !== undefined || columns !== undefined) throw new RequestFieldError(values !== undefined ? '/values' : '/columns', 'values= and columns= go with vary= (a range table).');
      const body = coerce(op.body as never, unflatten(rest));
      if (!validate(body)) throw new RequestValidationError(validate.errors ?? [], 'query-form');
      return answer(op, reply, op.run(body as never), body as unknown as CommonBody, format, field, options);
    },
  });
}

function camel(kind: string): string {
  return kind.replace(/-(\w)/g, (_, c: string) => c.toUpperCase());
}
