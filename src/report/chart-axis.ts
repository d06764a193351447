/** The chart's time axis: round tick steps and one readable unit for all the labels of a chart. */

const UNITS: readonly (readonly [string, number])[] = [
  ['s', 1e9],
  ['ms', 1e6],
  ['µs', 1e3],
  ['ns', 1],
];

/** A step of 1, 2 or 5 times a power of ten (ns), at least `raw`. */
export function niceStep(raw: number): number {
  if (!(raw > 0)) return 1;
  const pow = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) if (m * pow >= raw) return Math.max(1, m * pow);
  return Math.max(1, 10 * pow);
}

/**
 * The unit that the tick labels of a chart ending near `end` use at this step: the largest
 * unit that does not exceed the times shown and keeps labels to at most three decimals.
 */
export function tickUnit(step: number, end: number = step): { unit: string; size: number; decimals: number } {
  const top = Math.max(Math.abs(end), step);
  const [unit, size] = UNITS.find(([, s]) => s <= top && step / s >= 0.001) ?? UNITS[UNITS.length - 1];
  const ratio = step / size;
  const decimals = ratio >= 1 ? 0 : Math.min(3, Math.ceil(-Math.log10(ratio) - 1e-9));
  return { unit, size, decimals };
}

/** Ticks from `start` to `end` (ns), about `count` of them, with their labels. */
export function timeTicks(start: number, end: number, count: number): { time: number; label: string }[] {
  const step = niceStep((end - start) / Math.max(1, count));
  const { unit, size, decimals } = tickUnit(step, end);
  const out: { time: number; label: string }[] = [];
  for (let t = Math.ceil(start / step) * step; t <= end; t += step) {
    out.push({ time: t, label: `${(t / size).toFixed(decimals)} ${unit}` });
  }
  return out;
}

/** A duration in the unit that suits it, for titles and notes (e.g. "25 µs", "1.25 ms"). */
export function spanText(ns: number): string {
  const [unit, size] = UNITS.find(([, s]) => Math.abs(ns) >= s) ?? UNITS[UNITS.length - 1];
  return `${Number((ns / size).toFixed(3))} ${unit}`;
}
