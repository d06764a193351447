/**
 * Where the panes go for a terminal size: one column on narrow screens (the focused pane
 * only), two columns from 60 columns, three on large screens. Heights include each
 * pane's title row; the caller keeps the whole frame at most rows − 1 tall.
 */

/** The panes, in the order Tab visits them. */
export const PANES = ['network', 'pairs', 'rules', 'messages', 'events', 'timeline'] as const;

export type PaneId = (typeof PANES)[number];

export interface PaneBox {
  readonly id: PaneId;
  /** Rows, including the title row. */
  readonly height: number;
}

export interface Column {
  /** Columns, including the one-column divider that every column but the first draws on its left. */
  readonly width: number;
  readonly panes: readonly PaneBox[];
}

export interface Layout {
  readonly kind: 'single' | 'two' | 'three';
  readonly columns: readonly Column[];
}

/** Splits `total` rows by weight, each part at least `min`, the parts summing to `total`. */
export function distribute(total: number, weights: readonly number[], min = 3): number[] {
  const sum = weights.reduce((a, b) => a + b, 0);
  const spare = Math.max(0, total - min * weights.length);
  const parts = weights.map((w) => min + Math.floor((spare * w) / sum));
  let left = total - parts.reduce((a, b) => a + b, 0);
  // hand the rounding remainder to the heaviest panes first
  const order = weights.map((w, i) => [w, i] as const).sort((a, b) => b[0] - a[0]);
  for (let k = 0; left > 0; k = (k + 1) % order.length, left--) parts[order[k][1]]++;
  return parts;
}

function column(width: number, rows: number, ids: readonly PaneId[], weights: readonly number[]): Column {
  const h = distribute(rows, weights);
  return { width, panes: ids.map((id, i) => ({ id, height: h[i] })) };
}

/** The layout for a body of `cols` × `rows` (rows left after the status and command rows). */
export function layout(cols: number, rows: number, focus: PaneId): Layout {
  if (cols < 60 || rows < 12) return { kind: 'single', columns: [{ width: cols, panes: [{ id: focus, height: rows }] }] };
  if (cols >= 140 && rows >= 30) {
    const a = Math.floor(cols * 0.3);
    const b = Math.floor(cols * 0.33);
    return {
      kind: 'three',
      columns: [
        column(a, rows, ['network', 'pairs'], [3, 7]),
        column(b, rows, ['rules', 'messages'], [6, 4]),
        column(cols - a - b, rows, ['timeline', 'events'], [6, 4]),
      ],
    };
  }
  const left = Math.floor(cols / 2);
  return {
    kind: 'two',
    columns: [
      column(left, rows, ['network', 'pairs', 'rules'], [2, 3, 5]),
      column(cols - left, rows, ['timeline', 'messages', 'events'], [4.5, 2, 3.5]),
    ],
  };
}
