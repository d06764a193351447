/**
 * Seeded randomness kept inside the world: xoroshiro128+ from pure-rand, whose state is
 * four 32-bit integers. Drawing reads the state and writes the successor back.
 */
import { xoroshiro128plus, xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import type { RngState } from './types.js';

/** The generator state for a seed; seeds above 32 bits fold their high part in. */
export function seedRng(seed: number): RngState {
  const hi = Math.floor(seed / 0x100000000) | 0;
  const gen = xoroshiro128plus((seed | 0) ^ hi);
  return [...gen.getState()] as RngState;
}

/** A uniform draw in [0, 1) and the next state. */
export function drawUniform(state: RngState): [number, RngState] {
  const gen = xoroshiro128plusFromState(state);
  const u = uniformFloat64(gen);
  return [u, gen.getState() as RngState];
}

/** Attempts until the first success (≥ 1) for success probability p, from one draw. */
export function geometricAttempts(p: number, u: number): number {
  if (p >= 1) return 1;
  if (p <= 0) return Infinity;
  // inverse CDF: P(K > k) = (1 - p)^k; use 1 - u in (0, 1] so log is finite
  return 1 + Math.floor(Math.log(1 - u) / Math.log1p(-p));
}
