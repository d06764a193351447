/**
 * Seeded randomness kept inside the world: xoroshiro128+ from pure-rand, whose state is
 * four 32-bit integers. Drawing reads the state and writes the successor back.
 */
import { xoroshiro128plus, xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import type { RngState } from './types.js';

/** Draws thrown away after seeding, so the first draws of nearby seeds are unrelated. */
export const SEED_WARMUP = 16;

/**
 * Spreads a seed's bits (the murmur3 32-bit finaliser over its low and high words), since
 * xoroshiro128+ seeded with nearby integers starts with nearly equal outputs.
 */
export function mixSeed(seed: number): number {
  let h = (seed | 0) ^ Math.imul(Math.floor(seed / 0x100000000) | 0, 0x9e3779b1);
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}

/** The generator state for a seed. */
export function seedRng(seed: number): RngState {
  const gen = xoroshiro128plus(mixSeed(seed));
  for (let i = 0; i < SEED_WARMUP; i++) gen.next();
  return [...gen.getState()] as RngState;
}

/**
 * A uniform draw in [0, 1) that advances `s` in place: the same numbers as pure-rand's
 * `uniformFloat64` over `xoroshiro128plusFromState(s)` (two steps, 26 + 27 bits), without
 * creating a generator per draw. State order is pure-rand's: [s01, s00, s11, s10].
 */
export function drawInPlace(s: RngState): number {
  let s01 = s[0];
  let s00 = s[1];
  let s11 = s[2];
  let s10 = s[3];
  const v1 = (s00 + s10) & 0x3ffffff;
  let a0 = s10 ^ s00;
  let a1 = s11 ^ s01;
  let t00 = s00;
  let t01 = s01;
  s00 = (t00 << 24) ^ (t01 >>> 8) ^ a0 ^ (a0 << 16);
  s01 = (t01 << 24) ^ (t00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
  s10 = (a1 << 5) ^ (a0 >>> 27);
  s11 = (a0 << 5) ^ (a1 >>> 27);
  const v2 = (s00 + s10) & 0x7ffffff;
  a0 = s10 ^ s00;
  a1 = s11 ^ s01;
  t00 = s00;
  t01 = s01;
  s[1] = (t00 << 24) ^ (t01 >>> 8) ^ a0 ^ (a0 << 16);
  s[0] = (t01 << 24) ^ (t00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
  s[3] = (a1 << 5) ^ (a0 >>> 27);
  s[2] = (a0 << 5) ^ (a1 >>> 27);
  return v1 * 1.4901161193847656e-8 + v2 * 1.1102230246251565e-16;
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
