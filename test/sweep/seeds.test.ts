/** Seed ranges and shards (docs/cli.md): parsing, and N shards covering a range exactly once. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/model/errors.js';
import { inShard, parseSeedRange, parseShard, shardSeeds, shardSize } from '../../src/sweep/seeds.js';

function refusal(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an input error');
}

describe('--seeds', () => {
  it('takes an inclusive range A..B', () => {
    expect(parseSeedRange('1..1000')).toEqual({ from: 1, to: 1000 });
    expect(parseSeedRange(' 7..7 ')).toEqual({ from: 7, to: 7 });
    expect(parseSeedRange('0..3')).toEqual({ from: 0, to: 3 });
  });

  it('refuses anything else, naming the flag and the fix', () => {
    for (const bad of ['1-10', '10', 'a..b', '-1..5', '1.5..3', '1...3', '..5', '1..']) {
      const e = refusal(() => parseSeedRange(bad));
      expect(e.field, bad).toBe('--seeds');
      expect(e.fix, bad).toMatch(/--seeds 1\.\.1000/);
    }
    const back = refusal(() => parseSeedRange('9..3'));
    expect(back.message).toContain('runs backwards');
    expect(back.fix).toContain('--seeds 3..9');
    expect(refusal(() => parseSeedRange(undefined)).message).toContain('needs a range');
    expect(refusal(() => parseSeedRange('1..99999999')).fix).toContain('bellstep merge');
  });
});

describe('--shard', () => {
  it('takes I/N with I from 1 to N', () => {
    expect(parseShard('2/4')).toEqual({ index: 2, count: 4 });
    expect(parseShard('1/1')).toEqual({ index: 1, count: 1 });
    expect(parseShard(undefined)).toBeUndefined();
  });

  it('refuses 0/3, 4/3, 0/0 and other shapes', () => {
    expect(refusal(() => parseShard('0/3')).message).toBe('shard 0 of 3 does not exist: I runs from 1 to 3');
    expect(refusal(() => parseShard('4/3')).message).toBe('shard 4 of 3 does not exist: I runs from 1 to 3');
    expect(refusal(() => parseShard('0/0')).message).toContain('must be 1 or more');
    for (const bad of ['2', '2/', '/4', 'a/b', '1/2/3', '-1/3']) expect(refusal(() => parseShard(bad)).field).toBe('--shard');
  });

  it('takes the seeds whose position in the range is I−1 modulo N', () => {
    const range = { from: 10, to: 20 };
    expect(shardSeeds(range, { index: 1, count: 3 })).toEqual([10, 13, 16, 19]);
    expect(shardSeeds(range, { index: 2, count: 3 })).toEqual([11, 14, 17, 20]);
    expect(shardSeeds(range, { index: 3, count: 3 })).toEqual([12, 15, 18]);
    expect(shardSeeds({ from: 1, to: 2 }, { index: 3, count: 3 })).toEqual([]);
    expect(shardSeeds(range)).toHaveLength(11);
  });

  it('N shards cover any range exactly once, and shardSize and inShard agree with the list', () => {
    fc.assert(
      fc.property(fc.nat(1000), fc.nat(60), fc.integer({ min: 1, max: 12 }), (from, len, n) => {
        const range = { from, to: from + len };
        const all: number[] = [];
        for (let i = 1; i <= n; i++) {
          const shard = { index: i, count: n };
          const seeds = shardSeeds(range, shard);
          expect(seeds.length).toBe(shardSize(range, shard));
          for (let s = range.from; s <= range.to; s++) expect(inShard(range, shard, s)).toBe(seeds.includes(s));
          all.push(...seeds);
        }
        expect(all.sort((a, b) => a - b)).toEqual(shardSeeds(range));
      }),
      { numRuns: 200 },
    );
  });
});
