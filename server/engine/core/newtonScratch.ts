/**
 * The Newton loop's buffers and what it keeps between solves on one problem (polishNewton.ts).
 */

/** The last Hessian built, kept for the polish's next round (NewtonScratch.last). */
export interface KeptHessian {
  hessian: Float64Array;
  features: Int32Array;
  weight: Float64Array;
  /** Relative Newton decrement at the point it was built: how far that point was from the answer. */
  decrement: number;
  /** The solve that built it (NewtonScratch.solves). */
  solve: number;
}

/**
 * Buffers of length n (and m n for the weighted columns) reused by every Newton solve on one
 * problem. Information passes from one call to the next only as: the last solution with its image,
 * residual, weights and loss (`solution`, `eta`, `residual`, `weight`, `loss`), which the loss's
 * negativeGradient reads and a next round that only added columns resumes from; and the last
 * Hessian with the weights it was built from (`last`), which that round borders with the new
 * columns instead of rebuilding (see newtonOnSupport).
 */
export class NewtonScratch {
  eta: Float64Array;
  trialEta: Float64Array;
  residual: Float64Array;
  trialResidual: Float64Array;
  weight: Float64Array;
  trialWeight: Float64Array;
  direction: Float64Array;
  weighted = new Float64Array(0);
  /**
   * The working vector (coefficients, intercept) of the last successful solve and its features
   * (empty when the last solve failed; typed arrays from the start keep the object's shape stable).
   */
  solution: Float64Array = new Float64Array(0);
  features: Int32Array = new Int32Array(0);
  /**
   * Told the image, residual mu - y and mean loss of an accepted ending step, whose image is exactly
   * the working set's (designImage): the loss keeps them for the gap check at the same point.
   */
  exact: ((eta: Float64Array, residual: Float64Array, loss: number) => void) | null = null;
  /** The mean loss at `solution` (whose image, residual and weights are in eta, residual, weight). */
  loss = NaN;
  /** The last Hessian built (without the ridge; intercept last), its columns, weights and decrement. */
  last: KeptHessian = { hessian: new Float64Array(0), features: new Int32Array(0), weight: new Float64Array(0), decrement: 0, solve: 0 };
  /** Solves started on this problem (numbers the solve that built `last`). */
  solves = 0;

  constructor(readonly n: number) {
    this.eta = new Float64Array(n);
    this.trialEta = new Float64Array(n);
    this.residual = new Float64Array(n);
    this.trialResidual = new Float64Array(n);
    this.weight = new Float64Array(n);
    this.trialWeight = new Float64Array(n);
    this.direction = new Float64Array(n);
  }

  weightedFor(columns: number): Float64Array {
    if (this.weighted.length < columns * this.n) this.weighted = new Float64Array(columns * this.n);
    return this.weighted;
  }

  /** Keeps a copy of a Hessian just built (no ridge), its columns and the weights it used. */
  remember(hessian: Float64Array, features: Int32Array, solve: number): void {
    const last = this.last;
    last.solve = solve;
    last.hessian = hessian.slice();
    last.features = features;
    if (last.weight.length !== this.n) last.weight = new Float64Array(this.n);
    last.weight.set(this.weight);
  }

  /** Swaps the trial buffers in after an accepted step. */
  accept(): void {
    [this.eta, this.trialEta] = [this.trialEta, this.eta];
    [this.residual, this.trialResidual] = [this.trialResidual, this.residual];
    [this.weight, this.trialWeight] = [this.trialWeight, this.weight];
  }
}
