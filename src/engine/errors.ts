import type { ErrorCode } from './codes.js';

/**
 * A request the engineering rules cannot answer (HTTP 422). `pointer` is the JSON pointer of
 * the request field at fault, when there is one.
 */
export class EngineError extends Error {
  readonly code: ErrorCode;
  readonly pointer: string | undefined;
  constructor(code: ErrorCode, message: string, pointer?: string) {
    super(message);
    this.name = 'EngineError';
    this.code = code;
    this.pointer = pointer;
  }
}
