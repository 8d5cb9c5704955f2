/**
 * Shared mapping between the HTTP contract and the engine: field parsing that JSON Schema
 * cannot express (fractions, either-or fields), and the response envelope around a result.
 */
import type { TSchema } from 'typebox';
import { NOTICE, STANDARD } from '../engine/notice.js';
import type { EngineResult } from '../engine/result.js';
import type { Method } from '../engine/provisions/resistance.js';
import { parseFraction, type UnitSystemId } from '../engine/units.js';
import { ENGINE_VERSION } from '../version.js';
import { MAX_MAGNITUDE, MIN_LENGTH } from '../schemas/common.js';

/** A request field that passed the schema but is still wrong (400, names the field). */
export class RequestFieldError extends Error {
  readonly pointer: string;
  constructor(pointer: string, detail: string) {
    super(detail);
    this.name = 'RequestFieldError';
    this.pointer = pointer;
  }
}

/** A length given as a number, or in imperial as a fraction string. */
export function length(value: number | string, units: UnitSystemId, pointer: string): number {
  if (typeof value === 'number') return value;
  const n = parseFraction(value);
  if (units === 'metric' && value.includes('/')) throw new RequestFieldError(pointer, `"${value}": fractions are imperial only; give millimetres as a number.`);
  if (n === undefined || !Number.isFinite(n) || n < MIN_LENGTH || n > MAX_MAGNITUDE) {
    throw new RequestFieldError(pointer, units === 'metric' ? `"${value}" is not a positive length in millimetres (from ${MIN_LENGTH} to ${MAX_MAGNITUDE}).` : `"${value}" is not a positive length such as 0.3125, "5/16" or "1-1/4" (from ${MIN_LENGTH} to ${MAX_MAGNITUDE} in).`);
  }
  return n;
}

export interface CommonBody {
  id?: string;
  method: Method;
  units?: UnitSystemId;
}

export interface Envelope<V> extends EngineResult<V> {
  id?: string;
  units: { length: 'in' | 'mm'; force: 'kip' | 'kN'; stress: 'ksi' | 'MPa' };
  basis: { standard: string; method: Method; engine: string };
  notice: string;
}

const UNITS_OUT = {
  imperial: Object.freeze({ length: 'in', force: 'kip', stress: 'ksi' } as const),
  metric: Object.freeze({ length: 'mm', force: 'kN', stress: 'MPa' } as const),
};

/**
 * Wraps an engine result in the response envelope. Built field by field rather than by object
 * spread: this runs once per answer and per batch item, and the spread costs twenty times more.
 */
export function envelope<V>(body: CommonBody, result: EngineResult<V>): Envelope<V> {
  const units = body.units === 'metric' ? UNITS_OUT.metric : UNITS_OUT.imperial;
  const out: Envelope<V> = {
    status: result.status,
    utilization: result.utilization,
    governing: result.governing,
    checks: result.checks,
    limits: result.limits,
    warnings: result.warnings,
    values: result.values,
    units,
    basis: { standard: STANDARD, method: body.method, engine: ENGINE_VERSION },
    notice: NOTICE,
  };
  if (body.id !== undefined) out.id = body.id;
  return out;
}

/** One calculation the service offers: its contract and how to run it. */
export interface Operation<B extends CommonBody = CommonBody, V = unknown> {
  /** Kind name used by batch items. */
  readonly kind: string;
  readonly path: string;
  readonly summary: string;
  readonly description: string;
  readonly body: TSchema;
  readonly response: TSchema;
  /** Request examples in our invented scenario (the WS workshop). */
  readonly examples: Record<string, { summary: string; value: B }>;
  run(body: B): Envelope<V>;
  /**
   * Extra answer formats beyond json, csv and value (for example svg for a figure), each
   * rendered from the answer and the request that produced it.
   */
  readonly formats?: Readonly<Record<string, { readonly contentType: string; render(answer: Envelope<V>, body: B): string }>>;
}
