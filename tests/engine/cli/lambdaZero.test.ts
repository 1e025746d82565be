/**
 * `lariat fit --lambda 0 --no-standardize --folds 0` is the unpenalized least-squares fit and must
 * reproduce the certified coefficients of NIST StRD Longley (Statistical Reference Datasets, linear
 * least squares, https://www.itl.nist.gov/div898/strd/lls/data/Longley.shtml; values in
 * datasets/reference/nist/longley.json) to at least 9 significant digits (NIST StRD, linear least squares).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readJson } from '../reference/helpers';
import { expectDigits } from '../../support/numbers';

const CLI = fileURLToPath(new URL('../../../server/cli/main.ts', import.meta.url));
const TSX = fileURLToPath(new URL('../../../node_modules/.bin/tsx', import.meta.url));
/** What `npm run -s cli` runs: the esbuild bundle of the same sources (built when stale). */
const BUNDLED = fileURLToPath(new URL('../../../scripts/cli.sh', import.meta.url));
const RUNNERS: [string, string, string[]][] = [
  ['through tsx', TSX, [CLI]],
  ['through the bundle (scripts/cli.sh)', 'bash', [BUNDLED]],
];

interface NistFixture {
  predictors: Record<string, number[]>;
  y: number[];
  certified: { estimates: string[] };
}

describe.each(RUNNERS)('CLI at lambda = 0 (%s): NIST StRD Longley', (_name, command, prefix) => {
  it('reproduces the certified intercept and six coefficients to >= 9 significant digits', () => {
    const nist = readJson<NistFixture>('datasets/reference/nist/longley.json');
    const names = Object.keys(nist.predictors);
    const lines = [['y', ...names].join(',')];
    nist.y.forEach((v, i) => lines.push([v, ...names.map((name) => nist.predictors[name][i])].join(',')));
    const dir = mkdtempSync(join(tmpdir(), 'lariat-longley-'));
    writeFileSync(join(dir, 'longley.csv'), `${lines.join('\n')}\n`);
    const r = spawnSync(command, [...prefix, 'fit', '--data', 'longley.csv', '--response', 'y', '--lambda', '0', '--no-standardize', '--folds', '0'], { encoding: 'utf8', cwd: dir });
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { lambda: number[]; intercept: number[]; coefficients: Record<string, number[]>; status: string[]; dualityGap: number[]; cv: unknown; notes: string[] };
    expect(out.lambda).toEqual([0]);
    expect(out.cv).toBeNull();
    expect(out.status).toEqual(['converged']);
    expect(out.notes.join('\n')).toMatch(/lambda = 0: unpenalized fit \(least squares by QR\)/);
    const certified = nist.certified.estimates.map(Number);
    expectDigits('Longley b0 (NIST StRD certified)', out.intercept[0], certified[0], 9);
    names.forEach((name, j) => expectDigits(`Longley ${name} (NIST StRD certified)`, out.coefficients[name][0], certified[j + 1], 9));
  });
});
