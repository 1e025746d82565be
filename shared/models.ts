/**
 * Models: a named modelling question in a workspace (dataset, outcome, family). Its fits are the
 * versions 1, 2, ... (shared/fits.ts). One source for the client's forms and the Express handlers.
 */
import { z } from 'zod';
import type { UserRef } from './datasets';
import type { FitSpec, FitStatus, FitSummaryDto, SpecChangeDto } from './fits';

export const MODEL_NAME_MAX = 120;
export const MODEL_DESCRIPTION_MAX = 2000;
/** Column names are stored as given in the file; this bounds what a request may carry. */
export const COLUMN_NAME_MAX = 500;

export const FAMILIES = ['gaussian', 'binomial'] as const;
export type FitFamily = (typeof FAMILIES)[number];
export const FAMILY_LABELS: Record<FitFamily, string> = {
  gaussian: 'Number (least squares)',
  binomial: 'Yes/no (logistic)',
};

export const familySchema = z.enum(FAMILIES, { error: () => `Choose one of: ${FAMILIES.join(', ')}.` });
export const columnNameSchema = z
  .string({ error: 'Name a column.' })
  .min(1, 'Name a column.')
  .max(COLUMN_NAME_MAX, `A column name has at most ${COLUMN_NAME_MAX} characters.`);

/** POST /api/workspaces/:workspaceId/models */
export const createModelSchema = z.strictObject({
  name: z
    .string({ error: 'Give the model a name.' })
    .trim()
    .min(1, 'Give the model a name.')
    .max(MODEL_NAME_MAX, `A model name has at most ${MODEL_NAME_MAX} characters.`),
  description: z.string().trim().max(MODEL_DESCRIPTION_MAX, `At most ${MODEL_DESCRIPTION_MAX} characters.`).default(''),
  datasetId: z.uuid('datasetId must be a dataset id'),
  outcome: columnNameSchema,
  family: familySchema,
});
export type CreateModelInput = z.input<typeof createModelSchema>;

/** Key numbers of one fit, shown side by side in the model's version list. */
export interface FitKeyMetricsDto {
  /** Chosen lambda (null until the fit finished). */
  lambda: number | null;
  chosenRule: 'minimum' | 'one-standard-error' | 'manual' | 'last' | null;
  nonzero: number | null;
  devianceExplained: number | null;
  /** Cross-validation error at the chosen lambda (metric named by cvMetric); null without CV. */
  cvError: number | null;
  cvMetric: string | null;
  /** Holdout metric (gaussian RMSE, binomial AUC) when a holdout split was made. */
  holdout: { name: string; value: number } | null;
}

/** GET /api/workspaces/:workspaceId/models (one row per model) */
export interface ModelListItemDto {
  id: string;
  name: string;
  description: string;
  datasetId: string;
  datasetName: string;
  outcome: string;
  family: FitFamily;
  createdBy: UserRef;
  createdAt: string;
  versionCount: number;
  /** The latest fit (highest version number), or null before the first run. */
  latest: { id: string; version: number; status: FitStatus; createdAt: string; unconverged: boolean } | null;
}

/** GET /api/workspaces/:workspaceId/models/:modelId */
export interface ModelDetailDto extends ModelListItemDto {
  /** Newest first; each with its spec and what changed against the version before it (null for version 1). */
  versions: (FitSummaryDto & { metrics: FitKeyMetricsDto; spec: FitSpec; specChanges: SpecChangeDto[] | null })[];
}
