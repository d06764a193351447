/**
 * Drawing a frame model on the terminal. The model is already cut to the terminal's width
 * (frame.ts), so a screen row is its segments joined, padded to the column widths, with the
 * tones' SGR codes around them. The terminal screen writes only the rows that changed since
 * the last frame, each at its row by cursor address; Ink keeps the keys, raw mode and the
 * app's life cycle (app.tsx). Ink 6's own output rebuilds every cell of the screen as an
 * object on every frame (over 16 ms at 160×50 here), which a row diff avoids.
 */
import type { FrameModel, PaneModel } from './frame.js';
import type { Line } from './lines.js';
import { toneCodes } from './style.js';
import { fit, width } from './text.js';

/** How rows are styled: with colours, with bold and inverse only (NO_COLOR), or as plain text. */
export type Styling = 'colour' | 'mono' | 'plain';

const RESET = '\x1b[0m';

/** One line as styled text, exactly `w` columns wide (cut with … if it is wider). */
export function lineRow(l: Line, w: number, styling: Styling): string {
  let out = '';
  let used = 0;
  for (const s of l) {
    if (used >= w) break;
    // an empty segment still takes its column, as a space
    let text = s.text === '' ? ' ' : s.text;
    const sw = width(text);
    if (used + sw > w) text = fit(text, w - used);
    used += Math.min(sw, w - used);
    const codes = styling === 'plain' ? '' : toneCodes(s.tone, styling === 'colour');
    out += codes === '' ? text : `${codes}${text}${RESET}`;
  }
  return used < w ? out + ' '.repeat(w - used) : out;
}

/** The line of a pane at row `r` of its box: the title, a body row, or blank. */
function paneRow(p: PaneModel, r: number): Line {
  if (r === 0) return p.title;
  return p.body[r - 1] ?? [];
}

/** The frame as `frame.rows` rows of styled text, each `frame.cols` columns wide. */
export function composeRows(frame: FrameModel, styling: Styling): string[] {
  const rows: string[] = [];
  const cols = frame.cols;
  for (const l of frame.top) rows.push(lineRow(l, cols, styling));
  const body = frame.rows - frame.top.length - frame.bottom.length;
  if (frame.overlay) {
    for (let r = 0; r < body; r++) rows.push(lineRow(frame.overlay[r] ?? [], cols, styling));
  } else {
    const divider = styling === 'colour' ? `\x1b[2m│${RESET}` : '│';
    // for each column, the pane and the row within it that each body row shows
    const cursors = frame.columns.map(() => ({ pane: 0, row: 0 }));
    for (let r = 0; r < body; r++) {
      let row = '';
      let used = 0;
      frame.columns.forEach((col, i) => {
        const inner = col.width - (col.divider ? 1 : 0);
        if (col.divider) row += divider;
        const at = cursors[i];
        while (at.pane < col.panes.length && at.row >= col.panes[at.pane].height) {
          at.pane++;
          at.row = 0;
        }
        const p = col.panes[at.pane];
        row += lineRow(p ? paneRow(p, at.row) : [], inner, styling);
        at.row++;
        used += col.width;
      });
      rows.push(used < cols ? row + ' '.repeat(cols - used) : row);
    }
  }
  for (const l of frame.bottom) rows.push(lineRow(l, cols, styling));
  return rows;
}

/** Where frames go: the terminal, or memory in tests. */
export interface Screen {
  draw(frame: FrameModel, colour: boolean): void;
}

/** Something to write to, with the terminal's width (a TTY stream, or a sink in the benchmark). */
export interface ScreenOut {
  write(s: string): unknown;
}

/**
 * The terminal: the first frame and every frame after a size change are drawn whole; other
 * frames rewrite only their changed rows. Frames come at most once per `minGapMs`; one that
 * comes sooner is drawn when the gap has passed (the last one wins).
 */
export class TerminalScreen implements Screen {
  private shown: string[] = [];
  private size = '';
  private last = 0;
  private pending: { frame: FrameModel; colour: boolean } | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;
  /** Bytes written so far (the benchmark reads it). */
  bytes = 0;

  constructor(
    private readonly out: ScreenOut,
    private readonly minGapMs = 16,
    private readonly now: () => number = () => performance.now(),
  ) {}

  draw(frame: FrameModel, colour: boolean): void {
    const wait = this.last + this.minGapMs - this.now();
    if (wait > 0) {
      this.pending = { frame, colour };
      this.timer ??= setTimeout(() => this.flush(), wait);
      return;
    }
    // a frame that waited is older than this one
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.pending = null;
    this.paint(frame, colour);
  }

  /** Draws a frame that waited, if any. */
  flush(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    const p = this.pending;
    this.pending = null;
    if (p) this.paint(p.frame, p.colour);
  }

  /** Forgets what is on the terminal, so the next frame is drawn whole; drops a waiting frame. */
  stop(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.pending = null;
    this.shown = [];
    this.size = '';
  }

  private paint(frame: FrameModel, colour: boolean): void {
    this.last = this.now();
    const rows = composeRows(frame, colour ? 'colour' : 'mono');
    const size = `${frame.cols}x${frame.rows}`;
    let s = '';
    if (size !== this.size) {
      // hide the cursor, clear what the old size left, draw every row
      s = '\x1b[?25l\x1b[H\x1b[2J';
      this.shown = [];
      this.size = size;
    }
    for (let i = 0; i < rows.length; i++) {
      if (rows[i] !== this.shown[i]) s += `\x1b[${i + 1};1H${rows[i]}`;
    }
    this.shown = rows;
    if (s === '') return;
    this.bytes += s.length;
    this.out.write(s);
  }
}

/** The last frame as plain text, trailing spaces cut (tests read it as they would the terminal). */
export class MemoryScreen implements Screen {
  private rows: string[] = [];
  /** Frames drawn so far. */
  frames = 0;

  draw(frame: FrameModel): void {
    this.rows = composeRows(frame, 'plain').map((r) => r.trimEnd());
    this.frames++;
  }

  text(): string {
    return this.rows.join('\n');
  }
}
