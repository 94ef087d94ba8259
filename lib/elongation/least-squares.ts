export interface LineFit {
  slope: number;
  intercept: number;
  /** Coefficient of determination, 1 − SSres/SStot. */
  r2: number;
}

/**
 * Ordinary least-squares line y = slope·x + intercept. Sums are taken about the means, which
 * keeps gauge pressures in the thousands from swamping the differences that set the slope.
 * Callers guarantee at least two distinct x values.
 */
export function fitLine(xs: readonly number[], ys: readonly number[]): LineFit {
  const count = xs.length;
  let meanX = 0;
  let meanY = 0;
  for (let i = 0; i < count; i++) {
    meanX += xs[i]!;
    meanY += ys[i]!;
  }
  meanX /= count;
  meanY /= count;

  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < count; i++) {
    const dx = xs[i]! - meanX;
    const dy = ys[i]! - meanY;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;

  let ssRes = 0;
  for (let i = 0; i < count; i++) {
    const residual = ys[i]! - (slope * xs[i]! + intercept);
    ssRes += residual * residual;
  }
  // All y equal means the line explains everything there is to explain.
  const r2 = syy === 0 ? 1 : Math.max(0, 1 - ssRes / syy);
  return { slope, intercept, r2 };
}
