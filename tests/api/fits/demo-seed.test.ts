/**
 * The demo seed leaves one finished fit on the demo data (so a newcomer sees results at once), and
 * running it again adds nothing.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FitDetailDto } from '../../../shared/fits';
import type { ModelDetailDto, ModelListItemDto } from '../../../shared/models';
import { DEMO_ACCOUNT } from '../../../server/seed/demo-account';
import { seedDemo } from '../../../server/seed/demo';
import { DEMO_MODEL_NAME } from '../../../server/fits/demo-fit';
import { signIn } from '../../support/session';
import { apiBase } from '../datasets/support';
import { closeFitsApp, startFitsApp, type FitsApp } from './support';

let t: FitsApp;

beforeAll(async () => {
  t = await startFitsApp({ inProcessWorker: false });
});
afterAll(async () => closeFitsApp(t));

describe('demo seed', () => {
  it('seeds a finished, cross-validated fit on the demo data, once', async () => {
    await seedDemo(t.ctx.db);
    await seedDemo(t.ctx.db);
    const count = await t.ctx.db.execute(sql`SELECT count(*)::int AS n FROM fits`);
    expect((count.rows[0] as { n: number }).n).toBe(1);
    const demo = await signIn(t.app, DEMO_ACCOUNT.email, DEMO_ACCOUNT.password);
    const list = (await demo.agent.get(`${apiBase(demo)}/models`)).body as ModelListItemDto[];
    const model = list.find((m) => m.name === DEMO_MODEL_NAME)!;
    expect(model.latest).toMatchObject({ version: 1, status: 'finished' });
    const detail = (await demo.agent.get(`${apiBase(demo)}/models/${model.id}`)).body as ModelDetailDto;
    const fit = (await demo.agent.get(`${apiBase(demo)}/fits/${detail.versions[0].id}`)).body as FitDetailDto;
    expect(fit.results!.cv!.folds).toBe(10);
    expect(fit.results!.evaluation.state).toBe('ready');
    expect(fit.results!.nonzero[fit.results!.chosen.index]).toBeGreaterThan(0);
    // The free-text notes column (blank = nothing to report) is no predictor, so no blank note is
    // filled with a made-up one; the numeric gaps are still filled with their means.
    expect(fit.spec.predictors).not.toContain('notes');
    expect(fit.results!.notes.join('\n')).not.toMatch(/most frequent level/);
    expect(fit.results!.notes.join('\n')).toMatch(/"milk_ph": \d+ missing values? set to the mean/);
  }, 120_000);
});
