/** Plain-text tables with aligned columns, for closing reports on a terminal or in a CI log. */

/** How a column aligns: numbers to the right, words to the left. */
export type Align = 'left' | 'right';

/** Lays out rows under a header, two spaces between columns; the last column is never padded. */
export function textTable(header: readonly string[], rows: readonly (readonly string[])[], align: readonly Align[] = []): string[] {
  const all = [header, ...rows];
  const widths = header.map((_, c) => Math.max(...all.map((r) => [...(r[c] ?? '')].length)));
  const cell = (text: string, c: number) => {
    if (c === header.length - 1 && align[c] !== 'right') return text;
    const pad = ' '.repeat(widths[c] - [...text].length);
    return align[c] === 'right' ? pad + text : text + pad;
  };
  return all.map((r) => header.map((_, c) => cell(r[c] ?? '', c)).join('  ').trimEnd());
}

/** A number for people: at most `digits` decimals, trailing zeros dropped; a dash for null. */
export function figure(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '–';
  return String(Number(v.toFixed(digits)));
}
