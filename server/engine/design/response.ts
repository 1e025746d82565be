import { RESPONSE_RULES } from '../core/loss/responses';
import { EngineInputError, type EngineColumn, type Family } from '../types';

/**
 * The response on the kept rows. Binomial: numeric 0/1, or a categorical with exactly two levels
 * present, mapped to 0/1 in the order of the column's levels (the mapping goes into the notes).
 */
export function encodeResponse(
  column: EngineColumn,
  rows: Int32Array,
  family: Family,
): { y: Float64Array; responseLevels?: [string, string]; note?: string } {
  const n = rows.length;
  const y = new Float64Array(n);
  const rules = RESPONSE_RULES[family];
  if (column.kind === 'numeric') {
    for (let i = 0; i < n; i++) {
      const v = column.values[rows[i]];
      if (!Number.isFinite(v)) {
        throw new EngineInputError(`response "${column.name}" has a non-finite value ${v} in row ${rows[i] + 1}`, 'response');
      }
      const invalid = rules.invalid(v, rows[i] + 1, column.name);
      if (invalid) throw new EngineInputError(invalid, 'response');
      y[i] = v;
    }
    return { y };
  }
  if (!rules.categorical) {
    throw new EngineInputError(`${family} response "${column.name}" must be numeric, not categorical`, 'response');
  }
  const present = new Uint8Array(column.levels.length);
  for (let i = 0; i < n; i++) present[column.codes[rows[i]]] = 1;
  const codes: number[] = [];
  present.forEach((flag, k) => {
    if (flag) codes.push(k);
  });
  if (codes.length !== 2) {
    const seen = codes.map((k) => `"${column.levels[k]}"`).join(', ');
    throw new EngineInputError(
      `binomial response "${column.name}" must have exactly two values; the rows used have ${codes.length} (${seen})`,
      'response',
    );
  }
  for (let i = 0; i < n; i++) y[i] = column.codes[rows[i]] === codes[1] ? 1 : 0;
  const levels: [string, string] = [column.levels[codes[0]], column.levels[codes[1]]];
  return {
    y,
    responseLevels: levels,
    note: `response "${column.name}": "${levels[0]}" -> 0, "${levels[1]}" -> 1`,
  };
}
