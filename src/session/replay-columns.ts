/**
 * The events of a replay, column by column: times, node and kind, digests, and the one-line
 * summaries where the file keeps them. A `bellstep/replay@2` file stores these columns in
 * blocks of packed bytes (see replay-v2.ts); an `@1` file's event list is read into the same
 * shape, so verify, the debugger and everything else read both versions one way.
 */
import type { ReplayEvent } from './replay.js';

/** Events per block of a `@2` file, and per chunk of the columns in memory. */
export const BLOCK = 4096;

/** A replay's recorded events, read one at a time. */
export interface ReplayEvents extends Iterable<ReplayEvent> {
  readonly length: number;
  /** Event i as a record; its summary is null where the file did not keep it. */
  at(i: number): ReplayEvent;
  time(i: number): number;
  digest(i: number): string;
  node(i: number): string;
  kind(i: number): string;
  /** The one-line summary, when the file kept it (an `@2` file keeps the last events' only). */
  summary(i: number): string | null;
  /** The digest as two 32-bit halves (what a re-run compares against). */
  digestHalves(i: number): [number, number];
}

/** Columns in growing chunks: what a `@2` file decodes into, and what a recorder keeps. */
export class EventColumns implements ReplayEvents {
  length = 0;
  private readonly times: Float64Array[] = [];
  /** Digests as two 32-bit halves. */
  private readonly digests: Uint32Array[] = [];
  /** Node index × 3 + kind index. */
  private readonly codes: Uint32Array[] = [];
  private readonly summaries = new Map<number, string>();

  constructor(
    readonly nodes: readonly string[],
    readonly kinds: readonly string[],
  ) {}

  /** Appends an event; `code` is node index × 3 + kind index (see `codeOf`). */
  push(time: number, code: number, hi: number, lo: number, summary?: string): void {
    const i = this.length++;
    const c = Math.floor(i / BLOCK);
    if (c === this.times.length) {
      this.times.push(new Float64Array(BLOCK));
      this.digests.push(new Uint32Array(2 * BLOCK));
      this.codes.push(new Uint32Array(BLOCK));
    }
    const k = i - c * BLOCK;
    this.times[c][k] = time;
    this.codes[c][k] = code;
    this.digests[c][2 * k] = hi;
    this.digests[c][2 * k + 1] = lo;
    if (summary !== undefined) this.summaries.set(i, summary);
  }

  /** Keeps the summary of event i (or forgets it, with undefined). */
  setSummary(i: number, summary: string | undefined): void {
    if (summary === undefined) this.summaries.delete(i);
    else this.summaries.set(i, summary);
  }

  time(i: number): number {
    return this.times[Math.floor(i / BLOCK)][i % BLOCK];
  }

  code(i: number): number {
    return this.codes[Math.floor(i / BLOCK)][i % BLOCK];
  }

  digestHalves(i: number): [number, number] {
    const d = this.digests[Math.floor(i / BLOCK)];
    const k = i % BLOCK;
    return [d[2 * k], d[2 * k + 1]];
  }

  digest(i: number): string {
    const [hi, lo] = this.digestHalves(i);
    return hex8(hi) + hex8(lo);
  }

  node(i: number): string {
    return this.nodes[Math.floor(this.code(i) / 3)];
  }

  kind(i: number): string {
    return this.kinds[this.code(i) % 3];
  }

  summary(i: number): string | null {
    return this.summaries.get(i) ?? null;
  }

  at(i: number): ReplayEvent {
    return { index: i, time_ns: this.time(i), node: this.node(i), kind: this.kind(i), summary: this.summary(i), digest: this.digest(i) };
  }

  *[Symbol.iterator](): Iterator<ReplayEvent> {
    for (let i = 0; i < this.length; i++) yield this.at(i);
  }
}

/** The three event kinds, in the order their codes use. */
export const KINDS: readonly string[] = ['herald', 'arrive', 'wake'];

/** The code of a node and kind (node index × 3 + kind index). */
export function codeOf(nodeIndex: number, kind: string): number {
  return nodeIndex * 3 + KINDS.indexOf(kind);
}

function hex8(x: number): string {
  return (x >>> 0).toString(16).padStart(8, '0');
}

/** A 16-hex-digit digest as two 32-bit halves. */
export function digestHalves(d: string): [number, number] {
  return [parseInt(d.slice(0, 8), 16) >>> 0, parseInt(d.slice(8, 16), 16) >>> 0];
}

/** An `@1` file's event list in the same shape (summaries kept for every event). */
export class ListEvents implements ReplayEvents {
  constructor(private readonly list: readonly ReplayEvent[]) {}

  get length(): number {
    return this.list.length;
  }

  at(i: number): ReplayEvent {
    return this.list[i];
  }

  time(i: number): number {
    return this.list[i].time_ns;
  }

  digest(i: number): string {
    return this.list[i].digest;
  }

  node(i: number): string {
    return this.list[i].node;
  }

  kind(i: number): string {
    return this.list[i].kind;
  }

  summary(i: number): string | null {
    return this.list[i].summary;
  }

  digestHalves(i: number): [number, number] {
    return digestHalves(this.list[i].digest);
  }

  [Symbol.iterator](): Iterator<ReplayEvent> {
    return this.list[Symbol.iterator]();
  }
}

// ---------------------------------------------------------------- packed bytes

/** A growable byte buffer for one column of a block. */
export class ByteSink {
  bytes = new Uint8Array(1024);
  length = 0;

  private room(n: number): void {
    if (this.length + n <= this.bytes.length) return;
    let size = this.bytes.length * 2;
    while (size < this.length + n) size *= 2;
    const grown = new Uint8Array(size);
    grown.set(this.bytes.subarray(0, this.length));
    this.bytes = grown;
  }

  /** An unsigned integer up to 2^53, seven bits per byte, low bits first (LEB128). */
  varint(x: number): void {
    this.room(8);
    let v = x;
    while (v >= 128) {
      this.bytes[this.length++] = (v % 128) | 128;
      v = Math.floor(v / 128);
    }
    this.bytes[this.length++] = v;
  }

  /** A 32-bit unsigned integer, big-endian (so a digest's bytes read in its hex order). */
  u32(x: number): void {
    this.room(4);
    this.bytes[this.length++] = (x >>> 24) & 255;
    this.bytes[this.length++] = (x >>> 16) & 255;
    this.bytes[this.length++] = (x >>> 8) & 255;
    this.bytes[this.length++] = x & 255;
  }

  base64(): string {
    return Buffer.from(this.bytes.buffer, this.bytes.byteOffset, this.length).toString('base64');
  }

  clear(): void {
    this.length = 0;
  }
}

/** Reads the values a ByteSink wrote. */
export class ByteSource {
  private at = 0;

  constructor(private readonly bytes: Uint8Array) {}

  get done(): boolean {
    return this.at >= this.bytes.length;
  }

  varint(): number {
    let v = 0;
    let scale = 1;
    for (let shifts = 0; ; shifts++) {
      if (this.at >= this.bytes.length || shifts > 7) throw new Error('a packed number runs past the end of its column');
      const b = this.bytes[this.at++];
      v += (b & 127) * scale;
      if (b < 128) return v;
      scale *= 128;
    }
  }

  u32(): number {
    if (this.at + 4 > this.bytes.length) throw new Error('a digest runs past the end of its column');
    const b = this.bytes;
    const x = ((b[this.at] << 24) | (b[this.at + 1] << 16) | (b[this.at + 2] << 8) | b[this.at + 3]) >>> 0;
    this.at += 4;
    return x;
  }
}
