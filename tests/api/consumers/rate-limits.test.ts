/**
 * Consumer API rate limits at a small factor (LARIAT_RATE_LIMIT_FACTOR=0.01: 6 requests a minute per
 * key, 1 refused key per 15 minutes per address): the 7th request of a key is a 429 with Retry-After
 * while another key goes on; refused keys from one address are cut off after the first.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CreatedKeyDto } from '../../../shared/consumers';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, type Session } from '../../support/session';
import { closeApp } from '../datasets/support';
import { createKey, v1 } from './support';

let t: TestApp;
let admin: Session;
let first: CreatedKeyDto;
let second: CreatedKeyDto;

beforeAll(async () => {
  t = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '0.01' });
  admin = await signUp(t.app);
  first = await createKey(admin, { name: 'busy', scope: 'workspace' });
  second = await createKey(admin, { name: 'calm', scope: 'workspace' });
});
afterAll(async () => closeApp(t));

describe('consumer API rate limits', () => {
  it('a key over its budget gets 429 with Retry-After; another key is not affected', async () => {
    const app = t as unknown as Parameters<typeof v1>[0];
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) statuses.push((await v1(app, first.key, 'get', '/models')).status);
    expect(statuses).toEqual([200, 200, 200, 200, 200, 200, 429]);
    const limited = await v1(app, first.key, 'get', '/models');
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(limited.body.error.message).toMatch(/too many requests/);
    expect((await v1(app, second.key, 'get', '/models')).status).toBe(200);
  });

  it('refused keys from one address are cut off', async () => {
    const app = t as unknown as Parameters<typeof v1>[0];
    const wrong = `lariat_${'B'.repeat(43)}`;
    expect((await v1(app, wrong, 'get', '/models')).status).toBe(401);
    const next = await v1(app, wrong, 'get', '/models');
    expect(next.status).toBe(429);
    expect(next.headers['retry-after']).toBeDefined();
  });
});
