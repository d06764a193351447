/**
 * Small statistics shared by sweeps (docs/cli.md) and run statistics (§9): means,
 * nearest-rank percentiles and the Wilson score interval. It lives in session/ so that the
 * run summary, sweeps and reports can all import it without breaking the layer rule.
 */

/** The two-sided 95 % quantile of the standard normal distribution. */
export const Z95 = 1.959963984540054;

/** A proportion with its 95 % score interval. */
export interface Proportion {
  readonly value: number;
  readonly low95: number;
  readonly high95: number;
}

/**
 * The Wilson score interval for `k` successes in `n` trials (E. B. Wilson, JASA 22 (1927)
 * 209). Unlike the normal approximation it stays inside [0, 1] and is sound when k is 0 or
 * n, which is what rare failures look like. Null when there are no trials.
 */
export function wilsonInterval(k: number, n: number, z: number = Z95): Proportion | null {
  if (n <= 0) return null;
  const p = k / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z / denom) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  // at k = 0 and k = n the bound is exactly 0 or 1; rounding would leave ±1e-18 there
  const low = k === 0 ? 0 : Math.max(0, centre - half);
  const high = k === n ? 1 : Math.min(1, centre + half);
  return { value: p, low95: low, high95: high };
}

/**
 * The nearest-rank percentile of an ascending list: the value at rank ⌈p·n/100⌉ (rank 1 for
 * p = 0). Always one of the values, never an interpolation. Undefined for an empty list.
 */
export function nearestRank(sorted: ArrayLike<number>, p: number): number | undefined {
  if (sorted.length === 0) return undefined;
  const rank = Math.max(1, Math.ceil((p * sorted.length) / 100));
  return sorted[Math.min(rank, sorted.length) - 1];
}

/** The arithmetic mean, summed in the given order (so equal lists give equal bits); undefined when empty. */
export function mean(values: ArrayLike<number>): number | undefined {
  if (values.length === 0) return undefined;
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  return sum / values.length;
}

/** Mean and the 5th, 50th and 95th nearest-rank percentiles; every figure null for an empty list. */
export interface Spread {
  readonly mean: number | null;
  readonly p5: number | null;
  readonly p50: number | null;
  readonly p95: number | null;
}

/** The spread of a list of values (in any order). */
export function spread(values: readonly number[]): Spread {
  const sorted = [...values].sort((a, b) => a - b);
  return {
    mean: mean(values) ?? null,
    p5: nearestRank(sorted, 5) ?? null,
    p50: nearestRank(sorted, 50) ?? null,
    p95: nearestRank(sorted, 95) ?? null,
  };
}
