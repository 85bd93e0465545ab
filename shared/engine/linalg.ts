/**
 * Small dense complex linear algebra for the influence-coefficient methods: least squares by modified
 * Gram-Schmidt on the augmented matrix (backward stable for least squares: A. Bjorck, Numerical Methods for
 * Least Squares Problems, SIAM 1996, section 2.4) and singular values by one-sided Jacobi rotations
 * (M. R. Hestenes 1958; J. Demmel and K. Veselic, SIAM J. Matrix Anal. Appl. 13 (1992)) on the real
 * embedding [[Re, -Im], [Im, Re]], whose singular values are those of the complex matrix, each twice.
 */

/** A complex matrix, row-major, real and imaginary parts apart. */
export interface ComplexMatrix {
  rows: number;
  cols: number;
  re: Float64Array;
  im: Float64Array;
}

/** A zero complex matrix of the given size. */
export function complexMatrix(rows: number, cols: number): ComplexMatrix {
  return { rows, cols, re: new Float64Array(rows * cols), im: new Float64Array(rows * cols) };
}

/** Thrown inside the engine when a matrix has (numerically) dependent columns; callers turn it into an EngineError. */
export class RankDeficient extends Error {
  constructor(readonly column: number) {
    super(`column ${column} depends on the others`);
  }
}

/**
 * Least-squares solution X of A X ~ B (A: m x n with m >= n, B: m x k), minimising ||A X - B||_F.
 * Exact when A is square and regular. Throws {@link RankDeficient} when a column of A lies (to within
 * `relTol` of its own length) in the span of the previous ones.
 */
export function leastSquares(a: ComplexMatrix, b: ComplexMatrix, relTol = 1e-12): ComplexMatrix {
  const m = a.rows;
  const n = a.cols;
  const k = b.cols;
  const qr = Float64Array.from(a.re);
  const qi = Float64Array.from(a.im);
  const br = Float64Array.from(b.re);
  const bi = Float64Array.from(b.im);
  const rr = new Float64Array(n * n);
  const ri = new Float64Array(n * n);
  const cr = new Float64Array(n * k);
  const ci = new Float64Array(n * k);
  for (let j = 0; j < n; j++) {
    let orig = 0;
    for (let r = 0; r < m; r++) orig += a.re[r * n + j]! ** 2 + a.im[r * n + j]! ** 2;
    let norm = 0;
    for (let r = 0; r < m; r++) norm += qr[r * n + j]! ** 2 + qi[r * n + j]! ** 2;
    norm = Math.sqrt(norm);
    if (!(norm > relTol * Math.sqrt(orig)) || norm === 0) throw new RankDeficient(j);
    rr[j * n + j] = norm;
    for (let r = 0; r < m; r++) {
      qr[r * n + j]! /= norm;
      qi[r * n + j]! /= norm;
    }
    for (let c = j + 1; c < n; c++) {
      // r_jc = q_j^H a_c
      let sr = 0;
      let si = 0;
      for (let r = 0; r < m; r++) {
        const xr = qr[r * n + j]!;
        const xi = qi[r * n + j]!;
        const yr = qr[r * n + c]!;
        const yi = qi[r * n + c]!;
        sr += xr * yr + xi * yi;
        si += xr * yi - xi * yr;
      }
      rr[j * n + c] = sr;
      ri[j * n + c] = si;
      for (let r = 0; r < m; r++) {
        const xr = qr[r * n + j]!;
        const xi = qi[r * n + j]!;
        qr[r * n + c]! -= sr * xr - si * xi;
        qi[r * n + c]! -= sr * xi + si * xr;
      }
    }
    for (let c = 0; c < k; c++) {
      let sr = 0;
      let si = 0;
      for (let r = 0; r < m; r++) {
        const xr = qr[r * n + j]!;
        const xi = qi[r * n + j]!;
        const yr = br[r * k + c]!;
        const yi = bi[r * k + c]!;
        sr += xr * yr + xi * yi;
        si += xr * yi - xi * yr;
      }
      cr[j * k + c] = sr;
      ci[j * k + c] = si;
      for (let r = 0; r < m; r++) {
        const xr = qr[r * n + j]!;
        const xi = qi[r * n + j]!;
        br[r * k + c]! -= sr * xr - si * xi;
        bi[r * k + c]! -= sr * xi + si * xr;
      }
    }
  }
  const x = complexMatrix(n, k);
  for (let c = 0; c < k; c++) {
    for (let j = n - 1; j >= 0; j--) {
      let sr = cr[j * k + c]!;
      let si = ci[j * k + c]!;
      for (let l = j + 1; l < n; l++) {
        const ar = rr[j * n + l]!;
        const ai = ri[j * n + l]!;
        const yr = x.re[l * k + c]!;
        const yi = x.im[l * k + c]!;
        sr -= ar * yr - ai * yi;
        si -= ar * yi + ai * yr;
      }
      const d = rr[j * n + j]!;
      x.re[j * k + c] = sr / d;
      x.im[j * k + c] = si / d;
    }
  }
  return x;
}

/** Singular values of a complex m x n matrix (m >= n), largest first. */
export function singularValues(a: ComplexMatrix): Float64Array {
  const m = a.rows;
  const n = a.cols;
  const p = 2 * m;
  const q = 2 * n;
  // Column-major real embedding, so that one-sided rotations touch contiguous memory.
  const col = new Float64Array(p * q);
  for (let r = 0; r < m; r++) {
    for (let c = 0; c < n; c++) {
      const xr = a.re[r * n + c]!;
      const xi = a.im[r * n + c]!;
      col[c * p + r] = xr;
      col[c * p + r + m] = xi;
      col[(c + n) * p + r] = -xi;
      col[(c + n) * p + r + m] = xr;
    }
  }
  const eps = 1e-15;
  for (let sweep = 0; sweep < 60; sweep++) {
    let rotated = false;
    for (let i = 0; i < q - 1; i++) {
      for (let j = i + 1; j < q; j++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let r = 0; r < p; r++) {
          const u = col[i * p + r]!;
          const v = col[j * p + r]!;
          alpha += u * u;
          beta += v * v;
          gamma += u * v;
        }
        if (gamma === 0 || Math.abs(gamma) <= eps * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let r = 0; r < p; r++) {
          const u = col[i * p + r]!;
          const v = col[j * p + r]!;
          col[i * p + r] = c * u - s * v;
          col[j * p + r] = s * u + c * v;
        }
      }
    }
    if (!rotated) break;
  }
  const all = new Float64Array(q);
  for (let c = 0; c < q; c++) {
    let s = 0;
    for (let r = 0; r < p; r++) s += col[c * p + r]! ** 2;
    all[c] = Math.sqrt(s);
  }
  all.sort().reverse();
  const out = new Float64Array(n);
  for (let c = 0; c < n; c++) out[c] = all[2 * c]!;
  return out;
}

/** 2-norm condition number sigma_max / sigma_min; Infinity when sigma_min is 0. */
export function conditionNumber(a: ComplexMatrix): number {
  const s = singularValues(a);
  const max = s[0]!;
  const min = s[s.length - 1]!;
  if (max === 0) return Infinity;
  return min === 0 ? Infinity : max / min;
}
