/**
 * Batch lanes: JSON-array batches are computed a few at a time (BATCH_CONCURRENCY), in the order
 * their bodies finished arriving; the others wait holding only their body text, which is parsed
 * when a lane is theirs. NDJSON streams are answered as their lines arrive and take no lane (a
 * slow uploader must not hold one).
 *
 * Why: a batch yields the event loop between slices of items, so thirty-two batches in flight
 * were computed side by side, and each held its parsed body (about 1 MB for 1,000 items) the
 * whole time. Those bodies were what survived every young-generation collection, and were copied
 * each time: with 32 clients, 1.9 ms per collection against 0.56 ms with one client. Computed
 * two at a time, with the others still text (one flat string the collector does not copy),
 * 1,000-item batches from 32 clients took 10-14 % less CPU per request (alternating runs:
 * compact answers 8.3-9.0 -> 7.1-8.2 ms, full answers 24.4-24.5 -> 21.9 ms), and each finishes
 * sooner on average than when all share the processor.
 *
 * A lane is for computing, not for a client's reading: the holder gives it back when its last
 * slice is computed, when a slice it handed over has not been taken for STALL_MS (a client
 * that reads slowly, or not at all; it queues again, at the back, when it is read), and
 * whenever its response closes (answered, refused, cut off by the deadline sweep, abandoned).
 * A request whose response closes while it waits leaves the queue without taking a lane.
 */

/** What a lane needs of the response: whether it is over, and its 'close' event. */
export interface LaneResponse {
  readonly destroyed: boolean;
  readonly writableEnded: boolean;
  once(event: 'close', listener: () => void): unknown;
}

/** How long a handed-over slice may wait to be taken before its batch gives its lane back. */
export const STALL_MS = 100;

const over = (res: LaneResponse): boolean => res.destroyed || res.writableEnded;

/** One request's claim on a lane. */
export class Lease {
  private isHeld = false;
  /** @internal its place in the queue while it waits. */
  waiter: Waiter | null = null;

  constructor(
    private readonly lanes: Lanes,
    readonly res: LaneResponse,
  ) {
    res.once('close', () => {
      if (this.waiter) this.lanes.leave(this.waiter);
      this.release();
    });
  }

  get held(): boolean {
    return this.isHeld;
  }

  /** @internal by Lanes, when it grants this lease a lane. */
  take(): void {
    this.isHeld = true;
  }

  /** Gives the lane back (nothing when not held). */
  release(): void {
    if (!this.isHeld) return;
    this.isHeld = false;
    this.lanes.giveBack();
  }

  /** Holds a lane again, waiting at the back of the queue; false when the response closed first. */
  reenter(): Promise<boolean> {
    if (this.isHeld) return Promise.resolve(true);
    if (this.gone) return Promise.resolve(false);
    return this.lanes.queueFor(this);
  }

  /** @internal whether the response is over (answered, cut off or abandoned). */
  get gone(): boolean {
    return over(this.res);
  }
}

export interface Waiter {
  lease: Lease;
  grant: (entered: boolean) => void;
}

export class Lanes {
  private active = 0;
  private readonly queue: Waiter[] = [];

  constructor(readonly size: number) {
    if (!Number.isInteger(size) || size < 1) throw new RangeError(`lanes: size must be a positive integer, not ${size}`);
  }

  /** A lease holding a lane once one is free (in arrival order), or null when `res` closed, or was already over, first. */
  async enter(res: LaneResponse): Promise<Lease | null> {
    if (over(res)) return null;
    const lease = new Lease(this, res);
    return (await this.queueFor(lease)) ? lease : null;
  }

  /** Requests holding a lane. */
  get busy(): number {
    return this.active;
  }

  /** Requests waiting for one. */
  get waiting(): number {
    return this.queue.length;
  }

  /** @internal */
  queueFor(lease: Lease): Promise<boolean> {
    if (this.active < this.size && this.queue.length === 0) {
      this.active++;
      lease.take();
      return Promise.resolve(true);
    }
    return new Promise<boolean>((resolve) => {
      const waiter: Waiter = { lease, grant: resolve };
      lease.waiter = waiter;
      this.queue.push(waiter);
    });
  }

  /** @internal a waiting lease's response closed. */
  leave(waiter: Waiter): void {
    const i = this.queue.indexOf(waiter);
    if (i === -1) return;
    this.queue.splice(i, 1);
    waiter.lease.waiter = null;
    waiter.grant(false);
  }

  /** @internal a lease gave its lane back. */
  giveBack(): void {
    this.active--;
    while (this.active < this.size && this.queue.length > 0) {
      const w = this.queue.shift()!;
      w.lease.waiter = null;
      if (w.lease.gone) {
        w.grant(false);
        continue;
      }
      this.active++;
      w.lease.take();
      w.grant(true);
    }
  }
}
