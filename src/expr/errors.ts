/** Errors of the expression language, located by offset, line and column in their source. */

/** Where an offset falls in a text: 1-based line and column (columns count UTF-16 units). */
export function lineColOf(source: string, offset: number): { line: number; col: number } {
  let line = 1;
  let lineStart = 0;
  const end = Math.min(Math.max(offset, 0), source.length);
  for (let i = 0; i < end; i++) {
    if (source.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, col: end - lineStart + 1 };
}

/** A parse or evaluation error, pointing at the offending text of one expression. */
export class ExprError extends Error {
  /** Whether parsing or evaluating failed. */
  readonly kind: 'parse' | 'eval';
  /** 0-based offset of the offending text in `source`. */
  readonly offset: number;
  /** Length of the offending text (0 at the end of the source). */
  readonly length: number;
  /** 1-based line of `offset` within `source`. */
  readonly line: number;
  /** 1-based column of `offset` within its line. */
  readonly col: number;
  /** The whole source text the offsets refer to. */
  readonly source: string;
  /** What went wrong, naming the offending text, without the position (the message adds "at line:col"). */
  readonly detail: string;

  constructor(kind: 'parse' | 'eval', detail: string, source: string, offset: number, length: number) {
    const { line, col } = lineColOf(source, offset);
    super(`${detail} at ${line}:${col}`);
    this.name = 'ExprError';
    this.kind = kind;
    this.detail = detail;
    this.source = source;
    this.offset = offset;
    this.length = Math.max(0, length);
    this.line = line;
    this.col = col;
  }

  /** The source line holding the error, and under it a caret line marking the offending text. */
  excerpt(): string {
    const lineStart = this.source.lastIndexOf('\n', this.offset - 1) + 1;
    let lineEnd = this.source.indexOf('\n', lineStart);
    if (lineEnd < 0) lineEnd = this.source.length;
    const text = this.source.slice(lineStart, lineEnd).replace(/\r$/, '');
    // Keep tabs in the padding so the caret lines up under tab-indented text.
    const pad = text.slice(0, this.offset - lineStart).replace(/[^\t]/g, ' ');
    const room = Math.max(1, text.length - (this.offset - lineStart));
    const carets = '^'.repeat(Math.max(1, Math.min(this.length, room)));
    return `${text}\n${pad}${carets}`;
  }
}

/** Source text of a span, on one line and shortened, for quoting in a message. */
export function snippet(source: string, start: number, end: number): string {
  const text = source.slice(start, end).replace(/\s+/g, ' ').trim();
  return text.length > 40 ? `${text.slice(0, 39)}…` : text;
}

/** An evaluation error located at a node of the tree (its whole span). */
export function evalError(source: string, node: { start: number; end: number }, detail: string): ExprError {
  return new ExprError('eval', detail, source, node.start, node.end - node.start);
}
