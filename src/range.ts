/**
 * Range tables for spreadsheets: one GET that varies one input over a list of values and answers
 * one row per value, so a single formula fills a design table (sizes down, utilization across).
 *
 *   ...&vary=welds.0.size&values=3/16,1/4,5/16&columns=status,utilization,governing.code
 *
 * A value the schema refuses fails the whole request (400, pointing at /values/<i>), since a
 * table with a silently wrong row is worse than none; a value the rules cannot answer (422) gets
 * its code in the status column and empty numbers, and the other rows are still answered.
 */
import type { ValidateFunction } from 'ajv';
import { csvCell, pickValue, scalar } from './formats.js';
import type { Envelope, Operation } from './operations/shared.js';
import { RequestFieldError } from './operations/shared.js';
import { coerce, unflatten } from './query.js';
import { EngineError } from './engine/errors.js';
import { fieldErrors } from './plugins/validation.js';

export const MAX_RANGE_VALUES = 200;
export const DEFAULT_COLUMNS = ['status', 'utilization', 'governing.code', 'governing.available', 'governing.demand'] as const;

export interface RangeTable {
  vary: string;
  columns: string[];
  rows: Array<{ value: string; cells: Array<null | boolean | number | string> }>;
}

function list(v: string | string[] | undefined): string[] {
  if (v === undefined) return [];
  const joined = Array.isArray(v) ? v.join(',') : v;
  return joined.split(',').map((s) => s.trim()).filter((s) => s !== '');
}

export function rangeTable(
  op: Operation,
  validate: ValidateFunction,
  rest: Record<string, string | string[] | undefined>,
  vary: string,
  valuesParam: string | string[] | undefined,
  columnsParam: string | string[] | undefined,
): RangeTable {
  const values = list(valuesParam);
  if (values.length === 0) throw new RequestFieldError('/values', 'vary= needs values=, a comma list such as 3/16,1/4,5/16.');
  if (values.length > MAX_RANGE_VALUES) throw new RequestFieldError('/values', `At most ${MAX_RANGE_VALUES} values in one table.`);
  if (rest[vary] !== undefined) throw new RequestFieldError(`/${vary.split('.').join('/')}`, `"${vary}" is the varied input; give its values in values= only.`);
  const columns = list(columnsParam);
  const cols = columns.length > 0 ? columns : [...DEFAULT_COLUMNS];
  if (cols.length > 50) throw new RequestFieldError('/columns', 'At most 50 columns.');
  const rows = values.map((value, i) => {
    const body = coerce(op.body as never, unflatten({ ...rest, [vary]: value }));
    if (!validate(body)) {
      const first = fieldErrors(validate.errors ?? [])[0];
      throw new RequestFieldError(`/values/${i}`, `value "${value}" for ${vary}: ${first ? `${first.pointer} ${first.detail}` : 'not valid'}`);
    }
    let answer: Envelope<unknown>;
    try {
      answer = op.run(body as never);
    } catch (err) {
      if (err instanceof EngineError) return { value, cells: cols.map((c) => (c === 'status' ? `error:${err.code}` : null)) };
      if (err instanceof RequestFieldError) throw new RequestFieldError(`/values/${i}`, `value "${value}" for ${vary}: ${err.message}`);
      throw err;
    }
    return {
      value,
      cells: cols.map((c) => {
        try {
          return pickValue(answer, c);
        } catch (e) {
          if (e instanceof RequestFieldError) throw new RequestFieldError('/columns', e.message);
          throw e;
        }
      }),
    };
  });
  return { vary, columns: cols, rows };
}

/** An XML name made of letters, digits, dots, dashes and underscores, not starting with a digit. */
const XML_NAME = /^[A-Za-z_][A-Za-z0-9._-]*$/;

function xmlText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * The table as XML for spreadsheet formulas that pick a column with an XPath
 * (FILTERXML(WEBSERVICE(url), "//row/utilization") fills one column with one formula):
 * `<table vary="welds.0.size"><row><welds.0.size>1/8</welds.0.size><status>fail</status>...</row>...</table>`,
 * one element per column named after it, empty where the CSV cell is empty.
 */
export function rangeXml(t: RangeTable): string {
  const names = [t.vary, ...t.columns];
  const bad = names.find((n) => !XML_NAME.test(n));
  if (bad !== undefined) throw new RequestFieldError(bad === t.vary ? '/vary' : '/columns', `"${bad}" cannot name an XML element; use format=csv for this table.`);
  const rows = t.rows.map((r) => `<row>${[r.value, ...r.cells].map((c, i) => {
    const text = scalar(c);
    return text === '' ? `<${names[i]}/>` : `<${names[i]}>${xmlText(text)}</${names[i]}>`;
  }).join('')}</row>`);
  return `<?xml version="1.0" encoding="UTF-8"?>\n<table vary="${xmlText(t.vary)}">\n${rows.map((r) => `${r}\n`).join('')}</table>\n`;
}

export function rangeCsv(t: RangeTable): string {
  const head = [t.vary, ...t.columns].map(csvCell).join(',');
  return `${head}\r\n${t.rows.map((r) => [r.value, ...r.cells].map((c) => csvCell(scalar(c))).join(',')).join('\r\n')}\r\n`;
}
