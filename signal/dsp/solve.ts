/** Small dense least squares through the normal equations and a Cholesky factorisation. */

/**
 * Solves (A + ridge·I)·x = b for a symmetric positive semi-definite A (row-major, size m×m), in place of b.
 * Returns false when the system is singular.
 */
export function choleskySolve(a: Float64Array, b: Float64Array, m: number, ridge = 1e-12): boolean {
  const l = new Float64Array(m * m);
  let scale = 0;
  for (let i = 0; i < m; i++) scale = Math.max(scale, a[i * m + i]);
  const eps = ridge * (scale || 1);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * m + j] + (i === j ? eps : 0);
      for (let k = 0; k < j; k++) s -= l[i * m + k] * l[j * m + k];
      if (i === j) {
        if (!(s > 0)) return false;
        l[i * m + i] = Math.sqrt(s);
      } else {
        l[i * m + j] = s / l[j * m + j];
      }
    }
  }
  for (let i = 0; i < m; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= l[i * m + k] * b[k];
    b[i] = s / l[i * m + i];
  }
  for (let i = m - 1; i >= 0; i--) {
    let s = b[i];
    for (let k = i + 1; k < m; k++) s -= l[k * m + i] * b[k];
    b[i] = s / l[i * m + i];
  }
  return true;
}

/** Accumulates XᵀX and Xᵀy from sparse rows: each row lists (column, value) pairs. */
export class NormalEquations {
  readonly m: number;
  readonly xtx: Float64Array;
  readonly xty: Float64Array;
  yy = 0;
  rows = 0;

  constructor(m: number) {
    this.m = m;
    this.xtx = new Float64Array(m * m);
    this.xty = new Float64Array(m);
  }

  /** Adds one row; `cols` and `vals` are read up to `count`. */
  add(cols: Int32Array, vals: Float64Array, count: number, y: number): void {
    const m = this.m;
    for (let p = 0; p < count; p++) {
      const ci = cols[p];
      const vi = vals[p];
      this.xty[ci] += vi * y;
      for (let q = 0; q < count; q++) this.xtx[ci * m + cols[q]] += vi * vals[q];
    }
    this.yy += y * y;
    this.rows++;
  }

  /** Solves for the coefficients; returns them with the residual sum of squares, or null when singular. */
  solve(): { coef: Float64Array; rss: number } | null {
    const coef = Float64Array.from(this.xty);
    if (!choleskySolve(Float64Array.from(this.xtx), coef, this.m)) return null;
    let fit = 0;
    for (let i = 0; i < this.m; i++) fit += coef[i] * this.xty[i];
    return { coef, rss: Math.max(0, this.yy - fit) };
  }
}
