/**
 * Who may use the consumer API and how: keys made by admins only, shown once and stored hashed;
 * unknown, malformed, revoked and expired keys refused (401); a key sees only its workspace's released
 * models within its scope (404 otherwise, one message whatever the reason); a browser session cannot
 * call the consumer API and a key cannot call the session API; bad scoring payloads get a 4xx naming
 * the problem.
 */
import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_SCORE_BYTES, MAX_SCORE_ROWS, type ApiKeyDto, type CreatedKeyDto } from '../../../shared/consumers';
import { apiKeys, auditEvents } from '../../../server/db/schema/index';
import { inviteAndJoin, signUp, uniqueEmail, withCsrf, type Session } from '../../support/session';
import { apiBase } from '../datasets/support';
import { createModel, uploadCsv } from '../fits/support';
import { closeFitsApp, createKey, fixture, release, v1, type Fixture } from './support';

const HIDDEN = 'No released model with this id is visible to this API key.';
let f: Fixture;
let analyst: Session;
let other: Session;
let wide: CreatedKeyDto;
let narrow: CreatedKeyDto;
let otherKey: CreatedKeyDto;
let unreleasedModelId: string;

beforeAll(async () => {
  f = await fixture();
  await release(f.t, f.gaussian, f.admin.userId);
  await release(f.t, f.binomial, f.admin.userId);
  analyst = await inviteAndJoin(f.t, f.admin, uniqueEmail('analyst'), 'analyst');
  const data = await uploadCsv(f.admin, 'a,b\n1,2\n2,3\n3,5\n', 'Unreleased');
  unreleasedModelId = (await createModel(f.admin, { name: 'Never released', datasetId: data.datasetId, outcome: 'a', family: 'gaussian' })).id;
  wide = await createKey(f.admin, { name: 'Dashboard', scope: 'workspace', expiresInDays: 30 });
  narrow = await createKey(f.admin, { name: 'Scorer', scope: 'models', modelIds: [f.gaussian.modelId, unreleasedModelId] });
  other = await signUp(f.t.app);
  otherKey = await createKey(other, { name: 'Elsewhere', scope: 'workspace' });
}, 180_000);
afterAll(async () => closeFitsApp(f?.t));

describe('keys are made by admins, shown once, stored hashed', () => {
  it('answers the key once; lists show only its prefix; the database holds only its SHA-256', async () => {
    expect(wide.key).toMatch(/^lariat_[A-Za-z0-9_-]{43}$/);
    expect(wide.key.startsWith(wide.prefix)).toBe(true);
    expect(wide).toMatchObject({ name: 'Dashboard', scope: 'workspace', state: 'active', lastUsedAt: null });
    const list = await f.admin.agent.get(`${apiBase(f.admin)}/keys`);
    expect(list.status).toBe(200);
    expect(list.text).not.toContain(wide.key);
    expect((list.body as ApiKeyDto[]).map((k) => k.name).sort()).toEqual(['Dashboard', 'Scorer']);
    expect((list.body as ApiKeyDto[]).find((k) => k.name === 'Scorer')!.models.map((m) => m.id).sort()).toEqual([f.gaussian.modelId, unreleasedModelId].sort());
    const [row] = await f.t.ctx.db.select().from(apiKeys).where(eq(apiKeys.id, wide.id));
    expect(row.keyHash).toBe(createHash('sha256').update(wide.key).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(wide.key);
    const audit = await f.t.ctx.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'key.created'), eq(auditEvents.targetId, wide.id)));
    expect(audit).toHaveLength(1);
    expect(JSON.stringify(audit[0].details)).not.toContain(wide.key);
  });

  it('refuses other roles (403) and bad key requests (400 naming the field)', async () => {
    const base = apiBase(f.admin);
    expect((await withCsrf(analyst.agent.post(`${base}/keys`), analyst.csrf).send({ name: 'x', scope: 'workspace' })).status).toBe(403);
    expect((await analyst.agent.get(`${base}/keys`)).status).toBe(403);
    const post = (body: object) => withCsrf(f.admin.agent.post(`${base}/keys`), f.admin.csrf).send(body);
    const cases: [object, string][] = [
      [{ name: 'x', scope: 'models' }, 'modelIds'],
      [{ name: 'x', scope: 'models', modelIds: [otherKey.id] }, 'modelIds'],
      [{ name: 'x', scope: 'workspace', expiresInDays: 0 }, 'expiresInDays'],
      [{ name: '', scope: 'workspace' }, 'name'],
      [{ name: 'x', scope: 'everything' }, 'scope'],
      [{ name: 'x', scope: 'workspace', key: 'lariat_mine' }, 'body'],
    ];
    for (const [body, field] of cases) {
      const res = await post(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field, JSON.stringify(res.body)).toBe(field);
    }
  });
});

describe('the consumer API refuses what is not a live key of the right workspace and scope', () => {
  it('401 without a key, with a malformed or unknown key, and with a session cookie instead of a key', async () => {
    for (const key of [null, 'not-a-key', `lariat_${'A'.repeat(43)}`]) {
      const res = await v1(f.t, key, 'get', '/models');
      expect(res.status, String(key)).toBe(401);
      expect(res.body.error.field).toBe('Authorization');
      expect(res.text).not.toContain('Consumer');
    }
    // A signed-in admin's browser session does not open the consumer API (cookies are not read there).
    const session = await f.admin.agent.get('/api/v1/models');
    expect(session.status).toBe(401);
    const posted = await f.admin.agent.post(`/api/v1/models/${f.gaussian.modelId}/score`).set('X-Lariat-CSRF', f.admin.csrf).send({ rows: [{ x1: 1 }] });
    expect(posted.status).toBe(401);
  });

  it('a key never works as a session: session routes answer 401 to a Bearer key', async () => {
    for (const path of ['/api/auth/me', `/api/workspaces/${f.admin.workspaceId}/models`, `/api/workspaces/${f.admin.workspaceId}/fits/${f.gaussian.id}/exports/fit.json`]) {
      const res = await request(f.t.app).get(path).set('Authorization', `Bearer ${wide.key}`);
      expect(res.status, path).toBe(401);
    }
    const res = await request(f.t.app).post(`/api/workspaces/${f.admin.workspaceId}/keys`).set('Authorization', `Bearer ${wide.key}`).send({ name: 'x', scope: 'workspace' });
    expect([401, 403]).toContain(res.status);
    expect(res.body.key).toBeUndefined();
  });

  it('a workspace key lists every released model of its workspace; a scoped key only its released models', async () => {
    const all = await v1(f.t, wide.key, 'get', '/models');
    expect(all.status).toBe(200);
    expect(all.body.models.map((m: { name: string }) => m.name).sort()).toEqual(['Consumer y', 'Consumer yes']);
    const some = await v1(f.t, narrow.key, 'get', '/models');
    expect(some.body.models.map((m: { id: string }) => m.id)).toEqual([f.gaussian.modelId]);
    const none = await v1(f.t, otherKey.key, 'get', '/models');
    expect(none.body.models).toEqual([]);
  });

  it('404 with one message for another workspace\'s model, a model outside the scope, an unreleased model, and a made-up id', async () => {
    const probes: [string, string][] = [
      [otherKey.key, f.gaussian.modelId],
      [narrow.key, f.binomial.modelId],
      [narrow.key, unreleasedModelId],
      [wide.key, '00000000-0000-4000-8000-000000000000'],
      [wide.key, 'not-an-id'],
    ];
    for (const [key, modelId] of probes) {
      for (const [method, path] of [['get', `/models/${modelId}/release`], ['post', `/models/${modelId}/score`]] as const) {
        const res = method === 'get' ? await v1(f.t, key, 'get', path) : await v1(f.t, key, 'post', path).send({ rows: [{ x1: 1, x2: 1, n1: 0, g: 'red' }] });
        expect(res.status, `${method} ${path}`).toBe(404);
        expect(res.body.error.message).toBe(HIDDEN);
      }
    }
    expect((await v1(f.t, narrow.key, 'get', `/models/${f.gaussian.modelId}/release`)).status).toBe(200);
  });

  it('records the last use; a revoked key and an expired key are refused (401), and revoking needs an admin', async () => {
    const [used] = await f.t.ctx.db.select().from(apiKeys).where(eq(apiKeys.id, wide.id));
    expect(used.lastUsedAt).not.toBeNull();
    const spare = await createKey(f.admin, { name: 'Spare', scope: 'workspace' });
    expect((await v1(f.t, spare.key, 'get', '/models')).status).toBe(200);
    const byAnalyst = await withCsrf(analyst.agent.post(`${apiBase(f.admin)}/keys/${spare.id}/revoke`), analyst.csrf).send({});
    expect(byAnalyst.status).toBe(403);
    const byOther = await withCsrf(other.agent.post(`${apiBase(other)}/keys/${spare.id}/revoke`), other.csrf).send({});
    expect(byOther.status).toBe(404);
    const revoked = await withCsrf(f.admin.agent.post(`${apiBase(f.admin)}/keys/${spare.id}/revoke`), f.admin.csrf).send({});
    expect(revoked.status).toBe(200);
    expect(revoked.body.state).toBe('revoked');
    const refused = await v1(f.t, spare.key, 'get', '/models');
    expect(refused.status).toBe(401);
    expect(refused.body.error.message).toMatch(/revoked/);

    const late = await createKey(f.admin, { name: 'Late', scope: 'workspace', expiresInDays: 1 });
    await f.t.ctx.db.update(apiKeys).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(apiKeys.id, late.id));
    const expired = await v1(f.t, late.key, 'get', `/models/${f.gaussian.modelId}/release`);
    expect(expired.status).toBe(401);
    expect(expired.body.error.message).toMatch(/expired/);
    const list = (await f.admin.agent.get(`${apiBase(f.admin)}/keys`)).body as ApiKeyDto[];
    expect(list.find((k) => k.id === late.id)!.state).toBe('expired');
  });
});

describe('scoring payloads of the wrong shape or size', () => {
  const score = () => v1(f.t, wide.key, 'post', `/models/${f.gaussian.modelId}/score`);

  it('400 naming the field for wrong shapes, 415 for another content type, 400 for broken JSON', async () => {
    const cases: [unknown, string][] = [
      [{ rows: 'x' }, 'rows'],
      [{ rows: [] }, 'rows'],
      [{ rows: [1] }, 'rows.0'],
      [{ rows: [{ x1: 1 }, [2]] }, 'rows.1'],
      [{ rows: [{ x1: [1], x2: 1, n1: 1, g: 'red' }] }, 'rows.0.x1'],
      [{ rows: [{ x1: true, x2: 1, n1: 1, g: 'red' }] }, 'rows.0.x1'],
      [{ rows: [{ x1: 1 }], extra: 1 }, 'extra'],
      [[{ x1: 1 }], 'body'],
    ];
    for (const [body, field] of cases) {
      const res = await score().send(body as object);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field, JSON.stringify(res.body)).toBe(field);
    }
    const text = await score().set('Content-Type', 'text/plain').send('x1,x2\n1,2\n');
    expect(text.status).toBe(415);
    const broken = await score().set('Content-Type', 'application/json').send('{"rows": [');
    expect(broken.status).toBe(400);
    expect(broken.body.error.field).toBe('body');
  });

  it('413 for more rows than the limit and for a body over the byte limit', async () => {
    const many = await score().send({ rows: Array.from({ length: MAX_SCORE_ROWS + 1 }, () => ({})) });
    expect(many.status).toBe(413);
    expect(many.body.error.message).toMatch(String(MAX_SCORE_ROWS));
    const huge = await score().set('Content-Type', 'text/csv').send(`x1,x2,n1,g\n${'1,2,3,red\n'.repeat(Math.ceil(MAX_SCORE_BYTES / 10) + 10)}`);
    expect(huge.status).toBe(413);
  });

  it('422 naming the column when a CSV lacks one the release uses', async () => {
    const res = await score().set('Content-Type', 'text/csv').send('x1,n1,g\n1,2,red\n');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('x2');
  });
});
