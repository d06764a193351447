import { cleanup } from 'ink-testing-library';
import { afterEach, describe, expect, it } from 'vitest';
import { formatDuration } from '../../src/model/units.js';
import { openApp } from './app-harness.js';
import type { Controller } from '../../src/tui/controller.js';
import { DISAGREE_NET, noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';
import { controllerFor, KEY, waitFor } from './helpers.js';

afterEach(() => cleanup());

const SWAP_NOISE = noiseWith('{werner: 0.9}', '    success: 0.3\n  memory: {t2: 1 s}');

/**
 * The text of one column of a two-column frame with wrapped lines joined, so a phrase
 * that a pane wrapped reads as one.
 */
function columnText(frame: string, side: 'left' | 'right'): string {
  return frame
    .split('\n')
    .slice(1, -1)
    .map((l) => {
      const cut = l.indexOf('│');
      return cut < 0 ? l : side === 'left' ? l.slice(0, cut) : l.slice(cut + 1);
    })
    .join(' ')
    .replace(/\s+/g, ' ');
}

function open(c: Controller, columns = 100, rows = 40) {
  return openApp(c, columns, rows);
}

/** Writes one key and waits until the controller has handled it. */
async function press(r: ReturnType<typeof open>, c: Controller, key: string): Promise<void> {
  const before = c.version;
  r.stdin.write(key);
  await waitFor(() => c.version > before, r.frame);
  // and until the frame shows the handled state
  await new Promise((res) => setTimeout(res, 20));
}

describe('the debugger panes', () => {
  it('draws every pane, the status line and the key hints at the start', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('sites');
    const f = r.frame();
    for (const title of ['SITES', 'pairs at mill', 'rules of mill', 'timeline', 'messages', 'events']) expect(f).toContain(title);
    expect(f).toContain('at the start of 0 computed');
    expect(f).toContain(`seed ${c.session.seed}`);
    expect(f).toContain('[mill]');
    expect(f).toContain('? help');
  });

  it('shows a held pair with its fidelity bar and number, and its Bell coefficients on Enter', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('SITES');
    await press(r, c, KEY.right);
    const pair = Object.values(c.session.world().nodes.mill.pairs)[0];
    expect(pair).toBeDefined();
    // a fresh Werner pair of parameter 0.9 has fidelity 0.9 to Φ+ (docs/physics.md: Werner state, common practice)
    await r.until('F 0.900');
    expect(r.frame()).toMatch(/█{8,}[▏▎▍▌▋▊▉·]*\s?F 0\.900/);
    await press(r, c, KEY.tab);
    await r.until('PAIRS AT MILL');
    await press(r, c, KEY.enter);
    await r.until('Φ+ 0.900');
    // the other three Werner coefficients are (1 − F)/3 each (common practice)
    const rest = ((1 - 0.9) / 3).toFixed(3);
    expect(r.frame()).toContain(`Φ− ${rest}`);
    expect(r.frame()).toContain(`Ψ− ${rest}`);
  });

  it("shows a rule's guards and what the failing one waits for", async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('rules of mill');
    expect(r.frame()).toContain('swap  waits');
    expect(r.frame()).toContain('✗ have partner quay');
    expect(r.frame()).toContain('→ waits for a pair with quay in stage "link"');
  });

  it('shows messages in flight with their time to arrival, and marks the rule that fired', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('SITES');
    while (c.session.world().inflight.size === 0) await press(r, c, KEY.right);
    const w = c.session.world();
    const m = [...w.inflight.values()].sort((a, b) => a.arrives - b.arrives)[0];
    await r.until(`${m.from} → ${m.to} ${m.kind}`);
    expect(r.frame()).toContain(`arrives in ${formatDuration(m.arrives - w.time)}`);
    expect(r.frame()).toContain('★ fired at this event');
    // the swap shows in the timeline as an X in mill's column
    expect(r.frame()).toMatch(/│\s+X/);
  });

  it('steps back and the status line says where the cursor is', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('SITES');
    await press(r, c, KEY.right);
    await press(r, c, KEY.right);
    await press(r, c, KEY.right);
    await r.until('event #2 of 3 computed');
    await press(r, c, KEY.left);
    await r.until('event #1 of 3 computed');
    const t = c.session.world().time;
    expect(r.frame()).toContain(`t ${formatDuration(t)}`);
    expect(c.session.cursor).toBe(2);
  });

  it('continues to a stall and explains, for kiln, which message each rule waits for', async () => {
    const c = controllerFor(DISAGREE_NET, noiseWith('{werner: 0.9}', '    success: 0.5'));
    const r = open(c, 100, 48);
    await r.until('SITES');
    await press(r, c, KEY.shiftRight);
    await r.until('STALLED');
    expect(c.site).toBe('kiln');
    await r.until('rules of kiln');
    const rules = columnText(r.frame(), 'left');
    expect(rules).toMatch(/conclude waits .*✗ check m\.pair == keep\.id → waits for a "parity" message from weir about pair kiln~weir#\d+; the inbox holds one about kiln~weir#\d+/);
    expect(rules).toMatch(/start waits ✗ have partner weir, stage link, count 2 as keep, probe → waits for 2 pairs with weir/);
    expect(columnText(r.frame(), 'right')).toMatch(/unread at kiln \(1\) parity from weir about #\d+/);
  });

  it('selects a site with the arrows in the sites pane', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('[mill]');
    await press(r, c, KEY.down);
    await r.until('[ridge]');
    expect(r.frame()).toContain('rules of ridge');
    expect(r.frame()).toContain('▸ ridge');
  });

  it('opens the help from the key table and closes it with Esc', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('SITES');
    await press(r, c, '?');
    await r.until('step one event forward');
    expect(r.frame()).toContain('Shift+Tab');
    await press(r, c, KEY.esc);
    await r.until('SITES');
    expect(c.mode).toBe('normal');
  });

  it('runs commands, completes names and shows a mistake inline without ending the session', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE);
    const r = open(c);
    await r.until('SITES');
    await press(r, c, ':');
    await r.until('› ');
    r.stdin.write('brek on fire');
    await r.until('brek on fire');
    await press(r, c, KEY.enter);
    await r.until('there is no command "brek"');
    expect(r.frame()).toContain('did you mean "break"?');
    // fix the line: clear it and type with completion
    for (let i = 0; i < 'brek on fire'.length; i++) await press(r, c, KEY.backspace);
    r.stdin.write('break on fire mill.sw');
    await r.until('break on fire mill.sw█');
    await press(r, c, KEY.tab);
    await r.until('break on fire mill.swap█');
    await press(r, c, KEY.enter);
    await r.until('breakpoint 1: on fire mill.swap');
    expect(r.frame()).toContain('1 break ');
    await press(r, c, KEY.shiftRight);
    await r.until('stopped at a breakpoint');
    expect(c.session.event()?.fires.some((f) => f.rule === 'swap')).toBe(true);
  });

  it('shows each event in one plain sentence, and in teaching mode steps on its own', async () => {
    const c = controllerFor(purificationNet(), noiseWith('{werner: 0.9}', '    success: 0.5'), { autoplay: 50 });
    const r = open(c, 100, 30);
    await r.until('▶ playing 50/s');
    await waitFor(() => c.session.cursor >= 2, r.frame);
    await press(r, c, ' ');
    await r.until('⏸ paused');
    const at = c.session.cursor;
    await new Promise((res) => setTimeout(res, 100));
    expect(c.session.cursor).toBe(at);
    await r.until(/At \d[\d.]* (ns|us|ms)/);
  });

  it('keeps the frame within rows − 1 and the terminal width, at 80×24 and larger', async () => {
    for (const [cols, rows] of [[80, 24], [100, 40], [60, 16], [50, 12]] as const) {
      const c = controllerFor(SWAP_NET, SWAP_NOISE);
      const r = open(c, cols, rows);
      await r.until('│');
      await press(r, c, KEY.right);
      const lines = r.frame().split('\n');
      expect(lines.length).toBeLessThanOrEqual(rows - 1);
      for (const l of lines) expect([...l].length).toBeLessThanOrEqual(cols);
      r.unmount();
    }
  });

  it('marks focus and quality with symbols and words, not colour alone', async () => {
    const c = controllerFor(SWAP_NET, SWAP_NOISE, { colour: false });
    const r = open(c);
    await r.until('▶ SITES');
    await press(r, c, KEY.tab);
    await r.until('▶ PAIRS AT MILL');
    expect(r.frame()).toContain('  sites');
  });
});
