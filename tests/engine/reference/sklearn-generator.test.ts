/**
 * The committed scikit-learn fixtures are what generate.py writes today: when Debian's
 * /usr/bin/python3 with scikit-learn is present, re-run the generator into a temporary folder and
 * compare every result (numbers to 1e-9 relative, since another BLAS may round differently). The
 * reference library's own iteration counts (`nIter`) are not results: another machine with the same
 * version may take one iteration more or less (234 against 235 was seen), so they are left out.
 * Without Python (e.g. in CI) the other reference tests run from the committed fixtures alone.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { repoRoot } from './helpers';

const PYTHON = '/usr/bin/python3';
const FIXTURES = ['gaussian-paths.json', 'logistic-paths.json', 'logistic-unpenalized.json', 'separation.json', 'longley-inference.json'];
const available = spawnSync(PYTHON, ['-c', 'import sklearn, scipy'], { encoding: 'utf8' }).status === 0;

/** Keys that describe how the reference library ran, not what it computed. */
const NOT_RESULTS = new Set(['versions', 'nIter']);

/** Paths where two JSON values differ (numbers beyond tol * max(1, |a|, |b|)); NOT_RESULTS keys skipped. */
function differences(a: unknown, b: unknown, tol: number, path = '$'): string[] {
  if (typeof a === 'number' && typeof b === 'number') {
    return Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b)) ? [] : [`${path}: committed ${a}, regenerated ${b}`];
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) return [`${path}: length ${a.length} vs ${b.length}`];
    return a.flatMap((v, i) => differences(v, b[i], tol, `${path}[${i}]`));
  }
  if (a && b && typeof a === 'object' && typeof b === 'object') {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)].filter((k) => !NOT_RESULTS.has(k)));
    return [...keys].flatMap((k) =>
      differences((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], tol, `${path}.${k}`),
    );
  }
  return a === b ? [] : [`${path}: committed ${JSON.stringify(a)}, regenerated ${JSON.stringify(b)}`];
}

describe.skipIf(!available)('generate.py reproduces the committed fixtures', () => {
  const out = mkdtempSync(join(tmpdir(), 'lariat-sklearn-'));
  afterAll(() => rmSync(out, { recursive: true, force: true }));

  it('re-runs with scikit-learn and matches', { timeout: 180_000 }, () => {
    const run = spawnSync(PYTHON, ['-B', join(repoRoot, 'datasets/reference/sklearn/generate.py'), out], {
      encoding: 'utf8',
      timeout: 170_000,
    });
    expect(run.status, run.stderr).toBe(0);
    for (const name of FIXTURES) {
      const committed = JSON.parse(readFileSync(join(repoRoot, 'datasets/reference/sklearn', name), 'utf8'));
      const fresh = JSON.parse(readFileSync(join(out, name), 'utf8'));
      const diff = differences(committed, fresh, 1e-9);
      expect(diff, `${name}: ${diff.slice(0, 10).join('; ')}`).toEqual([]);
    }
  });
});
