/**
 * The consumer API's answers: the release document carries the released fit's own numbers (at the
 * released lambda, even after the fit's chosen lambda moves); scoring JSON or CSV gives the same
 * predictions as the fit's predictions download (what the fit page offers), with per-row errors; and
 * every answer matches the OpenAPI 3.1 document the app serves (validated with Ajv's JSON Schema
 * 2020-12 dialect, the one OpenAPI 3.1 uses).
 */
import Ajv2020 from 'ajv/dist/2020';
import addFormats from 'ajv-formats';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CreatedKeyDto, ScoreResponseDto } from '../../../shared/consumers';
import type { FitDetailDto } from '../../../shared/fits';
import type { ReleaseDocumentDto } from '../../../server/consumers/api/release-doc';
import { withCsrf } from '../../support/session';
import { apiRoutes } from '../../support/routes';
import { apiBase } from '../datasets/support';
import { close, closeFitsApp, createKey, fixture, release, v1, type Fixture } from './support';

let f: Fixture;
let key: CreatedKeyDto;
let source: Record<string, number | string>[];
const ajv = new Ajv2020({ strict: false, allErrors: true });
addFormats(ajv);

function sourceRows(csv: string): Record<string, number | string>[] {
  const [head, ...lines] = csv.trim().split('\n');
  const names = head.split(',');
  return lines.map((l) => Object.fromEntries(l.split(',').map((v, i) => [names[i], names[i] === 'g' || names[i] === 'yes' ? v : Number(v)])));
}

/** The fit's own predictions download for its dataset version (the numbers the fit page offers). */
async function fitPredictions(fit: FitDetailDto): Promise<Record<string, string>[]> {
  const res = await f.admin.agent.get(`${apiBase(f.admin)}/fits/${fit.id}/predictions?datasetVersionId=${fit.datasetVersion.id}`);
  expect(res.status).toBe(200);
  const lines = res.text.trim().split('\n').filter((l) => !l.startsWith('#'));
  const header = lines[0].split(',');
  return lines.slice(1).map((l) => Object.fromEntries(l.split(',').map((v, i) => [header[i], v])));
}

let doc: { components: { schemas: Record<string, unknown> }; paths: Record<string, Record<string, unknown>> };
function check(schema: string, body: unknown): void {
  const validate = ajv.getSchema(`openapi#/components/schemas/${schema}`);
  if (!validate) throw new Error(`no schema ${schema} in the document`);
  const ok = validate(body);
  expect(ok, `${schema}: ${JSON.stringify(validate.errors?.slice(0, 3))}\n${JSON.stringify(body).slice(0, 400)}`).toBe(true);
}

beforeAll(async () => {
  f = await fixture();
  await release(f.t, f.gaussian, f.admin.userId);
  await release(f.t, f.binomial, f.admin.userId);
  key = await createKey(f.admin, { name: 'Reader', scope: 'workspace' });
  source = sourceRows(f.csv);
  const res = await v1(f.t, null, 'get', '/openapi.json');
  expect(res.status).toBe(200);
  doc = res.body;
  ajv.addSchema(doc, 'openapi');
}, 180_000);
afterAll(async () => closeFitsApp(f?.t));

describe('the release document', () => {
  it('carries the fit\'s intercept and original-scale coefficients at the released lambda, encoding, standardization, metrics, spec, checksum and engine version', async () => {
    const res = await v1(f.t, key.key, 'get', `/models/${f.gaussian.modelId}/release`);
    expect(res.status).toBe(200);
    const d = res.body as ReleaseDocumentDto;
    const r = f.gaussian.results!;
    const k = r.chosen.index;
    expect(d.lambda).toEqual({ value: r.lambda[k], index: k, rule: r.chosen.rule });
    expect(d.intercept).toBe(r.intercept[k]);
    const sparse = new Map(r.coefficients[k].terms.map((j, i) => [r.terms[j], r.coefficients[k].values[i]]));
    expect(d.coefficients.map((c) => c.term)).toEqual(r.terms);
    for (const c of d.coefficients) expect(c.value, c.term).toBe(sparse.get(c.term) ?? 0);
    expect(d.coefficients.find((c) => c.term === 'g=red')).toMatchObject({ column: 'g', level: 'red' });
    const g = d.encoding.columns.find((c) => c.column === 'g');
    expect(g?.kind).toBe('categorical');
    expect(d.standardization?.applied).toBe(true);
    // standardized = original * scale for every term (the definition of the scale).
    for (const [j, c] of d.coefficients.entries()) expect(close(c.standardizedValue, c.value * d.standardization!.terms[j].scale), c.term).toBe(true);
    expect(d.metrics.cv).toMatchObject({ folds: 3, metric: r.cv!.metric, value: r.cv!.mean[k], standardError: r.cv!.standardError[k] });
    expect(d.fit).toMatchObject({ id: f.gaussian.id, version: 1, engineVersion: f.gaussian.engineVersion, seed: f.gaussian.seed });
    expect(d.fit.datasetSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(d.fit.spec).toEqual(f.gaussian.spec);
    expect(d.cautions.join(' ')).toMatch(/not causal/i);
    check('ReleaseDocument', d);
  });

  it('a new release at another lambda is served at that lambda, and moving the fit\'s chosen lambda later does not change it', async () => {
    const r = f.gaussian.results!;
    const other = r.chosen.index === 2 ? 3 : 2;
    await release(f.t, f.gaussian, f.admin.userId, other);
    const first = (await v1(f.t, key.key, 'get', `/models/${f.gaussian.modelId}/release`)).body as ReleaseDocumentDto;
    expect(first.release.number).toBe(2);
    expect(first.lambda.index).toBe(other);
    expect(first.intercept).toBe(r.intercept[other]);
    const moved = await withCsrf(f.admin.agent.post(`${apiBase(f.admin)}/fits/${f.gaussian.id}/choice`), f.admin.csrf).send({ index: 5 });
    expect(moved.status, moved.text).toBe(200);
    const after = (await v1(f.t, key.key, 'get', `/models/${f.gaussian.modelId}/release`)).body as ReleaseDocumentDto;
    expect(after.lambda.index).toBe(other);
    expect(after.intercept).toBe(first.intercept);
    check('ReleaseDocument', after);
  });
});

describe('scoring', () => {
  it('JSON rows give the same predictions as the fit\'s predictions download, binomial with probabilities', async () => {
    for (const fit of [f.binomial]) {
      const expected = await fitPredictions(fit);
      const res = await v1(f.t, key.key, 'post', `/models/${fit.modelId}/score`).send({ rows: source });
      expect(res.status, res.text).toBe(200);
      const body = res.body as ScoreResponseDto;
      check('ScoreResponse', body);
      expect(body.rowErrors).toBe(0);
      expect(body.rows).toHaveLength(150);
      body.rows.forEach((row, i) => {
        expect(close(row.linearPredictor!, Number(expected[i].linear_predictor)), `row ${i + 1}`).toBe(true);
        expect(close(row.probability!, Number(expected[i].probability)), `row ${i + 1}`).toBe(true);
        expect(close(row.probability!, 1 / (1 + Math.exp(-row.linearPredictor!)))).toBe(true);
      });
    }
  });

  it('the gaussian release scores at its released lambda (b0 + x\'b from the release document), CSV the same as JSON', async () => {
    const d = (await v1(f.t, key.key, 'get', `/models/${f.gaussian.modelId}/release`)).body as ReleaseDocumentDto;
    const json = (await v1(f.t, key.key, 'post', `/models/${f.gaussian.modelId}/score`).send({ rows: source.slice(0, 20) })).body as ScoreResponseDto;
    const csv = await v1(f.t, key.key, 'post', `/models/${f.gaussian.modelId}/score`).set('Content-Type', 'text/csv').send(f.csv.split('\n').slice(0, 21).join('\n'));
    expect(csv.status, csv.text).toBe(200);
    check('ScoreResponse', csv.body);
    expect(json.lambda).toBe(d.lambda.value);
    source.slice(0, 20).forEach((row, i) => {
      let eta = d.intercept;
      for (const c of d.coefficients) eta += c.level === null ? c.value * (row[c.column] as number) : row[c.column] === c.level ? c.value : 0;
      expect(close(json.rows[i].linearPredictor!, eta), `row ${i + 1}: ${json.rows[i].linearPredictor} vs ${eta}`).toBe(true);
      expect(close((csv.body as ScoreResponseDto).rows[i].linearPredictor!, eta)).toBe(true);
      expect(json.rows[i].probability).toBeUndefined();
    });
  });

  it('per-row errors for a column absent from the row, a missing value, an unseen category and text in a number column', async () => {
    const good = { x1: 0.5, x2: -1, n1: 0.2, g: 'red' };
    const rows = [good, { x2: -1, n1: 0.2, g: 'red' }, { ...good, x1: null }, { ...good, g: 'purple' }, { ...good, x2: 'abc' }, { ...good, x2: '1.5' }];
    const res = await v1(f.t, key.key, 'post', `/models/${f.binomial.modelId}/score`).send({ rows });
    expect(res.status).toBe(200);
    const body = res.body as ScoreResponseDto;
    check('ScoreResponse', body);
    expect(body.rowErrors).toBe(4);
    expect(body.rows.map((r) => r.error)).toEqual([
      null,
      'column "x1" is absent from this row',
      'column "x1" is blank (this fit left out rows with blanks, so it has no fill value)',
      'column "g": category "purple" was not seen when fitting',
      'column "x2": "abc" is not a number',
      null,
    ]);
    expect(body.rows[1]).toMatchObject({ linearPredictor: null, probability: null });
    // "1.5" as text reads as the number 1.5.
    const same = (await v1(f.t, key.key, 'post', `/models/${f.binomial.modelId}/score`).send({ rows: [{ ...good, x2: 1.5 }] })).body as ScoreResponseDto;
    expect(body.rows[5].linearPredictor).toBe(same.rows[0].linearPredictor);
  });
});

describe('the OpenAPI 3.1 document', () => {
  it('is OpenAPI 3.1, lists exactly the consumer routes the app has, and describes the answers given', async () => {
    expect((doc as unknown as { openapi: string }).openapi).toBe('3.1.0');
    const documented = Object.entries(doc.paths).flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} /api/v1${p.replace(/\{(\w+)\}/g, ':$1')}`)).sort();
    const served = apiRoutes(f.t.app).filter((r) => r.path.startsWith('/api/v1/')).map((r) => `${r.method} ${r.path}`).sort();
    expect(documented).toEqual(served);
    const list = await v1(f.t, key.key, 'get', '/models');
    check('ReleasedModelList', list.body);
    const bin = await v1(f.t, key.key, 'get', `/models/${f.binomial.modelId}/release`);
    check('ReleaseDocument', bin.body);
    expect((bin.body as ReleaseDocumentDto).encoding.responseLevels).toEqual(['no', 'yes']);
    for (const res of [await v1(f.t, null, 'get', '/models'), await v1(f.t, key.key, 'get', '/models/00000000-0000-4000-8000-000000000000/release'), await v1(f.t, key.key, 'post', `/models/${f.gaussian.modelId}/score`).send({ rows: 1 })]) {
      expect(res.status).toBeGreaterThanOrEqual(400);
      check('Error', res.body);
      const op = Object.values(doc.paths).flatMap((ops) => Object.values(ops) as { responses: Record<string, unknown> }[]);
      expect(op.some((o) => String(res.status) in o.responses), `status ${res.status} documented`).toBe(true);
    }
    // The checks can fail: a body missing a required field is refused.
    const validate = ajv.getSchema('openapi#/components/schemas/ScoreResponse')!;
    expect(validate({ ...(list.body as object) })).toBe(false);
  });
});
