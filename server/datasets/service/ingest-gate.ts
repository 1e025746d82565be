/**
 * At most `slots` ingests of this process run at once; up to `queue` more wait their turn (first come,
 * first served); beyond that the upload is refused with 429 and a Retry-After. Each running ingest
 * holds a database connection for its whole transaction, so without a cap a few large uploads would
 * take every connection of the pool and starve sign-in and every other request
 * (docs/decisions/0010-ingest-cap-and-upload-hardening.md).
 */
import { HttpError } from '../../http/errors';

export const RETRY_AFTER_SECONDS = 30;

export class IngestBusy extends HttpError {
  constructor() {
    super(429, `The server is already storing as many uploads as it can; nothing was stored. Try again in ${RETRY_AFTER_SECONDS} seconds.`, 'file');
    this.name = 'IngestBusy';
  }
}

export class IngestGate {
  private running = 0;
  private readonly waiting: (() => void)[] = [];

  constructor(
    readonly slots: number,
    readonly queue: number,
  ) {}

  /** True when a new ingest would be refused now (checked before receiving a file, to save the transfer). */
  full(): boolean {
    return this.running >= this.slots && this.waiting.length >= this.queue;
  }

  /**
   * Waits for a slot (calling `onQueued` if it has to wait) and returns its release function;
   * throws IngestBusy when the queue is full.
   */
  async enter(onQueued?: () => void): Promise<() => void> {
    if (this.running < this.slots) this.running++;
    else {
      if (this.waiting.length >= this.queue) throw new IngestBusy();
      onQueued?.();
      await new Promise<void>((resolve) => this.waiting.push(resolve)); // the slot is handed over as is
    }
    let released = false;
    return () => {
      if (released) return;
      released = true;
      const next = this.waiting.shift();
      if (next) next();
      else this.running--;
    };
  }

  /** Ingests running and waiting now. */
  get load(): { running: number; waiting: number } {
    return { running: this.running, waiting: this.waiting.length };
  }
}
