import { SemidefiniteSolver } from './gram';

/**
 * A factored symmetric positive (semi-)definite system M x = b (m x m, row-major) for the logistic
 * Newton loop (polishNewton.ts): Jacobi scaling first (raw columns can differ in scale by many
 * orders, and the Cholesky pivot test is relative to the largest diagonal), then Cholesky; every
 * solve adds one step of iterative refinement (Higham 2002, "Accuracy and Stability of Numerical
 * Algorithms", ch. 12), which recovers the digits the factorization loses on nearly collinear
 * columns. Kept so that one factor serves several right-hand sides (the final Newton step, the path
 * tangent). The matrix is copied: the caller may reuse its buffer.
 */
export class SymmetricFactor {
  private readonly d: Float64Array;
  private readonly scaled: Float64Array;
  private readonly solver: SemidefiniteSolver;
  private readonly rhs: Float64Array;
  private readonly z: Float64Array;
  private readonly dz: Float64Array;

  constructor(
    matrix: Float64Array,
    private readonly m: number,
  ) {
    const d = new Float64Array(m);
    for (let q = 0; q < m; q++) {
      const diag = matrix[q * m + q];
      d[q] = diag > 0 ? 1 / Math.sqrt(diag) : 1;
    }
    const scaled = new Float64Array(m * m);
    for (let q = 0; q < m; q++) for (let r = 0; r < m; r++) scaled[q * m + r] = d[q] * matrix[q * m + r] * d[r];
    this.d = d;
    this.scaled = scaled;
    this.solver = new SemidefiniteSolver(scaled, m);
    this.rhs = new Float64Array(m);
    this.z = new Float64Array(m);
    this.dz = new Float64Array(m);
  }

  /** Writes the solution of M x = b into out; false on non-finite values. */
  solve(b: Float64Array, out: Float64Array): boolean {
    const { m, d, scaled, rhs, z, dz } = this;
    for (let q = 0; q < m; q++) rhs[q] = d[q] * b[q];
    this.solver.solve(rhs, z);
    // Refinement on the scaled system: r = D b - S z, S dz = r, z += dz (rhs is reused for r).
    for (let q = 0; q < m; q++) {
      let s = rhs[q];
      for (let r = 0; r < m; r++) s -= scaled[q * m + r] * z[r];
      rhs[q] = s;
    }
    this.solver.solve(rhs, dz);
    for (let q = 0; q < m; q++) {
      out[q] = d[q] * (z[q] + dz[q]);
      if (!Number.isFinite(out[q])) return false;
    }
    return true;
  }
}

/** Solves M x = b once (SymmetricFactor); false on non-finite values. */
export function solveSymmetric(matrix: Float64Array, m: number, b: Float64Array, out: Float64Array): boolean {
  return new SymmetricFactor(matrix, m).solve(b, out);
}
