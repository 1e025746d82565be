/** One date format across pages: src/lib/dates.ts, and no page formatting dates its own way. */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { formatDay, formatWhen } from '@/lib/dates';

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? sources(full) : /\.tsx?$/.test(name) ? [full] : [];
  });
}

describe('dates', () => {
  it('reads day month year, with the time when asked', () => {
    const d = new Date(2026, 11, 2, 4, 25);
    expect(formatWhen(d)).toBe('2 Dec 2026, 04:25');
    expect(formatWhen(d.toISOString())).toBe('2 Dec 2026, 04:25');
    expect(formatDay(d)).toBe('2 Dec 2026');
  });

  it('is the only date format in the client', () => {
    const offenders = sources(path.resolve(__dirname, '../../../src'))
      .filter((file) => !file.endsWith(path.join('lib', 'dates.ts')))
      .filter((file) => /\.toLocale(Date|Time)String\(|Intl\.DateTimeFormat|Date\([^)]*\)\.toLocaleString\(/.test(readFileSync(file, 'utf8')));
    expect(offenders).toEqual([]);
  });
});
