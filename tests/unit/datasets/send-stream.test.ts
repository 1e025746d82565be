/**
 * A download whose client stops reading and then goes away: the sender must end (and stop pulling
 * chunks from its source) instead of waiting for a 'drain' that never comes.
 */
import { Writable } from 'node:stream';
import type { Response } from 'express';
import { describe, expect, it } from 'vitest';
import { openDownloads, sendStream } from '../../../server/datasets/routes/send-stream';

describe('sendStream', () => {
  it('ends when the receiver is destroyed mid-way, and closes its source', async () => {
    let pulled = 0;
    let sourceClosed = false;
    async function* source(): AsyncGenerator<Buffer> {
      try {
        for (let i = 0; i < 10_000; i++) {
          pulled++;
          yield Buffer.alloc(64 * 1024, 97);
        }
      } finally {
        sourceClosed = true;
      }
    }
    // A client that accepts the first chunk and then never reads again (its callback never runs).
    let firstChunk!: () => void;
    const gotFirst = new Promise<void>((r) => (firstChunk = r));
    const stalled = new Writable({
      highWaterMark: 16 * 1024,
      write(_chunk, _enc, _callback) {
        firstChunk();
      },
    });
    const sending = sendStream(stalled as unknown as Response, source());
    await gotFirst;
    expect(openDownloads()).toBe(1);
    stalled.destroy(); // the client goes away
    const outcome = await Promise.race([sending.then(() => 'ended'), new Promise((r) => setTimeout(() => r('still waiting after 2 s'), 2000))]);
    expect(outcome).toBe('ended');
    expect(sourceClosed).toBe(true);
    expect(openDownloads()).toBe(0);
    // Back-pressure held the source to a few chunks, not the 10,000 it could give.
    expect(pulled).toBeLessThan(10);
  });
});
