/**
 * A few database writes in flight at once while the CPU prepares the next one (node-postgres queues
 * a transaction's queries on its connection, so their order is kept). The first failure is thrown
 * by the next add() or by drain(); memory stays bounded by `max` pending payloads.
 */
export class InFlight {
  private queue: Promise<void>[] = [];
  private failure: { error: unknown } | null = null;

  constructor(private readonly max: number) {}

  async add(write: Promise<unknown>): Promise<void> {
    this.queue.push(
      write.then(
        () => undefined,
        (error: unknown) => {
          this.failure ??= { error };
        },
      ),
    );
    while (this.queue.length > this.max) await this.queue.shift();
    if (this.failure) throw this.failure.error;
  }

  async drain(): Promise<void> {
    await Promise.all(this.queue);
    this.queue = [];
    if (this.failure) throw this.failure.error;
  }
}
