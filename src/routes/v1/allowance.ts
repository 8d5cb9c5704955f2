/**
 * The bytes of JSON-array batch bodies a replica holds at once: arriving, waiting for a lane
 * (as text) or being computed (parsed, several times the text's size). Lanes (./lanes.ts) bound
 * how many batches are computed at once, not how many wait; without this bound, enough large
 * uploads at once exhausted the JavaScript heap and ended the process (sixteen 25 MB batches
 * under the Kubernetes manifest's 384 MB heap), and eight took the resident size past the
 * manifest's 512 MiB memory limit.
 *
 * A batch takes its bytes when its upload starts (the declared Content-Length) or, without one,
 * as each chunk arrives; one that does not fit is answered 503 with Retry-After before its body
 * is read. One batch always fits when none is held, so a body of any size the batch limit
 * allows can be answered. The bytes are given back when the batch is computed or its response
 * closes, whichever comes first. NDJSON streams hold no body and take nothing.
 */

export class ByteAllowance {
  private inUse = 0;

  constructor(readonly limit: number) {}

  /** Bytes held now. */
  get held(): number {
    return this.inUse;
  }

  /** Takes `n` bytes when they fit under the limit, or when none are held; false otherwise. */
  take(n: number): boolean {
    if (this.inUse > 0 && this.inUse + n > this.limit) return false;
    this.inUse += n;
    return true;
  }

  give(n: number): void {
    this.inUse -= n;
  }
}

/** One request's bytes, given back once; after that it takes nothing more. */
export class Holding {
  private bytes = 0;
  private over = false;

  constructor(private readonly allowance: ByteAllowance) {}

  get held(): number {
    return this.bytes;
  }

  /** Adds `n` bytes to this request's share; false when they do not fit, or it was released. */
  take(n: number): boolean {
    if (this.over || !this.allowance.take(n)) return false;
    this.bytes += n;
    return true;
  }

  release(): void {
    if (this.over) return;
    this.over = true;
    this.allowance.give(this.bytes);
    this.bytes = 0;
  }
}
