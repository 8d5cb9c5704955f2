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
const COMMA = 0x2c;

/** The index of the quote that closes the string opened at `open`: the next one not escaped by an odd run of backslashes; -1 if none. */
function closingQuote(text: string, open: number): number {
  let j = open;
  for (;;) {
    j = text.indexOf('"', j + 1);
    if (j === -1) return -1;
    let backslashes = 0;
    while (text.charCodeAt(j - 1 - backslashes) === BACKSLASH) backslashes++;
    if ((backslashes & 1) === 0) return j;
  }
}

/**
 * Whether arrays and objects in JSON text nest deeper than `max` (outside strings). A string is
 * skipped in one jump to its closing quote (the next quote not escaped by an odd run of
 * backslashes), found by indexOf: keys and string values are most of a body, and stepping
 * through them a character at a time made this scan 7 % of a 1,000-item batch's CPU.
 * It stays apart from batchBodyFault, whose loop it shares in shape: every JSON body takes this
 * path, and delegating to batchBodyFault with unbounded counts cost the fillet route 5-12 µs per
 * request (alternating runs, 89.8-100.2 against 84.1-88.0 µs).
 */
export function nestsDeeperThan(text: string, max: number): boolean {
  if (text.length <= max) return false;
  let depth = 0;
  const n = text.length;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === QUOTE) {
      i = closingQuote(text, i);
      if (i === -1) return false; // an unterminated string: the parser refuses the body
    } else if (c === OPEN_BRACE || c === OPEN_BRACKET) {
      if (++depth > max) return true;
    } else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
      depth--;
    }
  }
  return false;
}

/** The first limit a batch body's text breaks, found before it is parsed (see batchBodyFault). */
export type BatchFault = { kind: 'deep' } | { kind: 'items' } | { kind: 'wide'; item: number };

/**
 * One pass over a JSON batch body (an array of items) before it is parsed: whether arrays and
 * objects nest deeper than `maxDepth`, whether the top-level array has more than `maxItems`
 * members, and whether any array or object inside it has more than `maxMembers`. Members are
 * counted at the commas between them, outside strings.
 *
 * Why before parsing: the parser makes every member of an array before anything can count them.
 * A 60 MB body of one array of 30 million zeros took the process to 919 MiB resident (the
 * parsed array, and its copy while it grew), where the same bytes as 3,000 arrays of 10,000
 * took 454 MiB and an ordinary 25 MB batch of 100,000 items about 245 MiB. No request of this
 * API has a list of more than 50 members, so a bound of a thousand refuses no valid item.
 */
export function batchBodyFault(text: string, maxDepth: number, maxItems: number, maxMembers: number): BatchFault | null {
  let depth = 0;
  // Commas seen in the container open at each depth (depth 1: the items).
  const commas = new Int32Array(maxDepth + 2);
  const n = text.length;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === QUOTE) {
      i = closingQuote(text, i);
      if (i === -1) return null; // an unterminated string: the parser refuses the body
    } else if (c === COMMA) {
      if (depth === 1) {
        if (++commas[1]! >= maxItems) return { kind: 'items' };
      } else if (depth > 1 && ++commas[depth]! >= maxMembers) {
        return { kind: 'wide', item: commas[1]! };
      }
    } else if (c === OPEN_BRACE || c === OPEN_BRACKET) {
      if (++depth > maxDepth) return { kind: 'deep' };
      commas[depth] = 0;
    } else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
      depth--;
    }
  }
  return null;
}

/** The answer to a body that nests deeper than `max`. */
export function tooDeep(max: number): ProblemError {
  return new ProblemError(problem(400, 'too-deep', 'Body nested too deeply', `Arrays and objects in the body nest deeper than ${max} levels, the most this service reads.`));
}

export default fp(
  async function jsonBody(app: FastifyInstance, opts: { maxDepth: number }) {
    const parse = app.getDefaultJsonParser('error', 'error');
    app.removeContentTypeParser('application/json');
    app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => {
      const text = typeof body === 'string' ? body : body.toString('utf8');
      if (nestsDeeperThan(text, opts.maxDepth)) {
        done(tooDeep(opts.maxDepth), undefined);
        return;
      }
      parse(request, text, done);
    });
  },
  { name: 'json-body' },
);
