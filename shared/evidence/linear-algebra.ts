/**
 * The small dense linear algebra the fits need: symmetric positive-definite systems of a few
 * dozen unknowns at most (normal equations of polynomial baselines, AFM level fits and the
 * damped Levenberg–Marquardt step). Matrices are row-major `number[][]`.
 */

/**
 * Cholesky factor L (lower triangular, A = L·Lᵀ) of a symmetric positive-definite matrix, or null
 * when A is not positive definite to working precision.
 */
export function choleskyFactor(a: readonly (readonly number[])[]): number[][] | null {
  const n = a.length;
  const l = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i += 1) {
    for (let j = 0; j <= i; j += 1) {
      let sum = a[i][j];
      for (let k = 0; k < j; k += 1) sum -= l[i][k] * l[j][k];
      if (i === j) {
        if (!(sum > 0)) return null;
        l[i][i] = Math.sqrt(sum);
      } else {
        l[i][j] = sum / l[j][j];
      }
    }
  }
  return l;
}

/** Solves L·Lᵀ·x = b for a Cholesky factor from `choleskyFactor`. */
export function choleskySolve(l: readonly (readonly number[])[], b: readonly number[]): number[] {
  const n = l.length;
  const y = new Array<number>(n);
  for (let i = 0; i < n; i += 1) {
    let sum = b[i];
    for (let k = 0; k < i; k += 1) sum -= l[i][k] * y[k];
    y[i] = sum / l[i][i];
  }
  const x = new Array<number>(n);
  for (let i = n - 1; i >= 0; i -= 1) {
    let sum = y[i];
    for (let k = i + 1; k < n; k += 1) sum -= l[k][i] * x[k];
    x[i] = sum / l[i][i];
  }
  return x;
}

/** Solves A·x = b for symmetric positive-definite A; null when A is singular or not positive definite. */
export function solveSymmetric(a: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const l = choleskyFactor(a);
  return l ? choleskySolve(l, b) : null;
}

/** Diagonal of A⁻¹ for symmetric positive-definite A (variances from a covariance matrix); null if singular. */
export function inverseDiagonal(a: readonly (readonly number[])[]): number[] | null {
  const l = choleskyFactor(a);
  if (!l) return null;
  const n = a.length;
  return Array.from({ length: n }, (_, i) => {
    const unit = new Array<number>(n).fill(0);
    unit[i] = 1;
    return choleskySolve(l, unit)[i];
  });
}

/**
 * Least-squares coefficients c minimising Σ wᵢ (yᵢ − Σⱼ cⱼ·basis(i)ⱼ)² through the normal equations,
 * null when the basis columns are linearly dependent on the data.
 */
export function linearLeastSquares(
  rowCount: number,
  columnCount: number,
  basis: (row: number, out: number[]) => void,
  y: ArrayLike<number>,
  weight?: (row: number) => number,
): number[] | null {
  const normal = Array.from({ length: columnCount }, () => new Array<number>(columnCount).fill(0));
  const rhs = new Array<number>(columnCount).fill(0);
  const row = new Array<number>(columnCount).fill(0);
  for (let i = 0; i < rowCount; i += 1) {
    const w = weight ? weight(i) : 1;
    if (w === 0) continue;
    basis(i, row);
    for (let j = 0; j < columnCount; j += 1) {
      const wj = w * row[j];
      rhs[j] += wj * y[i];
      for (let k = 0; k <= j; k += 1) normal[j][k] += wj * row[k];
    }
  }
  for (let j = 0; j < columnCount; j += 1) for (let k = 0; k < j; k += 1) normal[k][j] = normal[j][k];
  return solveSymmetric(normal, rhs);
}
