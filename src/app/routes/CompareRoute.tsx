/** The compare page (reviews feature) with the fits feature's coefficient-path chart: features don't import each other, so the app composes them. */
import type { FitDetailDto } from '@shared/fits';
import { PathChart } from '@/features/fits/charts/PathChart';
import { ComparePage } from '@/features/reviews/components/ComparePage';

function renderPaths(fit: FitDetailDto) {
  const r = fit.results;
  if (!r) return null;
  return <PathChart lambda={r.lambda} coefficients={r.coefficients} standardizedCoefficients={r.standardizedCoefficients} terms={r.terms} chosenIndex={r.chosen.index} />;
}

export function CompareRoute() {
  return <ComparePage renderPaths={renderPaths} />;
}
