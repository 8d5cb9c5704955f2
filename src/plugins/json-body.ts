/**
 * The JSON body parser: the framework's own (prototype-poisoning protection included), behind a
 * depth check. Before the body is parsed, one pass over its text counts how deeply arrays and
 * objects nest (brackets inside strings do not count); deeper than JSON_MAX_DEPTH is a 400
 * problem naming the limit. No request of this API nests deeper than a handful of levels, and
 * a body of ten thousand `[` should cost one scan, not a parse and a validation.
 */
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { problem, ProblemError } from './problem.js';

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACKET = 0x5d;

/** Whether arrays and objects in JSON text nest deeper than `max` (outside strings). */
export function nestsDeeperThan(text: string, max: number): boolean {
  if (text.length <= max) return false;
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === BACKSLASH) i++;
      else if (c === QUOTE) inString = false;
    } else if (c === QUOTE) {
      inString = true;
    } else if (c === OPEN_BRACE || c === OPEN_BRACKET) {
      if (++depth > max) return true;
    } else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
      depth--;
    }
  }
  return false;
}

export default fp(
  async function jsonBody(app: FastifyInstance, opts: { maxDepth: number }) {
    const parse = app.getDefaultJsonParser('error', 'error');
    app.removeContentTypeParser('application/json');
    app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => {
      const text = typeof body === 'string' ? body : body.toString('utf8');
      if (nestsDeeperThan(text, opts.maxDepth)) {
        done(new ProblemError(problem(400, 'too-deep', 'Body nested too deeply', `Arrays and objects in the body nest deeper than ${opts.maxDepth} levels, the most this service reads.`)), undefined);
        return;
      }
      parse(request, text, done);
    });
  },
  { name: 'json-body' },
);
