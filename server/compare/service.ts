/** GET .../comparisons?fits=ID,ID,...: loads each fit (404 for any not in this workspace) and compares them. */
import { MAX_COMPARE, MIN_COMPARE, type ComparisonDto } from '../../shared/compare';
import type { FitDetailDto, FitResultsDto } from '../../shared/fits';
import type { AppContext } from '../context';
import { getFitDetail } from '../fits/service/detail';
import { badRequest, conflict } from '../http/errors';
import { compareFits } from './compare';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function parseFitIds(raw: unknown): string[] {
  if (typeof raw !== 'string' || raw.trim() === '') throw badRequest(`fits: name ${MIN_COMPARE} to ${MAX_COMPARE} fit ids separated by commas.`, 'fits');
  const ids = raw.split(',').map((s) => s.trim());
  const bad = ids.find((id) => !UUID.test(id));
  if (bad !== undefined) throw badRequest(`fits: "${bad.slice(0, 60)}" is not a fit id.`, 'fits');
  if (new Set(ids).size !== ids.length) throw badRequest('fits: a fit is named twice.', 'fits');
  if (ids.length < MIN_COMPARE || ids.length > MAX_COMPARE) throw badRequest(`fits: compare ${MIN_COMPARE} to ${MAX_COMPARE} fits (got ${ids.length}).`, 'fits');
  return ids;
}

export async function getComparison(ctx: AppContext, workspaceId: string, query: Record<string, unknown>): Promise<ComparisonDto> {
  const ids = parseFitIds(query.fits);
  const details: FitDetailDto[] = [];
  for (const id of ids) details.push(await getFitDetail(ctx.db, workspaceId, id));
  const unfinished = details.find((f) => f.status !== 'finished' || !f.results);
  if (unfinished) throw conflict(`${unfinished.modelName} version ${unfinished.version} is ${unfinished.status}: only finished fits can be compared.`, 'fits');
  const first = details[0];
  const odd = details.find((f) => f.outcome !== first.outcome || f.family !== first.family);
  if (odd) throw badRequest(`fits: ${odd.modelName} predicts "${odd.outcome}" (${odd.family}), ${first.modelName} predicts "${first.outcome}" (${first.family}); compare fits of the same outcome.`, 'fits');
  return compareFits(details as (FitDetailDto & { results: FitResultsDto })[]);
}
