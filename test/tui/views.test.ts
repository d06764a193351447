import { describe, expect, it } from 'vitest';
import type { EngineEvent } from '../../src/engine/index.js';
import { Session } from '../../src/session/session.js';
import { EventLog } from '../../src/tui/event-log.js';
import { layout, distribute, PANES } from '../../src/tui/layout.js';
import { lineText } from '../../src/tui/lines.js';
import { bar, fit, wrap } from '../../src/tui/text.js';
import { chainOrder, linkPairCount } from '../../src/tui/views/network.js';
import { eventMarks, timelineView } from '../../src/tui/views/timeline.js';
import { engineFrom, noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';

describe('text helpers', () => {
  it('wraps words within the width and splits words that cannot fit', () => {
    const lines = wrap('waits for a pair with ridge in stage "link"; holds none', 20, '  ');
    for (const l of lines) expect(l.length).toBeLessThanOrEqual(20);
    expect(lines.join(' ').replace(/\s+/g, ' ')).toBe('waits for a pair with ridge in stage "link"; holds none');
    expect(wrap('abcdefghij', 4)).toEqual(['abcd', 'efgh', 'ij']);
  });

  it('cuts with an ellipsis', () => {
    expect(fit('mill~quay#12', 6)).toBe('mill~…');
    expect(fit('mill', 6)).toBe('mill');
  });

  it('fills a bar in proportion, in eighths of a cell', () => {
    expect(bar(1, 8)).toBe('████████');
    expect(bar(0, 4)).toBe('····');
    expect(bar(0.5, 4)).toBe('██··');
    // 0.9 of 10 cells is 72 eighths: 9 full cells and nothing of the tenth
    expect(bar(0.9, 10)).toBe('█████████·');
    expect(bar(0.95, 10)).toBe('█████████▌');
  });
});

describe('layout', () => {
  it('splits rows by weight and always uses them all', () => {
    for (const total of [9, 20, 37]) {
      const parts = distribute(total, [2, 3, 5]);
      expect(parts.reduce((a, b) => a + b, 0)).toBe(total);
      expect(Math.min(...parts)).toBeGreaterThanOrEqual(3);
    }
  });

  it('shows every pane on 80 columns and more, and only the focused one when very small', () => {
    for (const [cols, rows, kind] of [[80, 21, 'two'], [160, 46, 'three'], [50, 20, 'single']] as const) {
      const l = layout(cols, rows, 'rules');
      expect(l.kind).toBe(kind);
      expect(l.columns.reduce((a, c) => a + c.width, 0)).toBe(cols);
      for (const c of l.columns) expect(c.panes.reduce((a, p) => a + p.height, 0)).toBe(rows);
      const shown = l.columns.flatMap((c) => c.panes.map((p) => p.id));
      expect(shown.sort()).toEqual(kind === 'single' ? ['rules'] : [...PANES].sort());
    }
  });
});

describe('the sites pane', () => {
  it('recognises a chain and counts the pairs held across each link', () => {
    const s = new Session(engineFrom(SWAP_NET, noiseWith('{werner: 0.9}', '    success: 0.3')));
    expect(chainOrder(s.engine.net)).toEqual(['quay', 'mill', 'ridge']);
    s.stepForward();
    const ev = s.event()!;
    const link = ev.pair!.slice(0, ev.pair!.indexOf('#'));
    expect(linkPairCount(s.engine.net, s.world(), link)).toBe(1);
  });
});

describe('the timeline', () => {
  it('marks a swap with X, a purification step with P and new pairs with + at both ends', () => {
    const base = { index: 0, time: 0, nodes: [], summary: '', sends: [], deliveries: [], discards: [], delivers: [] };
    const swap: EngineEvent = { ...base, type: 'herald', node: 'mill', pair: 'mill~ridge#2', fires: [{ node: 'mill', rule: 'swap', bound: {}, actions: ['Bell-measured #1 and #2: z=0 x=1'], log: [] }] };
    expect(Object.fromEntries(eventMarks(swap))).toEqual({ mill: 'X', ridge: '+' });
    const purify: EngineEvent = { ...base, type: 'herald', node: 'kiln', pair: 'kiln~weir#2', fires: [{ node: 'kiln', rule: 'start', bound: {}, actions: ['cnot #1→#2', 'measured #2 in z: 0'], log: [] }] };
    expect(Object.fromEntries(eventMarks(purify))).toEqual({ kiln: 'P', weir: '+' });
  });

  it('draws a message as a slanted line from the sender column towards the receiver', () => {
    const s = new Session(engineFrom(purificationNet({ lengthKm: 40 }), noiseWith('{werner: 0.9}', '    success: 0.5')));
    const log = new EventLog(s);
    while (s.world().inflight.size === 0) s.stepForward();
    const lines = timelineView({ net: s.engine.net, world: s.world(), records: s.history.records, log, cursor: s.cursor, site: 'kiln', back: 0 }, 40, 10).map(lineText);
    // kiln is left of weir and its parity message is on its way: the last row leans right
    expect(lines[0]).toMatch(/kiln\s+weir/);
    expect(lines[lines.length - 1]).toMatch(/^▶/);
    // the next event is the arrival at weir: the line ends there in an arrowhead beside weir's mark
    s.stepForward();
    expect(s.event()?.type).toBe('arrive');
    const later = timelineView({ net: s.engine.net, world: s.world(), records: s.history.records, log, cursor: s.cursor, site: 'kiln', back: 0 }, 40, 10).map(lineText);
    expect(later[later.length - 1]).toMatch(/│─+>[*PDx]/);
  });
});
