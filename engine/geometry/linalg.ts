/**
 * The small dense linear algebra the geometry needs, written here rather than taking
 * ml-matrix into the app bundle (it is a devDependency only): a one-sided Jacobi SVD
 * (Hestenes) that works on A itself, so the squared condition number of AᵀA never appears.
 * tests/unit/geometry/linalg.test.ts checks it against ml-matrix's SVD.
 */

/** Singular values (descending) and right singular vectors as columns of v (n × n, row-major). */
export interface RightSvd {
  values: Float64Array;
  /** v[i * n + k] is component i of the k-th right singular vector (k by descending value). */
  v: Float64Array;
  n: number;
}

/**
 * Right singular vectors of the m × n row-major matrix a (a is not changed).
 * `rightSvd(new Float64Array([3, 0, 0, 4]), 2, 2).values -> [4, 3]`
 */
export function rightSvd(a: ArrayLike<number>, m: number, n: number, maxSweeps = 60): RightSvd {
  // Work on columns: u holds A·V as it turns; its column norms end as the singular values.
  const u = Float64Array.from(a as ArrayLike<number>);
  const v = new Float64Array(n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  const eps = 1e-15;
  for (let sweep = 0; sweep < maxSweeps; sweep++) {
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let r = 0; r < m; r++) {
          const up = u[r * n + p];
          const uq = u[r * n + q];
          alpha += up * up;
          beta += uq * uq;
          gamma += up * uq;
        }
        if (gamma === 0 || Math.abs(gamma) <= eps * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let r = 0; r < m; r++) {
          const up = u[r * n + p];
          const uq = u[r * n + q];
          u[r * n + p] = c * up - s * uq;
          u[r * n + q] = s * up + c * uq;
        }
        for (let r = 0; r < n; r++) {
          const vp = v[r * n + p];
          const vq = v[r * n + q];
          v[r * n + p] = c * vp - s * vq;
          v[r * n + q] = s * vp + c * vq;
        }
      }
    }
    if (!rotated) break;
  }
  const norms = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let s = 0;
    for (let r = 0; r < m; r++) s += u[r * n + k] ** 2;
    norms[k] = Math.sqrt(s);
  }
  const order = Array.from({ length: n }, (_, k) => k).sort((i, j) => norms[j] - norms[i]);
  const values = new Float64Array(n);
  const vs = new Float64Array(n * n);
  order.forEach((k, col) => {
    values[col] = norms[k];
    for (let r = 0; r < n; r++) vs[r * n + col] = v[r * n + k];
  });
  return { values, v: vs, n };
}

/**
 * Solves the n × n system m·x = b by Gaussian elimination with partial pivoting; null when
 * m is singular. m and b are not changed.
 * `solveLinear([2, 0, 0, 4], [2, 8], 2) -> [1, 2]`
 */
export function solveLinear(m: ArrayLike<number>, b: ArrayLike<number>, n: number): number[] | null {
  const a = Array.from({ length: n }, (_, r) => [...Array.from({ length: n }, (_, c) => m[r * n + c]), b[r]]);
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r][col]) > Math.abs(a[piv][col])) piv = r;
    if (!(Math.abs(a[piv][col]) > 1e-300)) return null;
    [a[col], a[piv]] = [a[piv], a[col]];
    for (let r = col + 1; r < n; r++) {
      const f = a[r][col] / a[col][col];
      if (f !== 0) for (let c = col; c <= n; c++) a[r][c] -= f * a[col][c];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = a[r][n];
    for (let c = r + 1; c < n; c++) s -= a[r][c] * x[c];
    x[r] = s / a[r][r];
  }
  return x;
}
