import type { ColumnSchema, ColumnType } from '@shared/datasets';

/**
 * Name patterns for finding columns: plain text matches anywhere (case-insensitive); `*` and `?`
 * make it a whole-name wildcard pattern (`x_*` = every name starting with "x_").
 */
export function namePattern(pattern: string): (name: string) => boolean {
  const p = pattern.trim().toLowerCase();
  if (p === '') return () => true;
  if (!/[*?]/.test(p)) return (name) => name.toLowerCase().includes(p);
  const source = p.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '.*').replace(/\?/g, '.');
  const re = new RegExp(`^${source}$`);
  return (name) => re.test(name.toLowerCase());
}

/** Share of the column's rows that are missing (0 for an empty table). */
export function missingShare(c: ColumnSchema): number {
  return c.summary.count > 0 ? c.summary.missing / c.summary.count : 0;
}

export interface ColumnFilter {
  pattern: string;
  type: ColumnType | 'all';
}

export function filterColumns(columns: ColumnSchema[], filter: ColumnFilter): ColumnSchema[] {
  const matches = namePattern(filter.pattern);
  return columns.filter((c) => (filter.type === 'all' || c.type === filter.type) && matches(c.name));
}
