/**
 * Comparing fits: coefficient table at each chosen lambda, selection changes (entered, left, changed
 * sign) with stability, spec changes, metric differences with standard errors; bad lists are 400s,
 * another workspace's fit 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ComparisonDto } from '../../../shared/compare';
import type { FitDetailDto } from '../../../shared/fits';
import { closeFitsApp } from '../fits/support';
import { finishedFit, get, post, startTeam, type Team } from './support';

let team: Team;
let a: FitDetailDto;
let b: FitDetailDto;

const coefficientAt = (f: FitDetailDto, term: string): number => {
  const r = f.results!;
  const j = r.terms.indexOf(term);
  const sparse = r.coefficients[r.chosen.index];
  const k = sparse.terms.indexOf(j);
  return k < 0 ? 0 : sparse.values[k];
};

beforeAll(async () => {
  team = await startTeam();
  a = await finishedFit(team.analyst, team.model.id, { predictors: ['x1', 'g', 'n1'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } });
  b = await finishedFit(team.analyst, team.model.id, { predictors: ['x1', 'x2', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } });
}, 240_000);
afterAll(async () => closeFitsApp(team?.t));

describe('comparison', () => {
  it('lines the coefficients up at each chosen lambda, with stability', async () => {
    const res = await get(team.reviewer, `/comparisons?fits=${a.id},${b.id}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const c = res.body as ComparisonDto;
    expect(c.fits.map((f) => f.version)).toEqual([a.version, b.version]);
    const x2 = c.terms.find((t) => t.term === 'x2')!;
    expect(x2.values[0]).toBeNull(); // not a term of the first fit
    expect(x2.values[1]).toBeCloseTo(coefficientAt(b, 'x2'), 12);
    const x1 = c.terms.find((t) => t.term === 'x1')!;
    expect(x1.values[0]).toBeCloseTo(coefficientAt(a, 'x1'), 12);
    expect(x1.stability[0]).toBeCloseTo(a.results!.stability![a.results!.terms.indexOf('x1')], 12);
  });

  it('lists what entered, left and changed sign, and the spec changes', async () => {
    const c = (await get(team.viewer, `/comparisons?fits=${a.id},${b.id}`)).body as ComparisonDto;
    const pair = c.pairs[0];
    const kept = (f: FitDetailDto) => new Set(f.results!.coefficients[f.results!.chosen.index].terms.map((j) => f.results!.terms[j]));
    const ka = kept(a);
    const kb = kept(b);
    const expected = [
      ...[...kb].filter((t) => !ka.has(t)).map((t) => `entered ${t}`),
      ...[...ka].filter((t) => !kb.has(t)).map((t) => `left ${t}`),
      ...[...ka].filter((t) => kb.has(t) && Math.sign(coefficientAt(a, t)) !== Math.sign(coefficientAt(b, t))).map((t) => `changed-sign ${t}`),
    ].sort();
    expect(pair.selection.map((s) => `${s.kind} ${s.term}`).sort()).toEqual(expected);
    // x2 is a strong predictor in the invented data: the second fit keeps it.
    expect(expected).toContain('entered x2');
    expect(pair.specChanges.map((s) => s.field)).toContain('predictors');
  });

  it('gives the CV error difference with sqrt(se1^2 + se2^2)', async () => {
    const c = (await get(team.viewer, `/comparisons?fits=${a.id},${b.id}`)).body as ComparisonDto;
    const d = c.pairs[0].metrics.find((m) => m.name.startsWith('CV'))!;
    const ia = a.results!.chosen.index;
    const ib = b.results!.chosen.index;
    const ma = a.results!.cv!.mean[ia];
    const mb = b.results!.cv!.mean[ib];
    const tol = 1e-12;
    expect(Math.abs(d.difference - (mb - ma))).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(d.difference), Math.abs(mb - ma)));
    const se = Math.hypot(a.results!.cv!.standardError[ia], b.results!.cv!.standardError[ib]);
    expect(Math.abs(d.standardError! - se)).toBeLessThanOrEqual(tol * Math.max(1, se));
    expect(d.lowerIsBetter).toBe(true);
  });

  it('refuses bad lists (400 naming fits), another workspace\'s fit (404), and a different outcome (400)', async () => {
    for (const q of ['', `?fits=${a.id}`, `?fits=${a.id},${a.id}`, `?fits=${a.id},nope`]) {
      const res = await get(team.viewer, `/comparisons${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.field).toBe('fits');
    }
    expect((await get(team.outsider, `/comparisons?fits=${a.id},${b.id}`)).status).toBe(404);
    const other = await post(team.analyst, '/models', { name: 'Other outcome', datasetId: team.datasetId, outcome: 'x1', family: 'gaussian' });
    const c = await finishedFit(team.analyst, (other.body as { id: string }).id, { predictors: ['x2', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 10 }, cv: { kind: 'folds', folds: 3, seed: 2 } });
    const res = await get(team.viewer, `/comparisons?fits=${a.id},${c.id}`);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/same outcome/);
  });
});
