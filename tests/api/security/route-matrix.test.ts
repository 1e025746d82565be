/**
 * Issue 8, "tests that can fail": every API route, read from the Express router, against every kind
 * of caller: the four roles of a workspace, someone from another workspace, and a stranger. The
 * table below holds the expected status of each (method, route) for each caller; a route the router
 * has and the table lacks fails the test, so a new route cannot ship without its row.
 *
 * Probes never destroy the fixtures: state-changing requests use an invalid body (400 once past
 * authorization) or a made-up target id (404 from the handler, a different message from the
 * workspace's "not a member" 404). The second part checks the CSRF header on every state-changing
 * route, also from the router.
 *
 * Consumer API keys are callers too: `key` (a workspace-wide key of the probed workspace) and
 * `other-key` (a key of another workspace). On every session route a key caller is exactly a stranger
 * (401: a key never works as a session); the consumer routes under /api/v1 answer only to keys, so
 * every session caller gets 401 there (a session never works as a key).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { WorkspaceRole } from '../../../shared/members';
import { startTestApp, type TestApp } from '../../support/app';
import { apiRoutes, isStateChanging, routeKey, type ApiRoute } from '../../support/routes';
import { inviteAndJoin, signIn, signUp, uniqueEmail, type Session } from '../../support/session';
import { closeApp, upload } from '../datasets/support';

type SessionCaller = WorkspaceRole | 'other' | 'stranger';
type KeyCaller = 'key' | 'other-key';
type Caller = SessionCaller | KeyCaller;
const CALLERS: Caller[] = ['admin', 'analyst', 'reviewer', 'viewer', 'other', 'stranger', 'key', 'other-key'];
const KEY_CALLERS: readonly Caller[] = ['key', 'other-key'];
const NOT_MEMBER = 'No such workspace, or you are not a member of it.';
const MADE_UP = '00000000-0000-4000-8000-000000000000';

interface Row {
  /** Key callers default to the stranger's status (a key is no session). */
  status: Record<SessionCaller, number> & Partial<Record<KeyCaller, number>>;
  /** Sign the caller in afresh for this probe (the request ends its session). */
  fresh?: boolean;
  body?: unknown;
}

/** A workspace route: the listed roles get `ok`, other members 403, another workspace 404, a stranger 401. */
function ws(allowed: WorkspaceRole[], ok: number): Row {
  const status = { other: 404, stranger: 401 } as Record<SessionCaller, number>;
  for (const role of ['admin', 'analyst', 'reviewer', 'viewer'] as const) status[role] = allowed.includes(role) ? ok : 403;
  return { status };
}
const all: WorkspaceRole[] = ['admin', 'analyst', 'reviewer', 'viewer'];
const editors: WorkspaceRole[] = ['admin', 'analyst'];
/** Needs a session, no workspace. */
const personal = (ok: number): Row => ({ status: { admin: ok, analyst: ok, reviewer: ok, viewer: ok, other: ok, stranger: 401 } });
/** Anyone, signed in or not. */
const open = (ok: number): Row => ({ status: { admin: ok, analyst: ok, reviewer: ok, viewer: ok, other: ok, stranger: ok } });
/** Consumer API: every session caller 401; the key callers get what is given. */
const consumer = (key: number, otherKey: number): Row => ({
  status: { admin: 401, analyst: 401, reviewer: 401, viewer: 401, other: 401, stranger: 401, key, 'other-key': otherKey },
});

const W = '/api/workspaces/:workspaceId';
const V = `${W}/datasets/:datasetId/versions/:number`;

/** Expected status per route and caller. Add a row with every new route. */
const TABLE: Record<string, Row> = {
  'GET /api/health': open(200),
  'POST /api/auth/sign-up': open(400),
  'POST /api/auth/sign-up/complete': open(400),
  'POST /api/auth/sign-in': open(400),
  'POST /api/auth/sign-out': { ...open(204), fresh: true },
  'GET /api/auth/me': personal(200),
  'POST /api/auth/password-reset/request': open(400),
  'POST /api/auth/password-reset/complete': open(400),
  'GET /api/auth/sessions': personal(200),
  'POST /api/auth/sessions/sign-out-others': personal(200),
  'POST /api/auth/password': personal(400),
  'GET /api/workspaces': personal(200),
  'POST /api/workspaces': personal(400),
  [`GET ${W}`]: ws(all, 200),
  [`GET ${W}/members`]: ws(all, 200),
  [`PATCH ${W}/members/:userId`]: ws(['admin'], 400),
  [`DELETE ${W}/members/:userId`]: ws(['admin'], 404),
  [`GET ${W}/invitations`]: ws(['admin'], 200),
  [`POST ${W}/invitations`]: ws(['admin'], 400),
  [`DELETE ${W}/invitations/:invitationId`]: ws(['admin'], 404),
  'GET /api/invitations/:token': open(404),
  'POST /api/invitations/:token/accept': open(404),
  'GET /api/dev/outbox': personal(200),
  [`POST ${W}/datasets/uploads`]: ws(editors, 400),
  [`GET ${W}/ingests/:ingestId`]: ws(all, 404),
  [`GET ${W}/datasets`]: ws(all, 200),
  [`GET ${W}/datasets/:datasetId`]: ws(all, 200),
  [`DELETE ${W}/datasets/:datasetId`]: { ...ws(editors, 404), body: undefined },
  [`GET ${V}`]: ws(all, 200),
  [`GET ${V}/rows`]: ws(all, 200),
  [`POST ${V}/column-settings`]: ws(editors, 400),
  [`GET ${V}/original`]: ws(all, 200),
  [`GET ${V}/cleaned.csv`]: ws(all, 200),
  [`GET ${W}/open-datasets`]: ws(all, 200),
  [`POST ${W}/open-datasets/:key/import`]: ws(editors, 404),
  [`GET ${W}/models`]: ws(all, 200),
  [`POST ${W}/models`]: ws(editors, 400),
  [`GET ${W}/models/:modelId`]: ws(all, 404),
  [`POST ${W}/models/:modelId/fits`]: ws(editors, 400),
  [`GET ${W}/fits/:fitId`]: ws(all, 404),
  [`GET ${W}/fits/:fitId/progress`]: ws(all, 404),
  [`POST ${W}/fits/:fitId/cancel`]: ws(editors, 404),
  [`POST ${W}/fits/:fitId/choice`]: ws(editors, 400),
  [`GET ${W}/fits/:fitId/predictions`]: ws(all, 400),
  [`POST ${W}/fits/:fitId/predictions`]: ws(all, 404),
  // Reviews, releases, notices, the audit log (issue 11).
  [`GET ${W}/reviews`]: ws(all, 200),
  [`POST ${W}/fits/:fitId/reviews`]: ws(editors, 404),
  [`GET ${W}/reviews/:reviewId`]: ws(all, 404),
  [`POST ${W}/reviews/:reviewId/comments`]: ws(['admin', 'analyst', 'reviewer'], 404),
  [`POST ${W}/reviews/:reviewId/decision`]: ws(['admin', 'reviewer'], 404),
  [`POST ${W}/reviews/:reviewId/withdraw`]: ws(editors, 404),
  [`GET ${W}/comparisons`]: ws(all, 400),
  [`GET ${W}/notices`]: ws(all, 200),
  [`POST ${W}/notices/read`]: ws(all, 200),
  'GET /api/me/mail-preferences': personal(200),
  'PUT /api/me/mail-preferences': personal(400),
  [`GET ${W}/releases`]: ws(all, 200),
  [`GET ${W}/models/:modelId/releases`]: ws(all, 404),
  [`POST ${W}/models/:modelId/releases`]: ws(editors, 404),
  [`POST ${W}/releases/:releaseId/restore`]: ws(editors, 404),
  [`GET ${W}/audit`]: ws(['admin'], 200),
  [`GET ${W}/audit.csv`]: ws(['admin'], 200),
  [`GET ${W}/fits/:fitId/exports/coefficients.csv`]: ws(all, 404),
  [`GET ${W}/fits/:fitId/exports/model.pmml`]: ws(all, 404),
  [`GET ${W}/fits/:fitId/exports/bundle.json`]: ws(all, 404),
  [`GET ${W}/fits/:fitId/exports/fit.json`]: ws(all, 404),
  [`GET ${W}/keys`]: ws(['admin'], 200),
  [`POST ${W}/keys`]: ws(['admin'], 400),
  [`POST ${W}/keys/:keyId/revoke`]: ws(['admin'], 404),
  [`GET ${W}/webhooks`]: ws(['admin'], 200),
  [`POST ${W}/webhooks`]: ws(['admin'], 400),
  [`DELETE ${W}/webhooks/:webhookId`]: ws(['admin'], 404),
  [`GET ${W}/webhooks/:webhookId/deliveries`]: ws(['admin'], 404),
  'GET /api/v1/openapi.json': { ...open(200), status: { ...open(200).status, key: 200, 'other-key': 200 } },
  'GET /api/v1/models': consumer(200, 200),
  'GET /api/v1/models/:modelId/release': consumer(404, 404),
  'POST /api/v1/models/:modelId/score': consumer(404, 404),
};

let t: TestApp;
let routes: ApiRoute[];
const sessions = {} as Record<Exclude<SessionCaller, 'stranger'>, Session>;
const keys = {} as Record<KeyCaller, string>;
let workspaceId = '';
let datasetId = '';

beforeAll(async () => {
  t = await startTestApp({ LARIAT_DEV_OUTBOX: '1' });
  routes = apiRoutes(t.app);
  sessions.admin = await signUp(t.app);
  workspaceId = sessions.admin.workspaceId;
  for (const role of ['analyst', 'reviewer', 'viewer'] as const) sessions[role] = await inviteAndJoin(t, sessions.admin, uniqueEmail(role), role);
  sessions.other = await signUp(t.app);
  for (const [caller, session] of [['key', sessions.admin], ['other-key', sessions.other]] as const) {
    const made = await session.agent.post(`/api/workspaces/${session.workspaceId}/keys`).set('X-Lariat-CSRF', session.csrf).send({ name: `matrix ${caller}`, scope: 'workspace' });
    if (made.status !== 201) throw new Error(`fixture key: ${made.status} ${made.text}`);
    keys[caller] = (made.body as { key: string }).key;
  }
  const uploaded = await upload(sessions.admin, 'id,score\n1,2.5\n2,3.5\n3,1.0\n', 'matrix.csv', { name: 'Matrix' });
  if (uploaded.status !== 201) throw new Error(`fixture upload: ${uploaded.status} ${uploaded.text}`);
  datasetId = (uploaded.body as { datasetId: string }).datasetId;
});
afterAll(async () => {
  await closeApp(t);
});

/** The concrete URL of a route: this workspace and dataset, made-up ids for everything a probe might destroy. */
function urlOf(route: ApiRoute): string {
  const destructive = isStateChanging(route);
  return route.path
    .replace(':workspaceId', workspaceId)
    .replace(':datasetId', destructive && route.method === 'DELETE' ? MADE_UP : datasetId)
    .replace(':number', '1')
    .replace(':token', 'x'.repeat(43))
    .replace(':key', 'no-such-open-dataset')
    .replace(/:[A-Za-z]+/g, MADE_UP);
}

async function probe(route: ApiRoute, caller: Caller, row: Row): Promise<request.Response> {
  const url = urlOf(route);
  const method = route.method.toLowerCase() as 'get' | 'post' | 'patch' | 'delete';
  if (caller === 'stranger' || caller === 'key' || caller === 'other-key') {
    // A CSRF pair of its own, so the stranger (or a key holder) reaches authentication (and gets its 401).
    let req = request(t.app)[method](url);
    if (caller !== 'stranger') req = req.set('Authorization', `Bearer ${keys[caller]}`);
    if (isStateChanging(route)) req = req.set('Cookie', 'lariat_csrf=stranger').set('X-Lariat-CSRF', 'stranger');
    return isStateChanging(route) ? req.send((row.body ?? {}) as object) : req;
  }
  const session = row.fresh ? await signIn(t.app, sessions[caller].email) : sessions[caller];
  const req = session.agent[method](url);
  return isStateChanging(route) ? req.set('X-Lariat-CSRF', session.csrf).send((row.body ?? {}) as object) : req;
}

describe('route-by-role matrix (from the router)', () => {
  it('has a row for every route and no row for a route that is gone', () => {
    const keys = routes.map(routeKey);
    expect(keys.filter((k) => !(k in TABLE)), 'routes without a row in TABLE').toEqual([]);
    expect(Object.keys(TABLE).filter((k) => !keys.includes(k)), 'rows for routes the router lacks').toEqual([]);
  });

  it('answers every route with the expected status for each caller', async () => {
    const wrong: string[] = [];
    for (const route of routes) {
      const row = TABLE[routeKey(route)];
      if (!row) continue;
      for (const caller of CALLERS) {
        const res = await probe(route, caller, row);
        const expected = row.status[caller] ?? (KEY_CALLERS.includes(caller) ? row.status.stranger : undefined);
        if (res.status !== expected) wrong.push(`${routeKey(route)} as ${caller}: expected ${expected}, got ${res.status} ${res.text.slice(0, 160)}`);
        // Another workspace gets exactly the "no such workspace" answer: nothing about what is inside.
        if (caller === 'other' && route.path.startsWith(W) && res.status === 404 && res.body?.error?.message !== NOT_MEMBER) {
          wrong.push(`${routeKey(route)} as other: 404 with another message: ${res.text.slice(0, 160)}`);
        }
      }
    }
    expect(wrong).toEqual([]);
  });
});

/** Routes that carry their own proof (no session yet, or an e-mailed token): see server/auth/csrf.ts. */
const CSRF_EXEMPT = new Set([
  'POST /api/auth/sign-up',
  'POST /api/auth/sign-up/complete',
  'POST /api/auth/sign-in',
  'POST /api/auth/password-reset/request',
  'POST /api/auth/password-reset/complete',
  'POST /api/invitations/:token/accept',
]);

describe('CSRF on every state-changing route (from the router)', () => {
  it('refuses a missing header, another session\'s token and a foreign Origin', async () => {
    const wrong: string[] = [];
    // The consumer API reads no cookie, so there is no session for a forged request to ride (csrf.ts).
    const changing = routes.filter((r) => isStateChanging(r) && !r.path.startsWith('/api/v1/'));
    expect(changing.length).toBeGreaterThan(10);
    for (const route of changing) {
      const url = urlOf(route);
      const method = route.method.toLowerCase() as 'post' | 'patch' | 'delete';
      const admin = sessions.admin;
      const foreign = await admin.agent[method](url).set('X-Lariat-CSRF', admin.csrf).set('Origin', 'https://evil.example').send({});
      if (foreign.status !== 403) wrong.push(`${routeKey(route)} with a foreign Origin: ${foreign.status}`);
      if (CSRF_EXEMPT.has(routeKey(route))) continue;
      const missing = await admin.agent[method](url).send({});
      if (missing.status !== 403 || missing.body?.error?.field !== 'X-Lariat-CSRF') wrong.push(`${routeKey(route)} without the header: ${missing.status}`);
      const borrowed = await admin.agent[method](url).set('X-Lariat-CSRF', sessions.viewer.csrf).send({});
      if (borrowed.status !== 403 || borrowed.body?.error?.field !== 'X-Lariat-CSRF') wrong.push(`${routeKey(route)} with another session's token: ${borrowed.status}`);
    }
    expect(wrong).toEqual([]);
    // The admin's session survived all of that (no refused request did anything).
    expect((await sessions.admin.agent.get('/api/auth/me')).status).toBe(200);
  });
});
