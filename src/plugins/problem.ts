/**
 * RFC 9457 problem details for every error the service returns. One place builds them; no
 * stack trace, file path or library message ever reaches a response.
 */
import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { CODES } from '../engine/codes.js';
import { EngineError } from '../engine/errors.js';
import { RequestFieldError } from '../operations/shared.js';
import type { ProblemBody } from '../schemas/common.js';
import { fieldErrors, RequestValidationError } from './validation.js';

export const PROBLEM_TYPE = 'application/problem+json';

export function problemType(slug: string): string {
  return `urn:throatline:problem:${slug}`;
}

export function problem(status: number, slug: string, title: string, detail: string, extra: Partial<ProblemBody> = {}): ProblemBody {
  return { type: problemType(slug), title, status, detail, ...extra };
}

/**
 * An error that carries the problem document to answer with: refusals raised outside a route
 * handler (authentication, rate limiting, body limits) are thrown as these.
 */
export class ProblemError extends Error {
  readonly problem: ProblemBody;
  constructor(body: ProblemBody) {
    super(body.detail);
    this.name = 'ProblemError';
    this.problem = body;
  }
}

/** Maps any thrown error to a problem document. Exported so batch items fail the same way. */
export function toProblem(err: unknown, request?: FastifyRequest): ProblemBody {
  if (err instanceof ProblemError) return err.problem;
  if (err instanceof EngineError) {
    const info = CODES[err.code];
    const out = problem(422, 'unanswerable', info.title, err.message, { code: err.code });
    if (err.pointer !== undefined) out.pointer = err.pointer;
    return out;
  }
  if (err instanceof RequestFieldError) {
    return problem(400, 'invalid-request', 'Invalid request', `${err.pointer || '/'}: ${err.message}`, { errors: [{ pointer: err.pointer, detail: err.message }] });
  }
  if (err instanceof RequestValidationError || (err as FastifyError | undefined)?.validation) {
    const e = err as RequestValidationError;
    const errors = fieldErrors(e.validation);
    const where = e.validationContext === 'body' || e.validationContext === 'query-form' ? '' : `${e.validationContext} `;
    const first = errors[0];
    return problem(400, 'invalid-request', 'Invalid request', first ? `${where}${first.pointer || '/'}: ${first.detail}` : 'The request does not match the schema.', { errors });
  }
  const fe = err as FastifyError | undefined;
  const status = typeof fe?.statusCode === 'number' ? fe.statusCode : 500;
  switch (fe?.code) {
    case 'FST_ERR_CTP_INVALID_JSON_BODY':
    case 'FST_ERR_CTP_EMPTY_JSON_BODY':
    case 'FST_ERR_CTP_INVALID_CONTENT_LENGTH':
      return problem(400, 'malformed-body', 'Malformed body', 'The body is not valid JSON.');
    case 'FST_ERR_CTP_BODY_TOO_LARGE':
      return problem(413, 'body-too-large', 'Body too large', 'The body is larger than this service accepts.');
    case 'FST_ERR_CTP_INVALID_MEDIA_TYPE':
      return problem(415, 'unsupported-media-type', 'Unsupported media type', 'Send application/json.');
    case 'FST_ERR_CTP_INVALID_TYPE':
      return problem(400, 'malformed-body', 'Malformed body', 'The content-type header is not valid.');
    case 'FST_ERR_HANDLER_TIMEOUT':
      return problem(408, 'request-timeout', 'Request timeout', 'The request was not received and answered within the time this service allows; send the body without pauses, or split a large batch.');
    case 'FST_ERR_BAD_URL':
      return problem(400, 'malformed-url', 'Malformed URL', 'The path is not a valid URL (a stray or broken % escape).');
  }
  if (status >= 400 && status < 500) {
    return problem(status, 'client-error', 'Request not accepted', 'The request could not be processed as sent.');
  }
  request?.log.error({ err }, 'unexpected error');
  return problem(500, 'internal', 'Internal error', 'The service failed to answer. The failure has been logged; please report the request that caused it.');
}

export function sendProblem(reply: FastifyReply, body: ProblemBody): FastifyReply {
  return reply.code(body.status).type(PROBLEM_TYPE).send(body);
}

/**
 * For the server option `frameworkErrors`: errors Fastify raises before routing (a path with a
 * broken % escape) answer as problem documents too, instead of Fastify's own JSON.
 */
export function frameworkErrors(err: FastifyError, request: FastifyRequest, reply: FastifyReply): void {
  void sendProblem(reply, toProblem(err, request));
}

export default fp(
  async function problemDetails(app: FastifyInstance) {
    app.setErrorHandler((err, request, reply) => {
      const body = toProblem(err, request);
      if (body.status < 500) request.log.debug({ status: body.status, problem: body.type }, 'request refused');
      return sendProblem(reply, body);
    });
    app.setNotFoundHandler((request, reply) =>
      sendProblem(reply, problem(404, 'not-found', 'Not found', `No route ${request.method} ${request.url.split('?')[0]}. See GET /openapi.json for the routes.`)),
    );
  },
  { name: 'problem-details' },
);
