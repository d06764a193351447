/**
 * The engine is a pure function of its inputs: no clocks, no ambient randomness, no I/O. The
 * session over it (history, replays, long operations) reads no clock or ambient randomness
 * either: a caller that times slices passes its own clock (long-op.ts).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

function sources(dir: string): { file: string; text: string }[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter((f) => f.endsWith('.ts'))
    .map((f) => ({ file: join(dir, f), text: readFileSync(join(dir, f), 'utf8') }));
}

describe('engine and kernel purity', () => {
  const files = [...sources('src/engine'), ...sources('src/quantum')];

  it('finds the sources it checks', () => {
    expect(files.length).toBeGreaterThan(15);
  });

  for (const [what, pattern] of [
    ['Math.random', /Math\.random/],
    ['a clock', /Date\.now|new Date\(|performance\.now|process\.hrtime/],
    ['file or network I/O', /from 'node:(fs|net|http|https|child_process)'/],
  ] as const) {
    it(`never uses ${what}`, () => {
      const offenders = files.filter((f) => pattern.test(f.text)).map((f) => f.file);
      expect(offenders).toEqual([]);
    });
  }
});

describe('session purity', () => {
  const files = sources('src/session');

  it('finds the sources it checks', () => {
    expect(files.length).toBeGreaterThan(10);
  });

  it('never reads a clock or Math.random', () => {
    const offenders = files.filter((f) => /Math\.random|Date\.now|new Date\(|performance\.now|process\.hrtime/.test(f.text)).map((f) => f.file);
    expect(offenders).toEqual([]);
  });
});
