/**
 * The pairs pane: every half the selected site holds, oldest first, with its partner,
 * stage, age and true fidelity (a bar and the number), and on demand the pair's four Bell
 * coefficients in the fixed order Φ+, Φ−, Ψ+, Ψ−.
 */
import { shortPairId, viewPair, type Net, type World } from '../../engine/index.js';
import { formatDuration } from '../../model/units.js';
import type { Line, Seg, Tone } from '../lines.js';
import { bar, pad, padLeft, wrap } from '../text.js';
import type { PaneView } from './network.js';

export interface PairRow {
  readonly qubit: number;
  readonly id: string;
  readonly partner: string;
  readonly stage: string;
  /** Age at this site (ns). */
  readonly age: number;
  readonly fidelity?: number;
  readonly bell?: readonly [number, number, number, number];
}

/** The halves held at a site, in arrival order, with their true state read through the engine's viewPair. */
export function pairsAt(net: Net, w: World, site: string): PairRow[] {
  const recs = Object.values(w.nodes[site]?.pairs ?? {}).sort((a, b) => a.order - b.order);
  return recs.map((p) => {
    const v = viewPair(net, w, site, p.qubit, w.time);
    return { qubit: p.qubit, id: p.id, partner: p.partner, stage: p.stage, age: w.time - p.born, fidelity: v.fidelity, bell: v.bell };
  });
}

/** How good a fidelity is, for its tone (the number is always shown beside it). */
export function fidelityTone(f: number): Tone {
  return f >= 0.9 ? 'good' : f >= 0.7 ? 'warn' : 'bad';
}

const BELL_NAMES = ['Φ+', 'Φ−', 'Ψ+', 'Ψ−'] as const;

function fidelitySegs(r: PairRow, cells: number): Seg[] {
  if (r.fidelity === undefined) return [{ text: `F ? ${r.partner} holds no half with this id`, tone: 'dim' }];
  return [
    { text: bar(r.fidelity, cells), tone: fidelityTone(r.fidelity) },
    { text: ` F ${r.fidelity.toFixed(3)}`, tone: 'plain' },
  ];
}

/** The pairs pane's lines: `selected` is the index of the selected pair, `bellOpen` the qubits showing Bell coefficients. */
export function pairsView(rows: readonly PairRow[], selected: number, bellOpen: ReadonlySet<number>, cols: number, focused: boolean): PaneView {
  if (rows.length === 0) return { lines: [[{ text: 'holds no pairs right now', tone: 'dim' }]], note: '0' };
  const lines: Line[] = [];
  let anchor = 0;
  const wide = cols >= 58;
  rows.forEach((r, i) => {
    const sel = i === selected;
    if (sel) anchor = lines.length;
    const mark: Seg = { text: sel && focused ? '▸ ' : sel ? '› ' : '  ', tone: sel && focused ? 'select' : 'plain' };
    const id: Seg = { text: pad(shortPairId(r.id), 8), tone: 'strong' };
    if (wide) {
      lines.push([
        mark,
        id,
        { text: ` ${pad(r.partner, 8)} ${pad(r.stage, 9)}`, tone: 'plain' },
        { text: `${padLeft(formatDuration(r.age), 9)}  `, tone: 'dim' },
        ...fidelitySegs(r, 10),
      ]);
    } else {
      lines.push([mark, id, { text: ` ↔ ${r.partner} · ${r.stage} · ${formatDuration(r.age)}`, tone: 'plain' }]);
      lines.push([{ text: '    ', tone: 'plain' }, ...fidelitySegs(r, Math.max(4, Math.min(10, cols - 16)))]);
    }
    if (bellOpen.has(r.qubit)) {
      const text = r.bell ? r.bell.map((c, k) => `${BELL_NAMES[k]} ${c.toFixed(3)}`).join('  ') : `Bell coefficients unknown: ${r.partner} holds no half with this id`;
      for (const l of wrap(text, cols - 4)) lines.push([{ text: `    ${l}`, tone: 'accent' }]);
    }
  });
  return { lines, anchor, note: String(rows.length) };
}
