/**
 * The loss registry: family and form -> the loss role (role.ts). Adding a family is one file beside
 * these and one line here (docs/decisions/0013-loss-role.md).
 */
import type { Family } from '../../types';
import type { Problem } from '../problem';
import { binomialLoss } from './binomial';
import { gaussianLoss } from './gaussian';
import type { LossRole } from './role';

const FAMILIES: Record<Family, (problem: Problem, form: 'design' | 'gram') => LossRole> = {
  gaussian: gaussianLoss,
  binomial: (problem) => binomialLoss(problem),
};

/** Families with a Gram form (a quadratic loss: its gradient is G b - c). */
export const GRAM_FAMILIES: ReadonlySet<Family> = new Set(['gaussian']);

export function lossFor(problem: Problem, form: 'design' | 'gram'): LossRole {
  return FAMILIES[problem.family](problem, form);
}

export type { BoundLoss, DualProjection, DualResidual, Evaluation, LossRole, NullFit, ResidualPoint, SupportMemory, SupportProblem } from './role';
export { FREE } from './role';
export { RESPONSE_RULES, type ResponseRules } from './responses';
