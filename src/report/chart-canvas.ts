/** The chart's geometry: its size, the sites' columns, the time scale and the bands a thinned chart groups by. */
import type { ChartData } from './chart-data.js';
import { MARK_MEANINGS } from './chart-style.js';

/** Ranges of up to this many events get one mark per happening and one arrow per message. */
export const FULL_LIMIT = 5000;

export const LEFT = 104;
export const RIGHT = 32;
const MIN_WIDTH = 800;
const MIN_COLUMN = 112;
/** Height of the plot per event drawn in full, and its bounds. */
const PX_PER_EVENT = 10;
const MIN_PLOT = 320;
const MAX_PLOT = 12000;
/** Height of the plot of a thinned chart, and of one of its time bands. */
const THINNED_PLOT = 4800;
const BAND_PX = 24;
export const LEGEND_ITEM = 200;
/** Rough widths of a character of the title and of the smaller header lines, for wrapping. */
const TITLE_CHAR_PX = 10.5;
const LINE_CHAR_PX = 6.8;

/** One decimal is plenty for screen coordinates and keeps files small. */
export function n(v: number): string {
  return String(Math.round(v * 10) / 10);
}

/** "1 message", "2,000 messages". */
export function plural(count: number, word: string): string {
  return `${count.toLocaleString('en-US')} ${word}${count === 1 ? '' : 's'}`;
}

/** Words of `text` in lines of at most `max` characters (a longer word gets a line of its own). */
export function wrap(text: string, max: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > max) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.length ? lines : [''];
}

/** One line of the header above the legend. */
export interface HeaderLine {
  readonly cls: 'title' | 'sub' | 'note';
  readonly text: string;
  /** Baseline. */
  readonly y: number;
}

export class Canvas {
  readonly width: number;
  readonly column: number;
  readonly legendPerRow: number;
  readonly plotHeight: number;
  /** The time at the bottom of the plot: the last event, or a later arrival of a message sent in the range. */
  readonly tEnd: number;
  readonly thinned: boolean;
  /** Set by `layoutHeader`, which places everything below the header. */
  header: readonly HeaderLine[] = [];
  legendTop = 0;
  plotTop = 0;

  constructor(readonly d: ChartData) {
    const events = d.to - d.from + 1;
    this.thinned = events > FULL_LIMIT;
    this.width = Math.max(MIN_WIDTH, LEFT + RIGHT + d.sites.length * MIN_COLUMN);
    this.column = (this.width - LEFT - RIGHT) / Math.max(1, d.sites.length);
    let end = d.end;
    for (const m of d.messages) end = Math.max(end, m.arrives);
    // a range of one instant still needs some height to draw in
    this.tEnd = end > d.start ? end : d.start + 1000;
    this.plotHeight = this.thinned ? THINNED_PLOT : Math.min(MAX_PLOT, Math.max(MIN_PLOT, PX_PER_EVENT * events));
    this.legendPerRow = Math.max(1, Math.floor((this.width - 48) / LEGEND_ITEM));
  }

  /** Wraps the title and the lines under it to the width, and places the legend and the plot below them. */
  layoutHeader(title: string, sub: readonly string[], notes: readonly string[]): void {
    const lines: HeaderLine[] = [];
    let y = 32;
    for (const t of wrap(title, Math.floor((this.width - 48) / TITLE_CHAR_PX))) {
      lines.push({ cls: 'title', text: t, y });
      y += 24;
    }
    const max = Math.floor((this.width - 48) / LINE_CHAR_PX);
    for (const [cls, texts] of [['sub', sub], ['note', notes]] as const) {
      for (const text of texts) {
        for (const t of wrap(text, max)) {
          lines.push({ cls, text: t, y });
          y += 17;
        }
      }
    }
    this.header = lines;
    this.legendTop = y + 8;
    this.plotTop = this.legendTop + Math.ceil((MARK_MEANINGS.length + 2) / this.legendPerRow) * 20 + 44;
  }

  get height(): number {
    return this.plotTop + this.plotHeight + 56;
  }

  x(site: string): number {
    return LEFT + this.column * (this.d.sites.indexOf(site) + 0.5);
  }

  y(t: number): number {
    return this.plotTop + ((t - this.d.start) / (this.tEnd - this.d.start)) * this.plotHeight;
  }

  /** The time band a time falls in, for thinning. */
  band(t: number): number {
    return Math.min(Math.floor((this.y(t) - this.plotTop) / BAND_PX), Math.floor(this.plotHeight / BAND_PX) - 1);
  }

  /** The middle of a band, where a thinned chart draws its marks. */
  bandY(band: number): number {
    return this.plotTop + (band + 0.5) * BAND_PX;
  }

  /** The simulated time one band covers. */
  get bandNs(): number {
    return ((this.tEnd - this.d.start) * BAND_PX) / this.plotHeight;
  }
}
