/**
 * Seed ranges and shards (docs/cli.md): `--seeds A..B` is inclusive, and `--shard I/N`
 * takes the seeds whose position in the range is I−1 modulo N, so N jobs cover the range
 * once whatever its length.
 */
import { InputError } from '../model/errors.js';

/** An inclusive range of seeds. */
export interface SeedRange {
  readonly from: number;
  readonly to: number;
}

/** Shard `index` of `count` (both from 1). */
export interface Shard {
  readonly index: number;
  readonly count: number;
}

/** The most seeds one sweep may cover; beyond it the `runs` list alone would not fit in memory well. */
export const MAX_SEEDS = 10_000_000;

const INTEGER = /^[0-9]+$/;

function usage(field: string, message: string, fix: string): InputError {
  return new InputError({ code: 'usage', field, message, fix });
}

/** Parses `A..B` (non-negative integers, A ≤ B). */
export function parseSeedRange(text: unknown, flag = '--seeds'): SeedRange {
  if (text === undefined) throw usage(flag, 'a sweep needs a range of seeds', `write e.g. ${flag} 1..1000`);
  const s = String(text).trim();
  const m = /^([^.]*)\.\.([^.]*)$/.exec(s);
  if (!m) throw usage(flag, `expected a range A..B, got "${s}"`, `write e.g. ${flag} 1..1000 (both ends included)`);
  const [a, b] = [m[1].trim(), m[2].trim()];
  for (const end of [a, b]) {
    if (!INTEGER.test(end) || !Number.isSafeInteger(Number(end))) {
      throw usage(flag, `"${end}" in "${s}" is not a non-negative integer seed`, `write e.g. ${flag} 1..1000`);
    }
  }
  const from = Number(a);
  const to = Number(b);
  if (from > to) throw usage(flag, `the range "${s}" runs backwards`, `write the smaller seed first: ${flag} ${to}..${from}`);
  if (to - from + 1 > MAX_SEEDS) {
    throw usage(flag, `the range "${s}" holds ${to - from + 1} seeds, more than ${MAX_SEEDS}`, 'split it into several sweeps and join them with bellstep merge');
  }
  return { from, to };
}

/** Parses `I/N` with 1 ≤ I ≤ N. */
export function parseShard(text: unknown, flag = '--shard'): Shard | undefined {
  if (text === undefined) return undefined;
  const s = String(text).trim();
  const m = /^([0-9]+)\/([0-9]+)$/.exec(s);
  if (!m) throw usage(flag, `expected I/N, got "${s}"`, `write e.g. ${flag} 2/4 for the second of four shards`);
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (!Number.isSafeInteger(count) || count < 1) throw usage(flag, `the shard count in "${s}" must be 1 or more`, `write e.g. ${flag} 1/4`);
  if (index < 1 || index > count) throw usage(flag, `shard ${index} of ${count} does not exist: I runs from 1 to ${count}`, `write e.g. ${flag} 1/${count} ... ${flag} ${count}/${count}`);
  return { index, count };
}

/** `I/N`, as the sweep file writes it. */
export function formatShard(shard: Shard): string {
  return `${shard.index}/${shard.count}`;
}

/** Whether a seed of the range belongs to the shard (every seed does without one). */
export function inShard(range: SeedRange, shard: Shard | undefined, seed: number): boolean {
  if (seed < range.from || seed > range.to) return false;
  return !shard || (seed - range.from) % shard.count === shard.index - 1;
}

/** How many seeds of the range a shard takes. */
export function shardSize(range: SeedRange, shard?: Shard): number {
  const total = range.to - range.from + 1;
  if (!shard) return total;
  return total >= shard.index ? Math.floor((total - shard.index) / shard.count) + 1 : 0;
}

/** The seeds of the range that a shard takes, in ascending order. */
export function shardSeeds(range: SeedRange, shard?: Shard): number[] {
  const step = shard?.count ?? 1;
  const out: number[] = [];
  for (let s = range.from + (shard ? shard.index - 1 : 0); s <= range.to; s += step) out.push(s);
  return out;
}
