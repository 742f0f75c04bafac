/** Straight-line least squares over x[i0..i1] (inclusive), with the slope's standard error. */
export interface LineFit {
  slope: number;
  intercept: number;
  slopeStdError: number;
  points: number;
}

export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, i0 = 0, i1 = x.length - 1, weights?: ArrayLike<number>): LineFit {
  const n = i1 - i0 + 1;
  if (n < 2) throw new Error('A line fit needs at least two points.');
  let sw = 0, sx = 0, sy = 0;
  for (let i = i0; i <= i1; i++) {
    const w = weights ? weights[i] : 1;
    sw += w;
    sx += w * x[i];
    sy += w * y[i];
  }
  const mx = sx / sw, my = sy / sw;
  let sxx = 0, sxy = 0;
  for (let i = i0; i <= i1; i++) {
    const w = weights ? weights[i] : 1;
    const dx = x[i] - mx;
    sxx += w * dx * dx;
    sxy += w * dx * (y[i] - my);
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let rss = 0;
  for (let i = i0; i <= i1; i++) {
    const w = weights ? weights[i] : 1;
    const r = y[i] - intercept - slope * x[i];
    rss += w * r * r;
  }
  const slopeStdError = n > 2 ? Math.sqrt(rss / (n - 2) / sxx) : NaN;
  return { slope, intercept, slopeStdError, points: n };
}
