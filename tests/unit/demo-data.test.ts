import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { DEMO_CSV_PATH, DEMO_ROWS, generateDemoCsv } from '../../datasets/demo/generate';

describe('demo data (invented scenario)', () => {
  const generated = generateDemoCsv();

  it('the committed CSV is exactly what the seeded generator writes', () => {
    expect(readFileSync(DEMO_CSV_PATH, 'utf8') === generated, 'run `npm run demo:generate` and commit the CSV').toBe(true);
  });

  it('a different seed gives different data', () => {
    expect(generateDemoCsv(7, 20)).not.toEqual(generateDemoCsv(8, 20));
  });

  it('has both outcomes, 40+ numeric candidates and three categorical predictors', () => {
    const parsed = Papa.parse<Record<string, string>>(generated, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(DEMO_ROWS);
    const columns = parsed.meta.fields ?? [];
    const numeric = columns.filter((c) =>
      parsed.data.every((row) => row[c] === 'NA' || Number.isFinite(Number(row[c]))),
    );
    // vat_id and the outcome are not candidates: 44 numeric predictors + the numeric outcome.
    expect(numeric.length).toBe(45);
    expect(new Set(parsed.data.map((r) => r.top_grade))).toEqual(new Set(['yes', 'no']));
    for (const [column, levels] of [['milk_supplier', 5], ['starter_culture', 4], ['shift', 3]] as const) {
      expect(new Set(parsed.data.map((r) => r[column])).size, column).toBe(levels);
    }
    const yesShare = parsed.data.filter((r) => r.top_grade === 'yes').length / DEMO_ROWS;
    expect(yesShare).toBeGreaterThan(0.2);
    expect(yesShare).toBeLessThan(0.8);
  });
});
