/**
 * Releases: only an approved fit, by an admin or analyst (reviewers and viewers 403); numbers 1, 2, ...
 * with the highest current; restore adds a new release; release rows and the audit log never change;
 * the audit log is admin-only, as JSON and CSV; e-mail on release with a link back.
 */
import { sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FitDetailDto } from '../../../shared/fits';
import type { AuditEventDto, ReleaseDto } from '../../../shared/reviews';
import { currentRelease, listCurrentReleases } from '../../../server/releases';
import { lastMailId, newMail } from '../../support/session';
import { closeFitsApp } from '../fits/support';
import { askReview, decide, finishedFit, get, post, release, startTeam, type Team } from '../reviews/support';

/** The database's own message (drizzle wraps it as the error's cause). */
async function refusal(query: Promise<unknown>): Promise<string> {
  try {
    await query;
  } catch (error) {
    const e = error as Error & { cause?: Error };
    return e.cause?.message ?? e.message;
  }
  return 'no error';
}

let team: Team;
let first: FitDetailDto;
let second: FitDetailDto;
let unreviewed: FitDetailDto;

beforeAll(async () => {
  team = await startTeam();
  first = await finishedFit(team.analyst, team.model.id);
  second = await finishedFit(team.analyst, team.model.id, { predictors: ['x1', 'x2', 'g', 'n1', 'n2'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } });
  unreviewed = await finishedFit(team.analyst, team.model.id, { predictors: ['x1'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } });
  for (const f of [first, second]) await decide(team.reviewer, (await askReview(team.analyst, f.id)).id, 'approve');
}, 240_000);
afterAll(async () => closeFitsApp(team?.t));

describe('publishing', () => {
  it('a fit without an approved review cannot be released (409 naming fitId)', async () => {
    const res = await post(team.analyst, `/models/${team.model.id}/releases`, { fitId: unreviewed.id, notes: 'Try.' });
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('fitId');
    // A waiting review is not an approval either.
    await askReview(team.analyst, unreviewed.id);
    expect((await post(team.analyst, `/models/${team.model.id}/releases`, { fitId: unreviewed.id, notes: 'Try.' })).status).toBe(409);
  });

  it('reviewers and viewers cannot release even an approved fit (403)', async () => {
    for (const s of [team.reviewer, team.viewer]) {
      expect((await post(s, `/models/${team.model.id}/releases`, { fitId: first.id, notes: 'Mine.' })).status).toBe(403);
    }
  });

  it('release notes are required (400 naming notes); a fit of another model is a 404', async () => {
    const res = await post(team.analyst, `/models/${team.model.id}/releases`, { fitId: first.id, notes: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('notes');
    const made = await post(team.analyst, '/models', { name: 'Other model', datasetId: team.datasetId, outcome: 'y', family: 'gaussian' });
    const wrong = await post(team.analyst, `/models/${(made.body as { id: string }).id}/releases`, { fitId: first.id, notes: 'Wrong model.' });
    expect(wrong.status).toBe(404);
  });

  it('the analyst releases the approved fit: release 1, current, at the approved lambda; members are e-mailed a link', async () => {
    const before = lastMailId(team.t);
    const r = await release(team.analyst, team.model.id, first.id, 'First release: three predictors.');
    expect(r).toMatchObject({ number: 1, current: true, fitId: first.id, fitVersion: first.version, lambdaIndex: first.results!.chosen.index, notes: 'First release: three predictors.', restoredFrom: null });
    expect(r.releasedBy.id).toBe(team.analyst.userId);
    for (const s of [team.viewer, team.reviewer, team.admin]) {
      const mail = await newMail(team.t, s.email, /Reviewed: release 1 .* is out/, before);
      expect(mail.text).toContain(`${team.t.ctx.config.publicUrl}/w/${team.admin.workspaceId}/releases?model=${team.model.id}`);
    }
    const cur = await currentRelease(team.t.ctx.db, team.admin.workspaceId, team.model.id);
    expect(cur?.id).toBe(r.id);
  });

  it('a second approved fit becomes release 2; release 1 stays readable and is no longer current', async () => {
    const r2 = await release(team.admin, team.model.id, second.id, 'Adds two predictors.');
    expect(r2.number).toBe(2);
    const list = (await get(team.viewer, `/models/${team.model.id}/releases`)).body as ReleaseDto[];
    expect(list.map((r) => [r.number, r.current, r.fitId])).toEqual([
      [2, true, second.id],
      [1, false, first.id],
    ]);
    const all = await listCurrentReleases(team.t.ctx.db, team.admin.workspaceId);
    expect(all.map((r) => r.number)).toEqual([2]);
  });

  it('a release keeps its lambda when the fit\'s choice moves later', async () => {
    const other = second.results!.chosen.index === 0 ? 1 : 0;
    expect((await post(team.analyst, `/fits/${second.id}/choice`, { index: other })).status).toBe(200);
    const cur = await currentRelease(team.t.ctx.db, team.admin.workspaceId, team.model.id);
    expect(cur?.lambdaIndex).toBe(second.results!.chosen.index);
    // The approval covered the old choice: releasing the fit again at the new choice is refused.
    expect((await post(team.analyst, `/models/${team.model.id}/releases`, { fitId: second.id, notes: 'Again.' })).status).toBe(409);
    await post(team.analyst, `/fits/${second.id}/choice`, { index: second.results!.chosen.index });
  });
});

describe('restoring', () => {
  it('restoring release 1 adds release 3 pointing at its fit and lambda', async () => {
    const list = (await get(team.analyst, `/models/${team.model.id}/releases`)).body as ReleaseDto[];
    const one = list.find((r) => r.number === 1)!;
    const res = await post(team.analyst, `/releases/${one.id}/restore`, { notes: 'Back to the smaller model.' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const r3 = res.body as ReleaseDto;
    expect(r3).toMatchObject({ number: 3, current: true, fitId: first.id, lambdaIndex: one.lambdaIndex, restoredFrom: { id: one.id } });
    const cur = await currentRelease(team.t.ctx.db, team.admin.workspaceId, team.model.id);
    expect(cur?.fitId).toBe(first.id);
  });

  it('restoring the current release is a 409; notes are required; reviewers cannot restore', async () => {
    const list = (await get(team.analyst, `/models/${team.model.id}/releases`)).body as ReleaseDto[];
    const current = list.find((r) => r.current)!;
    expect((await post(team.analyst, `/releases/${current.id}/restore`, { notes: 'x' })).status).toBe(409);
    const two = list.find((r) => r.number === 2)!;
    const noNotes = await post(team.analyst, `/releases/${two.id}/restore`, {});
    expect(noNotes.status).toBe(400);
    expect(noNotes.body.error.field).toBe('notes');
    expect((await post(team.reviewer, `/releases/${two.id}/restore`, { notes: 'x' })).status).toBe(403);
  });

  it('another workspace sees no release (404, empty list); a stranger gets 401', async () => {
    const list = (await get(team.analyst, '/releases')).body as ReleaseDto[];
    expect(list.length).toBe(3);
    const { outsider } = team;
    expect((await get(outsider, '/releases')).body).toEqual([]);
    expect((await get(outsider, `/models/${team.model.id}/releases`)).status).toBe(404);
    expect((await post(outsider, `/releases/${list[0].id}/restore`, { notes: 'x' })).status).toBe(404);
    expect((await post(outsider, `/models/${team.model.id}/releases`, { fitId: first.id, notes: 'x' })).status).toBe(404);
    expect((await request(team.t.app).get(`/api/workspaces/${team.admin.workspaceId}/releases`)).status).toBe(401);
  });

  it('release rows never change (the database refuses)', async () => {
    expect(await refusal(team.t.ctx.db.execute(sql`update releases set notes = 'rewritten'`))).toMatch(/never changes/);
  });
});

describe('the audit log', () => {
  it('records every change of state with who, what, when and from where', async () => {
    const res = await get(team.admin, '/audit?limit=1000');
    expect(res.status).toBe(200);
    const events = res.body as AuditEventDto[];
    const actions = events.map((e) => e.action);
    expect(actions.filter((a) => a === 'release.published').length).toBe(2);
    expect(actions.filter((a) => a === 'release.restored').length).toBe(1);
    expect(actions.filter((a) => a === 'review.approved').length).toBe(2);
    expect(actions.filter((a) => a === 'review.requested').length).toBe(3);
    const restored = events.find((e) => e.action === 'release.restored')!;
    expect(restored.actor).toMatchObject({ userId: team.analyst.userId, label: team.analyst.email });
    expect(restored.ip).toMatch(/127\.0\.0\.1/);
    expect(restored.details).toMatchObject({ number: 3, restoredFromNumber: 1, fitId: first.id });
    expect(Date.now() - Date.parse(restored.at)).toBeLessThan(10 * 60_000);
    // Newest first.
    const times = events.map((e) => Date.parse(e.at));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
  });

  it('is exported as CSV with one line per event', async () => {
    const res = await get(team.admin, '/audit.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const lines = res.text.trim().split('\n');
    expect(lines[0]).toBe('at,action,actor,actor_user_id,actor_api_key_id,target_type,target_id,ip,details');
    const json = (await get(team.admin, '/audit?limit=1000')).body as AuditEventDto[];
    expect(lines.length - 1).toBe(json.length);
    expect(lines.filter((l) => l.includes(',release.restored,')).length).toBe(1);
  });

  it('only admins read it (403 for the others); a bad limit is a 400 naming it', async () => {
    for (const s of [team.analyst, team.reviewer, team.viewer]) {
      expect((await get(s, '/audit')).status).toBe(403);
      expect((await get(s, '/audit.csv')).status).toBe(403);
    }
    const bad = await get(team.admin, '/audit?limit=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('limit');
    expect((await get(team.outsider, '/audit')).body).toEqual([]);
  });

  it('is append-only: the database refuses to change or delete an entry', async () => {
    expect(await refusal(team.t.ctx.db.execute(sql`update audit_events set action = 'nothing'`))).toMatch(/append-only/);
    expect(await refusal(team.t.ctx.db.execute(sql`delete from audit_events`))).toMatch(/append-only/);
    expect(await refusal(team.t.ctx.db.execute(sql`truncate audit_events`))).toMatch(/append-only/);
  });
});
