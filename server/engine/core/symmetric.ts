import { SemidefiniteSolver } from './gram';

/**
 * Solves the symmetric positive (semi-)definite system M x = b (m x m, row-major) for the active-set
 * polish: Jacobi scaling first (raw columns can differ in scale by many orders, and the Cholesky
 * pivot test is relative to the largest diagonal), then Cholesky, then one step of iterative
 * refinement (Higham 2002, "Accuracy and Stability of Numerical Algorithms", ch. 12), which recovers
 * the digits the factorization loses on nearly collinear columns. Returns false on non-finite values.
 */
export function solveSymmetric(matrix: Float64Array, m: number, b: Float64Array, out: Float64Array): boolean {
  const d = new Float64Array(m);
  for (let q = 0; q < m; q++) {
    const diag = matrix[q * m + q];
    d[q] = diag > 0 ? 1 / Math.sqrt(diag) : 1;
  }
  const scaled = new Float64Array(m * m);
  for (let q = 0; q < m; q++) for (let r = 0; r < m; r++) scaled[q * m + r] = d[q] * matrix[q * m + r] * d[r];
  const solver = new SemidefiniteSolver(scaled, m);
  const rhs = new Float64Array(m);
  for (let q = 0; q < m; q++) rhs[q] = d[q] * b[q];
  const z = new Float64Array(m);
  solver.solve(rhs, z);
  // Refinement on the scaled system: r = D b - S z, S dz = r, z += dz.
  const residual = new Float64Array(m);
  for (let q = 0; q < m; q++) {
    let s = rhs[q];
    for (let r = 0; r < m; r++) s -= scaled[q * m + r] * z[r];
    residual[q] = s;
  }
  const dz = new Float64Array(m);
  solver.solve(residual, dz);
  for (let q = 0; q < m; q++) {
    out[q] = d[q] * (z[q] + dz[q]);
    if (!Number.isFinite(out[q])) return false;
  }
  return true;
}
