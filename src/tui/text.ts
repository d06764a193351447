/**
 * Text helpers for fixed-width panes. Every character the panes draw is one terminal
 * column wide, so widths are counted in code points.
 */

/** The number of columns a string takes. */
export function width(s: string): number {
  let n = 0;
  for (const _ of s) n++;
  return n;
}

/** Cuts a string to `w` columns, marking the cut with `…`. */
export function fit(s: string, w: number): string {
  if (w <= 0) return '';
  const cps = [...s];
  if (cps.length <= w) return s;
  return `${cps.slice(0, Math.max(0, w - 1)).join('')}…`;
}

/** Cuts or right-pads a string to exactly `w` columns. */
export function pad(s: string, w: number): string {
  const f = fit(s, w);
  return f + ' '.repeat(Math.max(0, w - width(f)));
}

/** Cuts or left-pads a string to exactly `w` columns. */
export function padLeft(s: string, w: number): string {
  const f = fit(s, w);
  return ' '.repeat(Math.max(0, w - width(f))) + f;
}

/** Word-wraps text to `w` columns, continuation lines starting with `indent`; overlong words are split. */
export function wrap(text: string, w: number, indent = ''): string[] {
  const room = Math.max(1, w);
  const ind = width(indent) < room ? indent : '';
  const out: string[] = [];
  let cur = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    let rest = word;
    while (rest) {
      const lead = cur === '' ? (out.length ? ind : '') : `${cur} `;
      if (width(lead) + width(rest) <= room) {
        cur = lead + rest;
        rest = '';
      } else if (cur !== '') {
        out.push(cur);
        cur = '';
      } else {
        const cps = [...rest];
        const take = Math.max(1, room - width(lead));
        out.push(lead + cps.slice(0, take).join(''));
        rest = cps.slice(take).join('');
      }
    }
  }
  if (cur !== '' || out.length === 0) out.push(cur);
  return out;
}

const EIGHTHS = ['', '▏', '▎', '▍', '▌', '▋', '▊', '▉'];

/** A bar of `cells` columns filled in proportion to `value` in [0, 1], with eighth-cell steps. */
export function bar(value: number, cells: number): string {
  const v = Math.min(1, Math.max(0, Number.isFinite(value) ? value : 0));
  const eighths = Math.round(v * cells * 8);
  const full = Math.floor(eighths / 8);
  const part = eighths % 8;
  const body = '█'.repeat(full) + (full < cells ? EIGHTHS[part] : '');
  return body + '·'.repeat(Math.max(0, cells - width(body)));
}
