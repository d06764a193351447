/**
 * The frame at common terminal sizes: it fills rows − 1 exactly (a 200×60 terminal uses its
 * rows), no line is wider than the terminal (long text wraps or ends with …), and the help
 * and list overlays replace the panes instead of drawing over them.
 */
import { cleanup } from 'ink-testing-library';
import { afterEach, describe, expect, it } from 'vitest';
import { openApp } from './app-harness.js';
import type { Controller } from '../../src/tui/controller.js';
import { buildFrame } from '../../src/tui/frame.js';
import { DISAGREE_NET, noiseWith } from '../engine/scenarios.js';
import { controllerFor, KEY, waitFor } from './helpers.js';

afterEach(() => cleanup());

const SIZES = [
  [80, 24],
  [120, 40],
  [200, 60],
] as const;

/** A session stalled on the disagreeing purification, with long explanations in its panes. */
async function stalled(): Promise<Controller> {
  const c = controllerFor(DISAGREE_NET, noiseWith('{werner: 0.9}'));
  c.session.continue();
  c.session.addBreakpoint('on fire kiln.start');
  c.session.addWatch('fired(kiln, "start") + fired(weir, "start") + delivered()');
  return c;
}

describe('the frame at 80×24, 120×40 and 200×60', () => {
  it.each(SIZES)('at %i×%i fills rows − 1 exactly and keeps every line within the width', async (cols, rows) => {
    const c = await stalled();
    const r = openApp(c, cols, rows);
    const frame = r.frame;
    await waitFor(() => frame().includes('│'), frame);
    const lines = frame().split('\n');
    expect(lines).toHaveLength(rows - 1);
    for (const l of lines) expect([...l].length, l).toBeLessThanOrEqual(cols);
    // a cut line says so with an ellipsis, never just stops mid-word
    const model = buildFrame(c, cols, rows);
    for (const col of model.columns) {
      for (const p of col.panes) {
        expect(p.height).toBeGreaterThan(1);
        for (const l of p.body) {
          const text = l.map((s) => s.text).join('');
          expect([...text].length, text).toBeLessThanOrEqual(p.width);
        }
      }
      expect(col.panes.reduce((n, p) => n + p.height, 0), 'the panes of a column fill the body').toBe(rows - 1 - model.top.length - model.bottom.length);
    }
  });

  it.each(SIZES)('at %i×%i shows the help and the list in place of the panes', async (cols, rows) => {
    const c = await stalled();
    const r = openApp(c, cols, rows);
    const frame = r.frame;
    await waitFor(() => frame().includes('│'), frame);
    r.stdin.write('?');
    await waitFor(() => frame().includes('step one event forward'), frame);
    const help = frame().split('\n');
    expect(help).toHaveLength(rows - 1);
    // no pane title or column divider shows through the overlay
    for (const l of help.slice(1, -1)) {
      expect(l).not.toMatch(/rules of kiln|pairs at kiln|timeline ·|│ /);
      expect([...l].length).toBeLessThanOrEqual(cols);
    }
    r.stdin.write(KEY.esc);
    await waitFor(() => frame().includes('rules of'), frame);
    r.stdin.write(':');
    r.stdin.write('list\r');
    await waitFor(() => frame().includes('breakpoints (1)'), frame);
    const list = frame().split('\n');
    expect(list).toHaveLength(rows - 1);
    expect(frame()).toContain('1 · active · on fire kiln.start · hit 0 times');
    for (const l of list.slice(1, -1)) expect(l).not.toMatch(/rules of kiln|pairs at kiln/);
  });
});
