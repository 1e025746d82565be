/**
 * Beside the predictor table: which usable columns the default set left unticked and why, which
 * chosen predictors have many blanks, and how many rows the fit will keep with the chosen missing-value
 * policy (from the column summaries), so a fit that quietly loses half its rows is seen before it runs.
 */
import type { ColumnSchema } from '@shared/datasets';
import { MISSING_POLICY_LABELS } from '@shared/fits';
import { countFormat } from '@/lib/numbers';
import { DEFAULT_MAX_BLANK_SHARE, rowsKept, type LeftOutColumn } from './fitFormModel';

interface Props {
  columns: ColumnSchema[];
  outcome: string;
  predictors: string[];
  missing: 'drop' | 'impute' | undefined;
  rowCount: number;
  leftOut: LeftOutColumn[];
}

export function PredictorRowsNote({ columns, outcome, predictors, missing, rowCount, leftOut }: Props) {
  const chosen = new Set(predictors);
  const unticked = leftOut.filter((c) => !chosen.has(c.name));
  const gappy = columns.filter((c) => chosen.has(c.name) && c.summary.count > 0 && c.summary.missing / c.summary.count > DEFAULT_MAX_BLANK_SHARE);
  const { least, most } = rowsKept(columns, outcome, predictors, missing, rowCount);
  const policy = MISSING_POLICY_LABELS[missing ?? 'drop'].toLowerCase();
  const rows = least === most ? countFormat.format(most) : `between ${countFormat.format(least)} and ${countFormat.format(most)}`;
  const warn = most < rowCount * (1 - DEFAULT_MAX_BLANK_SHARE);
  return (
    <div className="space-y-1 text-sm" data-testid="predictor-rows-note">
      <p className={warn ? 'font-bold text-amber-800 dark:text-amber-200' : 'text-slate-700 dark:text-slate-300'}>
        Rows the fit will use: {rows} of {countFormat.format(rowCount)} (missing values: {policy}).
      </p>
      {gappy.length > 0 && (
        <p className="text-amber-800 dark:text-amber-200">
          Chosen predictors with many blanks: {gappy.map((c) => `${c.name} (${c.summary.missing} blank)`).join(', ')}.
        </p>
      )}
      {unticked.length > 0 && (
        <p className="text-slate-700 dark:text-slate-300">
          Not ticked by default (tick them to use them): {unticked.map((c) => `${c.name}, ${c.reason}`).join('; ')}.
        </p>
      )}
    </div>
  );
}
