/**
 * Reviews: who may ask, comment and decide; nobody decides on their own fit; the states; the e-mails
 * and in-app notices (with a link back) and the per-user opt-out; another workspace 404, a stranger 401.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FitDetailDto } from '../../../shared/fits';
import type { MailPreferencesDto, NoticeDto, ReviewDetailDto, ReviewDto } from '../../../shared/reviews';
import { lastMailId, newMail, withCsrf } from '../../support/session';
import { closeFitsApp } from '../fits/support';
import { askReview, decide, finishedFit, get, mailsTo, post, put, startTeam, type Team } from './support';

let team: Team;
let fit: FitDetailDto;

beforeAll(async () => {
  team = await startTeam();
  fit = await finishedFit(team.analyst, team.model.id);
}, 180_000);
afterAll(async () => closeFitsApp(team?.t));

describe('asking for a review', () => {
  let review: ReviewDto;

  it('an analyst asks; the reviewer and the admin get an e-mail with a link back and a notice; the analyst does not', async () => {
    const { t, analyst, reviewer, admin } = team;
    const before = lastMailId(t);
    review = await askReview(analyst, fit.id);
    expect(review.state).toBe('waiting');
    expect(review.fitVersion).toBe(1);
    expect(review.lambdaIndex).toBe(fit.results!.chosen.index);
    expect(review.lambda).toBeCloseTo(fit.results!.chosen.lambda, 12);
    const link = `${t.ctx.config.publicUrl}/w/${analyst.workspaceId}/reviews/${review.id}`;
    for (const s of [reviewer, admin]) {
      const mail = await newMail(t, s.email, /asks for a review of Reviewed, version 1/, before);
      expect(mail.text).toContain(link);
      const notices = (await get(s, '/notices')).body as NoticeDto[];
      expect(notices.find((n) => n.kind === 'review-requested')?.link).toBe(`/w/${analyst.workspaceId}/reviews/${review.id}`);
    }
    expect(await mailsTo(t, analyst.email, /review/, before, 500)).toEqual([]);
    expect((await get(analyst, '/notices')).body).toEqual([]);
  });

  it('a second request on a fit whose review is waiting is refused (409)', async () => {
    const res = await post(team.analyst, `/fits/${fit.id}/reviews`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('fitId');
  });

  it('reviewers and viewers cannot ask for a review (403)', async () => {
    for (const s of [team.reviewer, team.viewer]) expect((await post(s, `/fits/${fit.id}/reviews`, {})).status).toBe(403);
  });

  it('an unknown field in the request is a 400 naming it', async () => {
    const res = await post(team.admin, `/fits/${fit.id}/reviews`, { note: 'x', colour: 'red' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('colour');
  });

  it('every member lists and reads the review', async () => {
    for (const s of [team.admin, team.analyst, team.reviewer, team.viewer]) {
      const list = (await get(s, '/reviews')).body as ReviewDto[];
      expect(list.map((r) => r.id)).toContain(review.id);
      expect((await get(s, `/reviews/${review.id}`)).status).toBe(200);
    }
    expect((await get(team.viewer, '/reviews?state=approved')).body).toEqual([]);
    const bad = await get(team.viewer, '/reviews?state=finished');
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('state');
  });

  describe('comments', () => {
    it('a reviewer comments on the fit as a whole and on one coefficient', async () => {
      const whole = await post(team.reviewer, `/reviews/${review.id}/comments`, { body: 'The CV curve is flat near the choice.' });
      expect(whole.status, JSON.stringify(whole.body)).toBe(201);
      const term = fit.results!.terms[0];
      const one = await post(team.reviewer, `/reviews/${review.id}/comments`, { body: 'Why is this one so large?', term });
      expect(one.status).toBe(201);
      const detail = one.body as ReviewDetailDto;
      expect(detail.comments.map((c) => [c.term, c.body])).toEqual([
        [null, 'The CV curve is flat near the choice.'],
        [term, 'Why is this one so large?'],
      ]);
      expect(detail.comments[1].author.name).toBe('Rey Reviewer');
    });

    it('a comment on a term the fit lacks, or an empty comment, is a 400 naming the field', async () => {
      const bad = await post(team.reviewer, `/reviews/${review.id}/comments`, { body: 'x', term: 'no-such-term' });
      expect(bad.status).toBe(400);
      expect(bad.body.error.field).toBe('term');
      const empty = await post(team.reviewer, `/reviews/${review.id}/comments`, { body: '   ' });
      expect(empty.status).toBe(400);
      expect(empty.body.error.field).toBe('body');
    });

    it('a viewer cannot comment (403)', async () => {
      expect((await post(team.viewer, `/reviews/${review.id}/comments`, { body: 'Looks fine' })).status).toBe(403);
    });
  });

  describe('deciding', () => {
    it('viewers and analysts cannot decide (403)', async () => {
      for (const s of [team.viewer, team.analyst]) expect((await post(s, `/reviews/${review.id}/decision`, { decision: 'approve' })).status).toBe(403);
    });

    it('sending back needs reasons (400 naming reasons); an unknown decision is a 400', async () => {
      const res = await post(team.reviewer, `/reviews/${review.id}/decision`, { decision: 'send-back', reasons: ' ' });
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe('reasons');
      const odd = await post(team.reviewer, `/reviews/${review.id}/decision`, { decision: 'accept' });
      expect(odd.status).toBe(400);
      expect(odd.body.error.field).toBe('decision');
    });

    it('the reviewer sends it back with reasons; the analyst is told by e-mail with the reasons page linked', async () => {
      const before = lastMailId(team.t);
      const decided = await decide(team.reviewer, review.id, 'send-back', 'Add the holdout split.');
      expect(decided.state).toBe('sent-back');
      expect(decided.reasons).toBe('Add the holdout split.');
      expect(decided.decidedBy?.name).toBe('Rey Reviewer');
      const mail = await newMail(team.t, team.analyst.email, /sent back Reviewed, version 1/, before);
      expect(mail.text).toContain(`/w/${team.analyst.workspaceId}/reviews/${review.id}`);
    });

    it('a decided review cannot be decided again (409)', async () => {
      const res = await post(team.admin, `/reviews/${review.id}/decision`, { decision: 'approve' });
      expect(res.status).toBe(409);
    });

    it('asked again, it is approved by the reviewer', async () => {
      const again = await askReview(team.analyst, fit.id, 'Second try.');
      const decided = await decide(team.reviewer, again.id, 'approve');
      expect(decided.state).toBe('approved');
      expect(decided.canDecide).toBe(false);
    });
  });
});

describe('nobody decides on their own fit', () => {
  it('an admin who ran the fit cannot approve it, even when someone else asked; a reviewer can', async () => {
    const own = await finishedFit(team.admin, team.model.id, { predictors: ['x1', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 3 } });
    const review = await askReview(team.analyst, own.id);
    const detail = (await get(team.admin, `/reviews/${review.id}`)).body as ReviewDetailDto;
    expect(detail.canDecide).toBe(false);
    expect(detail.cannotDecideReason).toMatch(/ran this fit/);
    const res = await post(team.admin, `/reviews/${review.id}/decision`, { decision: 'approve' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/ran this fit/);
    await decide(team.reviewer, review.id, 'approve');
  });

  it('an admin who asked for the review cannot approve it', async () => {
    const byAnalyst = await finishedFit(team.analyst, team.model.id, { predictors: ['x2', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 4 } });
    const review = await askReview(team.admin, byAnalyst.id);
    const res = await post(team.admin, `/reviews/${review.id}/decision`, { decision: 'approve' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/asked for this review/);
    // The requester withdraws it instead.
    const withdrawn = await post(team.admin, `/reviews/${review.id}/withdraw`, {});
    expect(withdrawn.status).toBe(200);
    expect((withdrawn.body as ReviewDetailDto).state).toBe('withdrawn');
  });

  it('an approval covers the lambda chosen when the review was asked for: after a new choice it is refused (409)', async () => {
    const f = await finishedFit(team.analyst, team.model.id, { predictors: ['x1', 'x2'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 5 } });
    const review = await askReview(team.analyst, f.id);
    const other = f.results!.chosen.index === 0 ? 1 : 0;
    expect((await post(team.analyst, `/fits/${f.id}/choice`, { index: other })).status).toBe(200);
    const detail = (await get(team.reviewer, `/reviews/${review.id}`)).body as ReviewDetailDto;
    expect(detail.choiceChanged).toBe(true);
    const res = await post(team.reviewer, `/reviews/${review.id}/decision`, { decision: 'approve' });
    expect(res.status).toBe(409);
    await decide(team.reviewer, review.id, 'send-back', 'The choice moved.');
  });
});

describe('e-mail opt-out', () => {
  it('a reviewer who turned off review e-mails still gets the notice in the app, but no e-mail', async () => {
    const { t, reviewer, admin, analyst } = team;
    const prefs: MailPreferencesDto = { reviewRequested: false, reviewDecided: true, releasePublished: true };
    const saved = await put(reviewer, '/api/me/mail-preferences', prefs);
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect((await reviewer.agent.get('/api/me/mail-preferences')).body).toEqual(prefs);
    const partial = await put(reviewer, '/api/me/mail-preferences', { reviewRequested: true });
    expect(partial.status).toBe(400);
    expect(partial.body.error.field).toBe('reviewDecided');

    const f = await finishedFit(analyst, team.model.id, { predictors: ['x1', 'x2', 'g', 'n1'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 6 } });
    const before = lastMailId(t);
    const review = await askReview(analyst, f.id);
    await newMail(t, admin.email, /asks for a review/, before); // the admin's copy went out
    expect(await mailsTo(t, reviewer.email, /asks for a review/, before, 2000)).toEqual([]);
    const notices = (await get(reviewer, '/notices')).body as NoticeDto[];
    expect(notices.some((n) => n.link.endsWith(review.id))).toBe(true);
    // Marking read.
    const read = await post(reviewer, '/notices/read', {});
    expect(read.status).toBe(200);
    expect((read.body as { marked: number }).marked).toBeGreaterThan(0);
    expect(((await get(reviewer, '/notices')).body as NoticeDto[]).every((n) => n.read)).toBe(true);
    await put(reviewer, '/api/me/mail-preferences', { reviewRequested: true, reviewDecided: true, releasePublished: true });
  });
});

describe('other workspaces and strangers', () => {
  it('another workspace gets 404 for the fit and the review; a stranger 401; no CSRF header 403', async () => {
    const { outsider, analyst } = team;
    const [review] = (await get(analyst, '/reviews')).body as ReviewDto[];
    expect((await get(outsider, `/reviews/${review.id}`)).status).toBe(404);
    expect((await post(outsider, `/fits/${fit.id}/reviews`, {})).status).toBe(404);
    expect((await post(outsider, `/reviews/${review.id}/comments`, { body: 'hi' })).status).toBe(404);
    expect((await post(outsider, `/reviews/${review.id}/decision`, { decision: 'approve' })).status).toBe(404);
    expect((await get(outsider, '/reviews')).body).toEqual([]);
    expect((await outsider.agent.get(`/api/workspaces/${analyst.workspaceId}/reviews/${review.id}`)).status).toBe(404);
    expect((await request(team.t.app).get(`/api/workspaces/${analyst.workspaceId}/reviews`)).status).toBe(401);
    const noHeader = await analyst.agent.post(`/api/workspaces/${analyst.workspaceId}/fits/${fit.id}/reviews`).send({});
    expect(noHeader.status).toBe(403);
    const withHeader = await withCsrf(analyst.agent.post(`/api/workspaces/${analyst.workspaceId}/reviews/${review.id}/comments`), analyst.csrf).send({ body: 'ok' });
    expect(withHeader.status).toBe(201);
  });
});
