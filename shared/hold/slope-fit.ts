/** Least-squares straight line through (x, y) pairs, with the standard error of its slope. */
export interface SlopeFit {
  slope: number;
  intercept: number;
  n: number;
  /** Standard error of the slope, √(SSE / (n − 2) / Sxx); null with fewer than three points. */
  slopeStandardError: number | null;
}

/**
 * Ordinary least squares over `n` pairs read through accessors, so that a window of a long series is
 * fitted in place without copying (the hold rules run on every new sample). Centred sums keep the
 * result accurate when x is large compared with its spread. Null when the x values do not differ.
 */
export function fitSlope(n: number, x: (i: number) => number, y: (i: number) => number): SlopeFit | null {
  if (n < 2) return null;
  let meanX = 0;
  let meanY = 0;
  for (let i = 0; i < n; i++) {
    meanX += x(i);
    meanY += y(i);
  }
  meanX /= n;
  meanY /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x(i) - meanX;
    sxx += dx * dx;
    sxy += dx * (y(i) - meanY);
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  if (n < 3) return { slope, intercept, n, slopeStandardError: null };
  let sse = 0;
  for (let i = 0; i < n; i++) sse += (y(i) - intercept - slope * x(i)) ** 2;
  return { slope, intercept, n, slopeStandardError: Math.sqrt(sse / (n - 2) / sxx) };
}
