/**
 * The screen: a frame model becomes rows of exactly the terminal's width, with the panes of
 * each column stacked at their heights and a divider before every column but the first;
 * the terminal gets the whole frame once and then only the rows that changed.
 */
import { describe, expect, it, vi } from 'vitest';
import { buildFrame, type FrameModel } from '../../src/tui/frame.js';
import type { Line } from '../../src/tui/lines.js';
import { composeRows, lineRow, MemoryScreen, TerminalScreen } from '../../src/tui/screen.js';
import { SWAP_NET, noiseWith } from '../engine/scenarios.js';
import { controllerFor } from './helpers.js';

const E = String.fromCharCode(27);
const ESC = new RegExp(`${E}\\[[0-9;?]*[A-Za-z]`, 'g');
/** Cursor moves to the start of a row. */
const MOVES = new RegExp(`${E}\\[\\d+;1H`, 'g');
const visible = (s: string) => s.replace(ESC, '');
const cols = (s: string) => [...visible(s)].length;

const line = (text: string): Line => [{ text }];

/** A two-column frame: one pane of 3 rows over one of 2 on the left, one of 5 on the right. */
function twoColumns(body: string): FrameModel {
  const pane = (id: 'network' | 'pairs' | 'events', width: number, height: number, rows: string[]) => ({ id, width, height, focused: false, title: line(`[${id}]`), body: rows.map(line) });
  return {
    cols: 30,
    rows: 7,
    top: [line('status')],
    columns: [
      { width: 12, divider: false, panes: [pane('network', 12, 3, ['n1', 'n2']), pane('pairs', 12, 2, ['p1 is cut here', 'p2 below the box'])] },
      { width: 18, divider: true, panes: [pane('events', 17, 5, [body])] },
    ],
    bottom: [line('keys')],
  };
}

describe('composing rows', () => {
  it('stacks the panes of each column at their heights, with a divider before the second column', () => {
    const rows = composeRows(twoColumns('#0 made a pair'), 'plain');
    expect(rows).toHaveLength(7);
    for (const r of rows) expect(cols(r), r).toBe(30);
    expect(rows.map((r) => r.trimEnd())).toEqual([
      'status',
      '[network]   │[events]',
      'n1          │#0 made a pair',
      'n2          │',
      '[pairs]     │',
      'p1 is cut h…│',
      'keys',
    ]);
  });

  it('cuts a line wider than its pane with … and pads a short one, counting code points', () => {
    expect(lineRow([{ text: 'ab' }, { text: 'cdef' }], 4, 'plain')).toBe('abc…');
    expect(lineRow([{ text: 'F ▏·' }], 6, 'plain')).toBe('F ▏·  ');
    expect(lineRow([], 3, 'plain')).toBe('   ');
  });

  it('styles tones with colour, keeps only bold and inverse without it, and nothing as plain text', () => {
    const l: Line = [{ text: 'ok', tone: 'good' }, { text: ' ' }, { text: 'sel', tone: 'select' }];
    const colour = lineRow(l, 10, 'colour');
    expect(colour).toContain('\x1b[32mok\x1b[0m');
    expect(colour).toContain('\x1b[7;1msel\x1b[0m');
    const mono = lineRow(l, 10, 'mono');
    expect(mono).not.toContain('\x1b[32m');
    expect(mono).toContain('\x1b[7;1msel');
    expect(lineRow(l, 10, 'plain')).toBe('ok sel    ');
    for (const s of [colour, mono]) expect(cols(s)).toBe(10);
  });

  it('draws a real session frame at 80×24 and 160×50 with every row exactly as wide as the terminal', () => {
    const c = controllerFor(SWAP_NET, noiseWith('{werner: 0.9}', '    success: 0.3\n  memory: {t2: 1 s}'));
    for (let i = 0; i < 12; i++) c.session.stepForward();
    for (const [w, h] of [
      [80, 24],
      [160, 50],
    ]) {
      const rows = composeRows(buildFrame(c, w, h), 'colour');
      expect(rows).toHaveLength(h - 1);
      for (const r of rows) expect(cols(r), visible(r)).toBe(w);
    }
  });
});

describe('the terminal screen', () => {
  function sink() {
    const writes: string[] = [];
    return { writes, out: { write: (s: string) => writes.push(s) } };
  }

  it('draws the first frame whole, then only the rows that changed, each at its row', () => {
    const { writes, out } = sink();
    const screen = new TerminalScreen(out, 0);
    screen.draw(twoColumns('#0 made a pair'), false);
    expect(writes).toHaveLength(1);
    expect(writes[0]).toContain('\x1b[2J');
    expect(writes[0].match(MOVES)).toHaveLength(7);

    screen.draw(twoColumns('#1 swapped'), false);
    expect(writes).toHaveLength(2);
    expect(writes[1]).not.toContain('\x1b[2J');
    expect(writes[1].match(MOVES)).toEqual(['\x1b[3;1H']);
    expect(visible(writes[1])).toBe(`n1          │#1 swapped${' '.repeat(7)}`);

    screen.draw(twoColumns('#1 swapped'), false);
    expect(writes, 'an unchanged frame writes nothing').toHaveLength(2);
  });

  it('clears and redraws everything when the size changes', () => {
    const { writes, out } = sink();
    const screen = new TerminalScreen(out, 0);
    screen.draw(twoColumns('a'), false);
    screen.draw({ ...twoColumns('a'), cols: 32 }, false);
    expect(writes[1]).toContain('\x1b[2J');
    expect(writes[1].match(MOVES)).toHaveLength(7);
  });

  it('draws at most one frame per gap, and the last one that came wins', () => {
    vi.useFakeTimers();
    try {
      let now = 1000;
      const { writes, out } = sink();
      const screen = new TerminalScreen(out, 16, () => now);
      screen.draw(twoColumns('first'), false);
      now += 5;
      screen.draw(twoColumns('second'), false);
      screen.draw(twoColumns('third'), false);
      expect(writes).toHaveLength(1);
      now += 20;
      vi.advanceTimersByTime(20);
      expect(writes).toHaveLength(2);
      expect(visible(writes[1])).toContain('third');
      expect(visible(writes[1])).not.toContain('second');
      // a frame after the gap is drawn at once and replaces any that waited
      now += 20;
      screen.draw(twoColumns('fourth'), false);
      expect(writes).toHaveLength(3);
      vi.advanceTimersByTime(50);
      expect(writes).toHaveLength(3);
    } finally {
      vi.useRealTimers();
    }
  });

  it('keeps the last frame as text in memory for tests', () => {
    const m = new MemoryScreen();
    m.draw(twoColumns('x'));
    expect(m.text().split('\n')[0]).toBe('status');
    expect(m.frames).toBe(1);
  });
});
