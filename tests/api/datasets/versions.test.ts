/**
 * Column settings make version N+1 sharing the stored file; loadEngineTable gives the engine's form;
 * deletion is refused while something depends on the dataset; roles and workspaces are enforced;
 * open datasets import in one click (idempotent). Expected values come from the small inputs here.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UploadResultDto, VersionDetailDto } from '../../../shared/datasets';
import { loadEngineTable, registerDatasetDependents } from '../../../server/datasets/index';
import { startTestApp, type TestApp } from '../../support/app';
import { inviteAndJoin, signUp, uniqueEmail, withCsrf, type Session } from '../../support/session';
import { closeApp, apiBase, tableCounts, upload } from './support';

let t: TestApp;
let alice: Session;
let data: UploadResultDto;

beforeAll(async () => {
  t = await startTestApp();
  alice = await signUp(t.app);
  data = (await upload(alice, 'grade,score,group\n1,-2.5,a\n2,NA,b\n3,4,a\n2,1,c\n', 'grades.csv', { name: 'Grades' })).body as UploadResultDto;
});
afterAll(async () => closeApp(t));

const versionUrl = (n: number) => `${apiBase(alice)}/datasets/${data.datasetId}/versions/${n}`;

describe('versions and column settings', () => {
  it('loads a version in the engine form: Float64Array with NaN, Int32Array codes with -1', async () => {
    const table = await loadEngineTable(t.ctx.db, data.version.id);
    expect(table.nRows).toBe(4);
    const score = table.columns.find((c) => c.name === 'score')!;
    expect(score.kind).toBe('numeric');
    if (score.kind !== 'numeric') throw new Error('numeric expected');
    expect(Array.from(score.values)).toEqual([-2.5, Number.NaN, 4, 1]);
    const group = table.columns.find((c) => c.name === 'group')!;
    if (group.kind !== 'categorical') throw new Error('categorical expected');
    expect(group.levels).toEqual(['a', 'b', 'c']);
    expect(Array.from(group.codes)).toEqual([0, 1, 0, 2]);
  });

  it('an override makes version 2 on the same file, and version 1 is unchanged', async () => {
    const before = await tableCounts(t);
    const res = await withCsrf(alice.agent.post(`${versionUrl(1)}/column-settings`), alice.csrf).send({
      columns: [
        { name: 'grade', type: 'categorical', excluded: false },
        { name: 'group', type: 'categorical', excluded: true },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ number: 2, origin: 'column-settings', basedOn: 1, sha256: data.version.sha256 });
    const after = await tableCounts(t);
    expect(after.dataset_versions).toBe(before.dataset_versions + 1);
    expect(after.dataset_uploads).toBe(before.dataset_uploads); // no second copy of the file
    const v2 = (await alice.agent.get(versionUrl(2))).body as VersionDetailDto;
    expect(v2.columns[0]).toMatchObject({ type: 'categorical', inferredType: 'numeric', overridden: true });
    expect(v2.columns[0].summary.levels).toEqual([
      { level: '2', count: 2 },
      { level: '1', count: 1 },
      { level: '3', count: 1 },
    ]);
    const v1 = (await alice.agent.get(versionUrl(1))).body as VersionDetailDto;
    expect(v1.columns[0].type).toBe('numeric');
    const table = await loadEngineTable(t.ctx.db, v2.id);
    expect(table.columns.map((c) => `${c.name}:${c.kind}`)).toEqual(['grade:categorical', 'score:numeric']);
  });

  it('refuses an override the values do not allow, naming the column and value', async () => {
    const res = await withCsrf(alice.agent.post(`${versionUrl(1)}/column-settings`), alice.csrf).send({ columns: [{ name: 'group', type: 'numeric', excluded: false }] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/Column "group" cannot be numbers: "a" in data row 1 is not a number/);
    const unknown = await withCsrf(alice.agent.post(`${versionUrl(1)}/column-settings`), alice.csrf).send({ columns: [{ name: 'nope', type: 'numeric', excluded: false }] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.field).toBe('columns.0.name');
  });

  it('loadEngineTable names a missing or text column', async () => {
    await expect(loadEngineTable(t.ctx.db, data.version.id, ['nope'])).rejects.toThrow(/Column "nope" is not in version 1/);
  });
});

describe('deleting', () => {
  it('refuses while a dependent exists, with the explanation, then deletes everything', async () => {
    const d = (await upload(alice, 'p,q\n1,2\n3,4\n5,7\n', 'dep.csv')).body as UploadResultDto;
    const remove = registerDatasetDependents(async (_db, id) => (id === d.datasetId ? ['fit 1 of model "Test-only dependent"'] : []));
    try {
      const refused = await withCsrf(alice.agent.delete(`${apiBase(alice)}/datasets/${d.datasetId}`), alice.csrf);
      expect(refused.status).toBe(409);
      expect(refused.body.error.message).toMatch(/cannot be deleted because other work depends on it: fit 1 of model "Test-only dependent"/);
    } finally {
      remove();
    }
    const before = await tableCounts(t);
    const ok = await withCsrf(alice.agent.delete(`${apiBase(alice)}/datasets/${d.datasetId}`), alice.csrf);
    expect(ok.status).toBe(204);
    const after = await tableCounts(t);
    expect(after.datasets).toBe(before.datasets - 1);
    expect(after.dataset_versions).toBe(before.dataset_versions - 1);
    expect((await alice.agent.get(`${apiBase(alice)}/datasets/${d.datasetId}`)).status).toBe(404);
  });

  it('the database refuses to change a stored version', async () => {
    const attempt = t.ctx.db.execute(sql`UPDATE dataset_versions SET number = 99 WHERE id = ${data.version.id}`);
    await expect(attempt).rejects.toSatisfy((e: Error & { cause?: Error }) => /immutable/.test(`${e.message} ${e.cause?.message ?? ''}`));
  });
});

describe('roles and workspaces', () => {
  it('viewers read but cannot upload or delete; other workspaces get 404', async () => {
    const viewer = await inviteAndJoin(t, alice, uniqueEmail('viewer'), 'viewer');
    expect((await viewer.agent.get(`${apiBase(alice)}/datasets`)).status).toBe(200);
    expect((await viewer.agent.get(versionUrl(1))).status).toBe(200);
    const up = await upload(viewer, 'a,b\n1,2\n', 'v.csv');
    expect(up.status).toBe(403);
    expect((await withCsrf(viewer.agent.delete(`${apiBase(alice)}/datasets/${data.datasetId}`), viewer.csrf)).status).toBe(403);
    const mallory = await signUp(t.app);
    expect((await mallory.agent.get(`${apiBase(alice)}/datasets`)).status).toBe(404);
    expect((await mallory.agent.get(`${apiBase(mallory)}/datasets/${data.datasetId}`)).status).toBe(404);
    expect((await mallory.agent.get(`${apiBase(mallory)}/datasets/${data.datasetId}/versions/1/original`)).status).toBe(404);
  });
});

describe('open datasets', () => {
  it('imports the diabetes data in one click, once, with its citation', async () => {
    const list = await alice.agent.get(`${apiBase(alice)}/open-datasets`);
    const diabetes = list.body.openDatasets.find((o: { key: string }) => o.key === 'diabetes');
    expect(diabetes.citation).toMatch(/Efron, Trevor Hastie, Iain Johnstone and Robert Tibshirani \(2004\)/);
    // The cards cite the original publications and data repositories; the copying route stays in SOURCES.md.
    for (const card of list.body.openDatasets as { citation: string; licence: string }[]) {
      expect(`${card.citation} ${card.licence}`).not.toMatch(/scikit-learn|Debian|copied|as shipped/i);
    }
    expect(list.body.openDatasets.find((o: { key: string }) => o.key === 'breast-cancer').citation).toMatch(/UCI Machine Learning Repository/);
    const first = await withCsrf(alice.agent.post(`${apiBase(alice)}/open-datasets/diabetes/import`), alice.csrf);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const v = (await alice.agent.get(`${apiBase(alice)}/datasets/${first.body.datasetId}/versions/1`)).body as VersionDetailDto;
    // datasets/open/SOURCES.md: 442 rows, 11 columns; sex coded 1/2.
    expect(v.rowCount).toBe(442);
    expect(v.columnCount).toBe(11);
    expect(v.columns.find((c) => c.name === 'sex')?.type).toBe('binary');
    expect(v.origin).toBe('open-dataset');
    const again = await withCsrf(alice.agent.post(`${apiBase(alice)}/open-datasets/diabetes/import`), alice.csrf);
    expect(again.status).toBe(200);
    expect(again.body.datasetId).toBe(first.body.datasetId);
    const listed = await alice.agent.get(`${apiBase(alice)}/open-datasets`);
    expect(listed.body.openDatasets.find((o: { key: string }) => o.key === 'diabetes').importedAs).toBe(first.body.datasetId);
  });

  it('breast cancer: 569 rows, diagnosis 212 zeros and 357 ones (SOURCES.md)', async () => {
    const res = await withCsrf(alice.agent.post(`${apiBase(alice)}/open-datasets/breast-cancer/import`), alice.csrf);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const table = await loadEngineTable(t.ctx.db, res.body.versionId, ['diagnosis']);
    const y = table.columns[0];
    if (y.kind !== 'numeric') throw new Error('0/1 diagnosis should load as numbers');
    expect(table.nRows).toBe(569);
    expect(Array.from(y.values).filter((x) => x === 0).length).toBe(212);
    expect(Array.from(y.values).filter((x) => x === 1).length).toBe(357);
  });
});
