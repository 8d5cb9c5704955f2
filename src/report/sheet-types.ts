/**
 * What a calculation sheet reads: the answer envelope (loosely, so that any operation's answer
 * can be drawn, including ones added later) and the parts of an operation it needs.
 */
import type { TSchema } from 'typebox';

export interface CheckItemLike {
  code: string;
  title: string;
  clause: string;
  equation: string;
  part?: number;
  nominal: number;
  phi?: number;
  omega?: number;
  available: number;
  demand: number;
  ratio: number;
  pass: boolean;
  applicable?: boolean;
  note?: string;
}

export interface LimitItemLike {
  code: string;
  title: string;
  clause: string;
  weld?: number;
  part?: number;
  required: number;
  provided: number;
  sense: 'min' | 'max';
  pass: boolean;
  note?: string;
}

export interface SheetAnswer {
  id?: string;
  status: 'pass' | 'fail';
  utilization: number;
  governing: { code: string; part?: number; available: number; demand: number; ratio: number };
  checks: CheckItemLike[];
  limits: LimitItemLike[];
  warnings: Array<{ code: string; message: string }>;
  values: unknown;
  units: { length: string; force: string; stress: string };
  basis: { standard: string; method: 'LRFD' | 'ASD'; engine: string };
  notice: string;
}

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
