/**
 * Natural cubic spline through (x, y) points with x strictly increasing:
 * continuous value, first and second derivative, so forces taken from a
 * tabulated potential's derivative are smooth. Outside the table the end
 * segments' cubics are not extrapolated: callers stop at the cut-off.
 */
export class CubicSpline {
  private readonly x: Float64Array;
  private readonly y: Float64Array;
  /** Second derivatives at the knots. */
  private readonly m: Float64Array;

  constructor(xs: ArrayLike<number>, ys: ArrayLike<number>) {
    const n = xs.length;
    if (n < 2 || ys.length !== n) throw new Error('A spline needs at least two (x, y) points of equal count.');
    this.x = Float64Array.from(xs);
    this.y = Float64Array.from(ys);
    this.m = new Float64Array(n);
    if (n === 2) return;
    // Tridiagonal system for the interior second derivatives (natural ends: m = 0).
    const c = new Float64Array(n), d = new Float64Array(n);
    for (let i = 1; i < n - 1; i++) {
      const h0 = this.x[i] - this.x[i - 1], h1 = this.x[i + 1] - this.x[i];
      const a = h0 / 6, b = (h0 + h1) / 3, cc = h1 / 6;
      const rhs = (this.y[i + 1] - this.y[i]) / h1 - (this.y[i] - this.y[i - 1]) / h0;
      const denom = b - a * c[i - 1];
      c[i] = cc / denom;
      d[i] = (rhs - a * d[i - 1]) / denom;
    }
    for (let i = n - 2; i >= 1; i--) this.m[i] = d[i] - c[i] * this.m[i + 1];
  }

  get first(): number {
    return this.x[0];
  }

  get last(): number {
    return this.x[this.x.length - 1];
  }

  /** Index of the segment [x_k, x_{k+1}] holding t (clamped to the ends). */
  private segment(t: number): number {
    const x = this.x;
    let lo = 0, hi = x.length - 2;
    if (t <= x[0]) return 0;
    if (t >= x[hi]) return hi;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (x[mid] <= t) lo = mid;
      else hi = mid;
    }
    return lo;
  }

  /** Writes value into out[0] and first derivative into out[1]. */
  evaluate(t: number, out: Float64Array): void {
    const k = this.segment(t);
    const x0 = this.x[k], h = this.x[k + 1] - x0;
    const a = (this.x[k + 1] - t) / h, b = (t - x0) / h;
    const m0 = this.m[k], m1 = this.m[k + 1];
    const y0 = this.y[k], y1 = this.y[k + 1];
    out[0] = a * y0 + b * y1 + ((a * a * a - a) * m0 + (b * b * b - b) * m1) * (h * h) / 6;
    out[1] = (y1 - y0) / h + ((1 - 3 * a * a) * m0 + (3 * b * b - 1) * m1) * h / 6;
  }
}
