/**
 * What a calculation sheet reads: the answer envelope of any operation (its values loosely, so
 * that operations added later can be drawn) and the parts of an operation it needs.
 */
import type { TSchema } from 'typebox';
import type { Check, Limit } from '../engine/result.js';
import type { Envelope } from '../operations/shared.js';

/** The engine's own shapes: a sheet draws exactly what the answer holds. */
export type CheckItemLike = Check;
export type LimitItemLike = Limit;
export type SheetAnswer = Envelope<unknown>;

/** The parts of an Operation a sheet uses. */
export interface SheetOperation {
  readonly kind: string;
  readonly path: string;
  readonly summary: string;
  readonly body: TSchema;
  readonly formats?: Readonly<Record<string, { readonly contentType: string; render(answer: never, body: never): string }>>;
}

/** The optional header fields of a request (`sheet` in every check body). */
export interface SheetHeader {
  project?: string;
  mark?: string;
  preparedBy?: string;
  checkedBy?: string;
  date?: string;
}
