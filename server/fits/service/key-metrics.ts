/** The numbers a version list shows for a fit, at its chosen lambda. */
import type { ChoiceRule, HoldoutMetricsDto } from '../../../shared/fits';
import type { FitKeyMetricsDto } from '../../../shared/models';
import type { FitStoredResults } from '../stored-types';

export function keyMetrics(r: FitStoredResults, index: number, rule: ChoiceRule, holdout: HoldoutMetricsDto | null): FitKeyMetricsDto {
  const main = holdout?.metrics.find((m) => m.name === 'rmse' || m.name === 'auc') ?? null;
  return {
    lambda: r.lambda[index],
    chosenRule: rule,
    nonzero: r.nonzero[index],
    devianceExplained: r.devianceExplained[index],
    cvError: r.cv ? r.cv.mean[index] : null,
    cvMetric: r.cv ? r.cv.metric : null,
    holdout: main,
  };
}
