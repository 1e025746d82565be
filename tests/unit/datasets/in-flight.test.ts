/** InFlight: bounded concurrent writes, and the first failure surfaces (never swallowed). */
import { describe, expect, it } from 'vitest';
import { InFlight } from '../../../server/datasets/service/in-flight';

const later = <T>(ms: number, value: T, fail = false) => new Promise<T>((ok, ko) => setTimeout(() => (fail ? ko(new Error(String(value))) : ok(value)), ms));

describe('InFlight', () => {
  it('keeps at most `max` writes pending', async () => {
    let pending = 0;
    let peak = 0;
    const track = async () => {
      pending++;
      peak = Math.max(peak, pending);
      await later(5, null);
      pending--;
    };
    const w = new InFlight(2);
    for (let i = 0; i < 8; i++) await w.add(track());
    await w.drain();
    expect(peak).toBeLessThanOrEqual(3); // two queued plus the one just added
    expect(pending).toBe(0);
  });

  it('throws the first failure from drain', async () => {
    const w = new InFlight(4);
    await w.add(later(5, 'first', true));
    await w.add(later(10, 'second', true));
    await expect(w.drain()).rejects.toThrow('first');
  });
});
