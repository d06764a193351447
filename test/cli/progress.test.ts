/** Sweep progress on stderr: a bar on a terminal, a line every few seconds in a log. */
import { describe, expect, it } from 'vitest';
import { LOG_EVERY_MS, SweepProgress } from '../../src/cli/progress.js';
import { memoryIo } from '../helpers/run-cli.js';

function clock() {
  let t = 1_000_000;
  return { now: () => t, advance: (ms: number) => void (t += ms) };
}

describe('sweep progress', () => {
  it('redraws a bar in place on a terminal, with failures and an estimate, and clears it at the end', () => {
    const io = memoryIo({}, { stderrIsTTY: true });
    const c = clock();
    const p = new SweepProgress(io, 8, c.now);
    c.advance(1000);
    p.seed(false);
    c.advance(1000);
    p.seed(true);
    // 2 seeds in 2 s, 6 to go: about 6 s left
    expect(io.stderrText()).toBe(`\r[###.....................] 1/8 seeds  0 failed, about 7 s left\x1b[K\r[######..................] 2/8 seeds  1 failed, about 6 s left\x1b[K`);
    p.finish();
    expect(io.stderrText().endsWith('\r\x1b[K')).toBe(true);
  });

  it('does not redraw more often than every 100 ms', () => {
    const io = memoryIo({}, { stderrIsTTY: true });
    const c = clock();
    const p = new SweepProgress(io, 100, c.now);
    for (let i = 0; i < 50; i++) {
      c.advance(10);
      p.seed(false);
    }
    expect(io.stderrText().split('\r[').length - 1).toBe(5);
  });

  it('writes one plain line every few seconds when stderr is not a terminal, and nothing for a short sweep', () => {
    const io = memoryIo();
    const c = clock();
    const p = new SweepProgress(io, 10, c.now);
    for (let i = 0; i < 4; i++) {
      c.advance(1000);
      p.seed(i === 2);
    }
    expect(io.stderrText()).toBe('');
    c.advance(LOG_EVERY_MS);
    p.seed(false);
    expect(io.stderrText()).toBe('sweep: 5/10 seeds, 1 failed, about 9 s left\n');
    for (let i = 0; i < 5; i++) p.seed(false);
    p.finish();
    // the last seed writes no line: the closing report follows at once
    expect(io.stderrText()).toBe('sweep: 5/10 seeds, 1 failed, about 9 s left\n');
  });
});
