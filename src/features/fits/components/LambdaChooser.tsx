/** Choose the lambda this version reports: the CV minimum, the one-standard-error rule, or any position. */
import { useState } from 'react';
import type { FitResultsDto } from '@shared/fits';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { formatShare, formatStat } from '@/lib/numbers';

const RULE_WORDS = { minimum: 'the CV minimum', 'one-standard-error': 'the one-standard-error rule', manual: 'by hand', last: 'the end of the path (no cross-validation)' } as const;

interface Props {
  results: FitResultsDto;
  canChoose: boolean;
  busy: boolean;
  error: Error | null;
  onChoose: (input: { rule: 'minimum' | 'one-standard-error' } | { index: number }) => void;
}

export function LambdaChooser({ results, canChoose, busy, error, onChoose }: Props) {
  const c = results.chosen;
  const [position, setPosition] = useState(c.index);
  const cv = results.cv;
  return (
    <section aria-labelledby="choice-heading" className="space-y-3 rounded-lg border-2 border-lariat-200 bg-white p-4 dark:border-lariat-800 dark:bg-slate-900">
      <h2 id="choice-heading" className="text-lg font-bold">
        Chosen lambda
      </h2>
      <p className="text-sm" data-testid="chosen-lambda">
        Lambda <strong className="font-mono">{formatStat(c.lambda)}</strong> (position {c.index + 1} of {results.lambda.length}), chosen by {RULE_WORDS[c.rule]}
        {c.chosenBy ? ` (${c.chosenBy.name})` : ''}: {results.nonzero[c.index]} nonzero terms, {formatShare(results.devianceExplained[c.index])} of the deviance explained.
      </p>
      {canChoose && (
        <div className="flex flex-wrap items-end gap-3">
          {cv && (
            <>
              <Button variant="secondary" disabled={busy || c.rule === 'minimum'} onClick={() => onChoose({ rule: 'minimum' })}>
                Use the CV minimum
              </Button>
              <Button variant="secondary" disabled={busy || c.rule === 'one-standard-error'} onClick={() => onChoose({ rule: 'one-standard-error' })}>
                Use the one-standard-error lambda
              </Button>
            </>
          )}
          <label className="flex flex-col gap-1 text-sm">
            <span className="font-bold">Or any position on the path</span>
            <span className="flex items-center gap-2">
              <input type="range" min={1} max={results.lambda.length} value={position + 1} onChange={(e) => setPosition(Number(e.target.value) - 1)} aria-valuetext={`position ${position + 1}, lambda ${formatStat(results.lambda[position])}`} />
              <span className="font-mono text-xs">
                {position + 1}: {formatStat(results.lambda[position])}
              </span>
            </span>
          </label>
          <Button variant="secondary" disabled={busy || position === c.index} onClick={() => onChoose({ index: position })}>
            Use position {position + 1}
          </Button>
        </div>
      )}
      {canChoose && <p className="text-xs text-slate-600 dark:text-slate-400">Clicking a lambda on the path or cross-validation chart chooses it too. The choice is stored with this version.</p>}
      {error && <Notice tone="error">{error.message}</Notice>}
    </section>
  );
}
