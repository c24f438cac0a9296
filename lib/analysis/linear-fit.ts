/** An ordinary least-squares line y = slope·x + intercept. */
export interface LinearFit {
  /** Change in y per unit of x (units of y / units of x). */
  slope: number;
  /** y at x = 0 (units of y). */
  intercept: number;
  /**
   * Coefficient of determination, 1 − SSres/SStot (dimensionless). NaN when every usable y is the
   * same (SStot = 0): the line is then exact but R² is undefined.
   */
  r2: number;
  /** Pairs used: those where both x and y are finite. */
  n: number;
}

/**
 * Ordinary least-squares straight line through parallel x/y arrays, skipping missing pairs.
 *
 * Definition: the slope and intercept minimising Σ(yᵢ − slope·xᵢ − intercept)², i.e.
 * slope = Σ(xᵢ − x̄)(yᵢ − ȳ) / Σ(xᵢ − x̄)², intercept = ȳ − slope·x̄ (simple linear regression;
 * NIST/SEMATECH e-Handbook of Statistical Methods §4.1.4.1), and R² = 1 − SSres/SStot.
 * Computed in three passes over the inputs (means, centred sums, residuals), so large offsets do
 * not cost precision. simple-statistics' `linearRegression`/`rSquared` give the same numbers (the
 * tests hold them side by side) but need an array of `[x, y]` pairs: for a million-sample run
 * that array alone is ~100 MB of heap, so the pairs are never built here.
 *
 * A pair is skipped when either value is NaN (missing) or otherwise not finite.
 *
 * Cost: O(n) time, O(1) extra memory.
 *
 * @param x independent variable, any unit; NaN = missing
 * @param y dependent variable, any unit; NaN = missing; same length as `x`
 * @returns slope, intercept, R² and the number of pairs used
 * @throws {Error} when `x` and `y` differ in length
 * @throws {Error} when fewer than 2 pairs are usable
 * @throws {Error} when every usable x is the same (vertical line: slope undefined)
 * @example
 * linearFit([0, 1, 2, NaN], [1, 3, 5, 7]); // => { slope: 2, intercept: 1, r2: 1, n: 3 }
 */
export function linearFit(x: ArrayLike<number>, y: ArrayLike<number>): LinearFit {
  if (x.length !== y.length) throw new Error(`linearFit requires x and y of equal length (got ${x.length} and ${y.length})`);
  let n = 0;
  let sumX = 0;
  let sumY = 0;
  let xMin = Infinity;
  let xMax = -Infinity;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const yi = y[i];
    if (!Number.isFinite(xi) || !Number.isFinite(yi)) continue;
    n++;
    sumX += xi;
    sumY += yi;
    if (xi < xMin) xMin = xi;
    if (xi > xMax) xMax = xi;
  }
  if (n < 2) throw new Error(`linearFit requires at least 2 usable (finite) x/y pairs (got ${n})`);
  if (xMin === xMax) throw new Error("linearFit requires x to vary: every usable x is the same");

  const meanX = sumX / n;
  const meanY = sumY / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const yi = y[i];
    if (!Number.isFinite(xi) || !Number.isFinite(yi)) continue;
    const dx = xi - meanX;
    const dy = yi - meanY;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  let ssRes = 0;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const yi = y[i];
    if (!Number.isFinite(xi) || !Number.isFinite(yi)) continue;
    const r = yi - (slope * xi + intercept);
    ssRes += r * r;
  }
  return { slope, intercept, r2: syy === 0 ? NaN : 1 - ssRes / syy, n };
}
