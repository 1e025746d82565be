/**
 * Exports of a fit: PMML 4.4 scored by an independent evaluator (pmml-evaluator.ts, reading only the
 * XML) reproduces Lariat's own predictions download for both families; the coefficients CSV holds the
 * fit's numbers; the reproducibility bundle's CLI command, run on the fit's data, gives the fit's
 * coefficients again; the fit JSON carries the cautions; an unfinished or foreign fit is refused.
 */
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FitDetailDto } from '../../../shared/fits';
import type { ReproBundle } from '../../../server/exports/bundle';
import { signUp } from '../../support/session';
import { apiBase } from '../datasets/support';
import { close, closeFitsApp, fixture, type Fixture } from './support';
import { parsePmml, scorePmml } from './pmml-evaluator';

let f: Fixture;
const exportUrl = (fit: FitDetailDto, name: string) => `${apiBase(f.admin)}/fits/${fit.id}/exports/${name}`;

function csvRecords(text: string): Record<string, string>[] {
  const lines = text.trim().split('\n').filter((l) => !l.startsWith('#'));
  const header = lines[0].split(',');
  return lines.slice(1).map((l) => Object.fromEntries(l.split(',').map((v, i) => [header[i], v])));
}

beforeAll(async () => {
  f = await fixture();
}, 180_000);
afterAll(async () => closeFitsApp(f?.t));

describe('PMML 4.4 round trip', () => {
  it('an independent evaluator of the PMML reproduces Lariat\'s predictions (gaussian and binomial), cautions included', async () => {
    const source = csvRecords(f.csv);
    for (const fit of [f.gaussian, f.binomial]) {
      const res = await f.admin.agent.get(exportUrl(fit, 'model.pmml'));
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/application\/xml/);
      const xml = res.text;
      const m = parsePmml(xml);
      expect(m.version).toBe('4.4');
      expect(m.namespace).toBe('http://www.dmg.org/PMML-4_4');
      expect(m.functionName).toBe(fit.family === 'binomial' ? 'classification' : 'regression');
      expect(m.fields.get('g')?.values.sort()).toEqual(['blue', 'green', 'red']);
      expect(xml).toMatch(/Selected is not causal/);
      if (fit.family === 'binomial') expect(m.tables.map((t) => t.target)).toEqual(['yes', 'no']);
      const predictions = await f.admin.agent.get(`${apiBase(f.admin)}/fits/${fit.id}/predictions?datasetVersionId=${fit.datasetVersion.id}`);
      const lariat = csvRecords(predictions.text);
      expect(lariat).toHaveLength(source.length);
      const wrong: string[] = [];
      source.forEach((row, i) => {
        const got = scorePmml(m, row);
        const want = Number(fit.family === 'binomial' ? lariat[i].probability : lariat[i].linear_predictor);
        if (got === null || !close(got, want, 1e-12)) wrong.push(`row ${i + 1}: PMML ${got}, Lariat ${want}, tol 1e-12`);
      });
      expect(wrong).toEqual([]);
    }
  });

  it('a PMML at another lambda position differs, and a position off the path is a 400', async () => {
    const k = f.gaussian.results!.chosen.index;
    const other = k === 0 ? 1 : 0;
    const res = await f.admin.agent.get(`${exportUrl(f.gaussian, 'model.pmml')}?index=${other}`);
    expect(res.status).toBe(200);
    expect(Number(parsePmml(res.text).tables[0].intercept)).toBe(f.gaussian.results!.intercept[other]);
    const bad = await f.admin.agent.get(`${exportUrl(f.gaussian, 'model.pmml')}?index=9999`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('index');
  });
});

describe('coefficients CSV, fit JSON and the reproducibility bundle', () => {
  it('the CSV holds the intercept and every term at the chosen lambda, with standardized values and selection shares', async () => {
    const res = await f.admin.agent.get(exportUrl(f.gaussian, 'coefficients.csv'));
    expect(res.status).toBe(200);
    const rows = csvRecords(res.text);
    const r = f.gaussian.results!;
    const k = r.chosen.index;
    expect(rows[0].term).toBe('(intercept)');
    expect(Number(rows[0].coefficient)).toBe(r.intercept[k]);
    expect(rows.slice(1).map((x) => x.term)).toEqual(r.terms);
    r.terms.forEach((term, j) => {
      const sparse = r.coefficients[k].terms.indexOf(j);
      expect(Number(rows[j + 1].coefficient), term).toBe(sparse < 0 ? 0 : r.coefficients[k].values[sparse]);
      expect(Number(rows[j + 1].selection_share), term).toBe(r.stability![j]);
    });
    expect(rows.find((x) => x.term === 'g=red')).toMatchObject({ column: 'g', level: 'red' });
    expect(res.text).toMatch(/# .*not causal/i);
  });

  it('the fit JSON is the fit detail with the standardization and the cautions', async () => {
    const res = await f.admin.agent.get(exportUrl(f.binomial, 'fit.json'));
    expect(res.status).toBe(200);
    const body = JSON.parse(res.text) as { fit: FitDetailDto; cautions: string[]; standardization: { scales: number[] } };
    expect(body.fit.id).toBe(f.binomial.id);
    expect(body.fit.results!.intercept).toEqual(f.binomial.results!.intercept);
    expect(body.standardization.scales).toHaveLength(f.binomial.results!.terms.length);
    expect(body.cautions.length).toBeGreaterThanOrEqual(4);
  });

  it('the bundle names spec, checksum, engine version and seed, and its CLI command re-makes the fit\'s coefficients', async () => {
    const res = await f.admin.agent.get(exportUrl(f.gaussian, 'bundle.json'));
    expect(res.status).toBe(200);
    const b = JSON.parse(res.text) as ReproBundle;
    expect(b.spec).toEqual(f.gaussian.spec);
    expect(b.engineVersion).toBe(f.gaussian.engineVersion);
    expect(b.dataset.sha256).toBe(f.gaussian.datasetVersion.sha256);
    expect(b.seed).toBe(f.gaussian.seed);
    expect(b.command).toContain('--folds 3 --seed 5');
    // The original download has the recorded checksum.
    const original = await f.admin.agent.get(b.dataset.originalPath).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    const { createHash } = await import('node:crypto');
    expect(createHash('sha256').update(original.body as Buffer).digest('hex')).toBe(b.dataset.sha256);
    // Run the command as a person would, in a folder holding the cleaned CSV under the bundle's file name.
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-bundle-'));
    try {
      const cleaned = await f.admin.agent.get(b.dataset.downloadPath);
      fs.writeFileSync(path.join(dir, b.dataset.fileName), cleaned.text);
      for (const [name, content] of Object.entries(b.files)) fs.writeFileSync(path.join(dir, name), JSON.stringify(content));
      const args = b.command.replace(/^npm run -s cli -- /, '');
      const { stdout } = await promisify(execFile)('bash', ['-c', `bash ${path.resolve('scripts/cli.sh')} ${args}`], { cwd: dir, maxBuffer: 64 * 1024 * 1024 });
      const out = JSON.parse(stdout) as { lambda: number[]; intercept: number[]; coefficients: Record<string, number[]> };
      const r = f.gaussian.results!;
      expect(out.lambda.length).toBe(r.lambda.length);
      const k = r.chosen.index;
      expect(close(out.lambda[k], r.lambda[k], 1e-9)).toBe(true);
      expect(close(out.intercept[k], r.intercept[k], 1e-6), `intercept ${out.intercept[k]} vs ${r.intercept[k]}`).toBe(true);
      r.terms.forEach((term, j) => {
        const sparse = r.coefficients[k].terms.indexOf(j);
        const want = sparse < 0 ? 0 : r.coefficients[k].values[sparse];
        expect(close(out.coefficients[term][k], want, 1e-6), `${term}: CLI ${out.coefficients[term][k]}, fit ${want}, tol 1e-6`).toBe(true);
      });
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }, 120_000);
});

describe('access to exports', () => {
  it('another workspace gets 404; a stranger 401', async () => {
    const other = await signUp(f.t.app);
    const res = await other.agent.get(`/api/workspaces/${f.admin.workspaceId}/fits/${f.gaussian.id}/exports/model.pmml`);
    expect(res.status).toBe(404);
    const own = await other.agent.get(`/api/workspaces/${other.workspaceId}/fits/${f.gaussian.id}/exports/model.pmml`);
    expect(own.status).toBe(404);
    expect(own.text).not.toContain('RegressionModel');
    const { default: request } = await import('supertest');
    expect((await request(f.t.app).get(exportUrl(f.gaussian, 'bundle.json'))).status).toBe(401);
  });
});
