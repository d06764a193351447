/** The statistics shared by sweeps and run statistics: Wilson score interval and nearest-rank percentiles. */
import { describe, expect, it } from 'vitest';
import { mean, nearestRank, spread, wilsonInterval, Z95 } from '../../src/session/stats.js';

describe('Wilson score interval', () => {
  // E. B. Wilson, "Probable inference, the law of succession, and statistical inference",
  // JASA 22 (1927) 209–212: for k successes in n trials, p̂ = k/n, the bounds are
  //   (p̂ + z²/2n ± z·√(p̂(1−p̂)/n + z²/4n²)) / (1 + z²/n).
  // Worked example: 3 failures in 250 runs at 95 % (z = 1.95996):
  //   p̂ = 0.012, z² = 3.84146, z²/n = 0.0153658, centre = (0.012 + 0.0076829) / 1.0153658 = 0.0193850,
  //   half = 1.95996 / 1.0153658 · √(0.012·0.988/250 + 3.84146/250000) = 1.930296 · √(6.27898e-5) = 0.0152956,
  //   so [0.004089, 0.034681] — the sweep file's documented example rounds it to 0.004 and 0.035.
  it('matches the worked example of 3 failures in 250 runs', () => {
    const r = wilsonInterval(3, 250)!;
    expect(r.value).toBe(0.012);
    expect(r.low95).toBeCloseTo(0.004089, 6);
    expect(r.high95).toBeCloseTo(0.034681, 6);
    expect(r.low95.toFixed(3)).toBe('0.004');
    expect(r.high95.toFixed(3)).toBe('0.035');
  });

  it('is computed from the formula for other counts too', () => {
    const z = 1.959963984540054;
    for (const [k, n] of [[1, 10], [17, 300], [50, 100], [999, 1000]] as const) {
      const p = k / n;
      const centre = (p + (z * z) / (2 * n)) / (1 + (z * z) / n);
      const half = (z / (1 + (z * z) / n)) * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n));
      const r = wilsonInterval(k, n)!;
      expect(r.low95).toBeCloseTo(centre - half, 12);
      expect(r.high95).toBeCloseTo(centre + half, 12);
    }
  });

  it('uses the 95 % normal quantile', () => {
    // Φ(1.959963984540054) = 0.975, common practice for a two-sided 95 % interval
    expect(Z95).toBe(1.959963984540054);
  });

  it('stays inside [0, 1] and is exact at the ends: no failures in 30 runs still leaves room up to 11.35 %', () => {
    const none = wilsonInterval(0, 30)!;
    expect(none.low95).toBe(0);
    // z²/(n + z²) is the upper bound when k = 0
    expect(none.high95).toBeCloseTo((Z95 * Z95) / (30 + Z95 * Z95), 12);
    expect(none.high95).toBeCloseTo(0.1135, 4);
    const all = wilsonInterval(30, 30)!;
    expect(all.high95).toBe(1);
    expect(all.low95).toBeCloseTo(30 / (30 + Z95 * Z95), 12);
  });

  it('is null with no trials', () => {
    expect(wilsonInterval(0, 0)).toBeNull();
  });
});

describe('nearest-rank percentiles', () => {
  it('take the value at rank ⌈p·n/100⌉ of the sorted list', () => {
    // the textbook example of the nearest-rank method: 15, 20, 35, 40, 50
    const xs = [15, 20, 35, 40, 50];
    expect(nearestRank(xs, 5)).toBe(15); // ⌈0.25⌉ = 1
    expect(nearestRank(xs, 30)).toBe(20); // ⌈1.5⌉ = 2
    expect(nearestRank(xs, 40)).toBe(20); // ⌈2⌉ = 2
    expect(nearestRank(xs, 50)).toBe(35); // ⌈2.5⌉ = 3
    expect(nearestRank(xs, 95)).toBe(50); // ⌈4.75⌉ = 5
    expect(nearestRank(xs, 100)).toBe(50);
    expect(nearestRank(xs, 0)).toBe(15);
  });

  it('never interpolate: every percentile is one of the values', () => {
    const xs = Array.from({ length: 20 }, (_, i) => i * i);
    for (let p = 0; p <= 100; p += 5) expect(xs).toContain(nearestRank(xs, p));
    expect(nearestRank(xs, 5)).toBe(0); // rank 1 of 20
    expect(nearestRank(xs, 50)).toBe(81); // rank 10
    expect(nearestRank(xs, 95)).toBe(324); // rank 19
  });

  it('are undefined for an empty list, and spread reports null then', () => {
    expect(nearestRank([], 50)).toBeUndefined();
    expect(mean([])).toBeUndefined();
    expect(spread([])).toEqual({ mean: null, p5: null, p50: null, p95: null });
  });

  it('spread sorts a copy and keeps the mean in input order', () => {
    const xs = [9, 1, 5, 3, 7];
    expect(spread(xs)).toEqual({ mean: 5, p5: 1, p50: 5, p95: 9 });
    expect(xs).toEqual([9, 1, 5, 3, 7]);
  });
});
