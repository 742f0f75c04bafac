/**
 * A straight line y = a + b·x by weighted least squares with the parameter
 * covariance. With point errors the weights are 1/σ² and the covariance is
 * scaled up by χ²/ν when the scatter exceeds the errors (the Birge ratio,
 * common practice); without errors it comes from the residual scatter; with
 * two error-free points there is none. Errors in x, where given, are carried
 * by the effective-variance method: σ²_eff = σ_y² + b²·σ_x², refitted until
 * the slope settles (common practice; J. Orear, Am. J. Phys. 50, 912 (1982),
 * FROM MEMORY).
 */
export interface LineFit {
  intercept: number;
  slope: number;
  /** Variances and covariance of (intercept, slope); null when nothing bounds them. */
  covariance: { aa: number; ab: number; bb: number } | null;
  residuals: number[];
  /** Σ((y − fit)/σ)², only with point errors. */
  chiSquared: number | null;
  degreesOfFreedom: number;
  errorMethod: 'point-errors' | 'scatter' | 'none';
}

export function fitWeightedLine(
  x: readonly number[], y: readonly number[], sigma: readonly (number | null)[] | null, sigmaX: readonly (number | null)[] | null = null,
): LineFit {
  const n = x.length;
  if (n < 2 || y.length !== n) throw new Error('A line needs at least two points with x and y.');
  const weighted = sigma !== null && sigma.length === n && sigma.every((s) => s !== null && s > 0);
  let fit = fitOnce(x, y, weighted ? sigma!.map((s) => s as number) : null);
  const xErrors = weighted && sigmaX !== null && sigmaX.length === n && sigmaX.some((s) => s !== null && s > 0);
  for (let iteration = 0; xErrors && iteration < 5; iteration++) {
    const slope = fit.slope;
    const effective = sigma!.map((s, i) => Math.sqrt((s as number) ** 2 + (slope * (sigmaX![i] ?? 0)) ** 2));
    fit = fitOnce(x, y, effective);
    if (Math.abs(fit.slope - slope) <= 1e-12 * Math.abs(slope)) break;
  }
  return fit;
}

function fitOnce(x: readonly number[], y: readonly number[], sigma: readonly number[] | null): LineFit {
  const n = x.length;
  const weighted = sigma !== null;
  const w = x.map((_, i) => (weighted ? 1 / sigma[i] ** 2 : 1));
  let sw = 0, swx = 0, swy = 0;
  for (let i = 0; i < n; i++) (sw += w[i]), (swx += w[i] * x[i]), (swy += w[i] * y[i]);
  const xBar = swx / sw, yBar = swy / sw;
  let sxx = 0, sxy = 0;
  for (let i = 0; i < n; i++) (sxx += w[i] * (x[i] - xBar) ** 2), (sxy += w[i] * (x[i] - xBar) * (y[i] - yBar));
  if (!(sxx > 0)) throw new Error('A line needs at least two distinct x values.');
  const slope = sxy / sxx;
  const intercept = yBar - slope * xBar;
  const residuals = y.map((yi, i) => yi - (intercept + slope * x[i]));
  const sumSq = residuals.reduce((s, r, i) => s + w[i] * r * r, 0);
  const dof = n - 2;
  const scale = weighted ? (dof > 0 ? Math.max(1, sumSq / dof) : 1) : dof > 0 ? sumSq / dof : null;
  const covariance = scale === null ? null : { aa: scale * (1 / sw + (xBar * xBar) / sxx), ab: (-scale * xBar) / sxx, bb: scale / sxx };
  return {
    intercept, slope, covariance, residuals, chiSquared: weighted ? sumSq : null, degreesOfFreedom: dof,
    errorMethod: weighted ? 'point-errors' : scale === null ? 'none' : 'scatter',
  };
}

/** The line's value at x with its standard error (null when the fit has none). */
export function lineAt(fit: LineFit, x: number): { value: number; stdError: number | null } {
  const c = fit.covariance;
  return { value: fit.intercept + fit.slope * x, stdError: c ? Math.sqrt(Math.max(0, c.aa + 2 * x * c.ab + x * x * c.bb)) : null };
}
