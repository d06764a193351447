/**
 * Benchmark helpers. Every figure a benchmark reports is a ratio of two timings taken in
 * the same run, so a noisy shared machine shifts both sides alike.
 */
export interface BenchLine {
  /** What is compared, e.g. "kernel vs mathjs, cnot on 4 qubits". */
  readonly name: string;
  /** The measured ratio. */
  readonly ratio: number;
  /** Human-readable goal, e.g. ">= 50x". */
  readonly goal: string;
  /** Whether the ratio meets the goal. */
  readonly ok: boolean;
  /** Extra detail (absolute timings), printed after the ratio. */
  readonly detail?: string;
}

/** Runs `fn` repeatedly for at least `minMs` and returns nanoseconds per call (best of 3 rounds). */
export function timePerCall(fn: () => void, minMs = 200): number {
  let best = Infinity;
  for (let round = 0; round < 3; round++) {
    let calls = 0;
    const start = process.hrtime.bigint();
    let elapsed = 0n;
    const limit = BigInt(minMs) * 1_000_000n / 3n;
    do {
      fn();
      calls++;
      elapsed = process.hrtime.bigint() - start;
    } while (elapsed < limit);
    best = Math.min(best, Number(elapsed) / calls);
  }
  return best;
}

export function formatNs(ns: number): string {
  if (ns < 1e3) return `${ns.toFixed(1)} ns`;
  if (ns < 1e6) return `${(ns / 1e3).toFixed(2)} us`;
  if (ns < 1e9) return `${(ns / 1e6).toFixed(2)} ms`;
  return `${(ns / 1e9).toFixed(2)} s`;
}

export function printLines(title: string, lines: readonly BenchLine[]): void {
  console.log(`\n## ${title}`);
  for (const l of lines) {
    const mark = l.ok ? 'ok  ' : 'MISS';
    console.log(`${mark} ${l.name}: ${l.ratio.toFixed(3)} (goal ${l.goal})${l.detail ? `  [${l.detail}]` : ''}`);
  }
}
