/**
 * How to read a sparse regression result: shown wherever fits are displayed (the client's Cautions
 * component) and carried in every export of results (the CLI's `cautions`).
 * Sources for the cautions: Hastie, Tibshirani & Wainwright, "Statistical Learning with Sparsity"
 * (2015), ch. 6 (inference after selection); Berk et al., "Valid post-selection inference",
 * Annals of Statistics 41 (2013); Tibshirani & Tibshirani, "A bias correction for the minimum error
 * rate in cross-validation", Annals of Applied Statistics 3 (2009).
 */
export const CAUTIONS: readonly { id: string; title: string; text: string }[] = [
  {
    id: 'not-causal',
    title: 'Selected is not causal',
    text: 'A variable kept by the penalty helps predict the outcome in this data. That is not evidence that changing it would change the outcome.',
  },
  {
    id: 'p-values',
    title: 'Ordinary p-values are too optimistic after selection',
    text: 'The same data chose the variables, so standard errors and p-values computed as if the variables had been fixed in advance are too small.',
  },
  {
    id: 'shrunk',
    title: 'Coefficients are shrunk',
    text: 'The penalty pulls estimates toward zero, so coefficient sizes are biased; an unpenalized refit on the selected variables removes the shrinkage but not the selection effect.',
  },
  {
    id: 'cv-optimistic',
    title: 'The cross-validation error at the chosen penalty is optimistic',
    text: 'The penalty was picked because its error was lowest, so that error understates what to expect on new data. Judge the fit on data it has never seen.',
  },
  {
    id: 'decisions-about-people',
    title: 'Decisions about people need more than a model',
    text: 'Where a model informs decisions about people, such as health, credit or hiring, local rules and review by qualified people govern its use.',
  },
];

/** The cautions as plain sentences, for JSON and CSV exports. */
export const CAUTION_LINES: readonly string[] = CAUTIONS.map((c) => `${c.title}. ${c.text}`);
