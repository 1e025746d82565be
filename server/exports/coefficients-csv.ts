/**
 * The coefficients of a fit at one lambda as CSV: one line per term (the intercept first) with the
 * original-scale and standardized values, the standardization of the term, and the share of CV folds
 * keeping it. Comment lines (#) after the rows name the fit and lambda and carry the cautions.
 */
import { CAUTION_LINES } from '../../shared/cautions';
import type { ChosenModel } from './chosen-model';

function cell(text: string): string {
  return /[",\n\r#]/.test(text) || text !== text.trim() ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The level of a categorical indicator term, '' for a numeric term. */
export function termLevels(m: ChosenModel): string[] {
  const levels = m.results.terms.map(() => '');
  for (const c of m.results.encoding.columns) if (c.kind === 'categorical') c.terms.forEach((t, k) => (levels[t] = c.levels[k]));
  return levels;
}

export function coefficientsCsv(m: ChosenModel, modelName: string): string {
  const r = m.results;
  const std = r.standardization ?? null;
  const levels = termLevels(m);
  const lines = ['term,column,level,coefficient,standardized_coefficient,center,scale,selection_share'];
  lines.push(`(intercept),,,${m.intercept},${m.standardizedIntercept},,,`);
  r.terms.forEach((term, j) => {
    const share = m.stability ? String(m.stability[j]) : '';
    const center = std ? String(std.centers[j]) : '';
    const scale = std ? String(std.scales[j]) : '';
    lines.push([cell(term), cell(r.termColumns[j]), cell(levels[j]), m.coefficients[j], m.standardizedCoefficients[j], center, scale, share].join(','));
  });
  const notes = [
    `# ${modelName}, version ${m.fit.version}, lambda ${m.lambda} (position ${m.index}, ${m.rule}); ${r.rowsFitted} rows fitted.`,
    '# coefficient: original scale (applies to the raw column, or to the level indicator); standardized: on (x - center) / scale.',
    ...CAUTION_LINES.map((c) => `# ${c}`),
  ];
  return `${lines.join('\n')}\n${notes.join('\n')}\n`;
}
