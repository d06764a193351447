/**
 * `bellstep/replay@2`: a replay stored column by column in blocks written as the run goes,
 * so a million-event recording stays small (about 16 bytes an event) and recording keeps
 * nothing in memory but the block being filled.
 *
 * The file is one JSON object with one top-level key per line. `blocks` holds one line per
 * 4096 events: times as deltas (LEB128), node and kind as one index into `tables` (LEB128),
 * and the digests packed (8 bytes each), every column in base64. `recent` keeps the last
 * events in full, one-line summaries included; earlier summaries are rebuilt by re-running.
 * `limits`, `stop` and `final` (event count and last digest) let verify check that a re-run
 * ends where the recording says it did. The checksum is the SHA-256 of every byte before
 * its own line, so it can be computed while the file is written.
 */
import { createHash, type Hash } from 'node:crypto';
import { BLOCK, ByteSink, ByteSource, EventColumns, KINDS, type ReplayEvents } from './replay-columns.js';
import type { ReplayEvent } from './replay.js';
import type { Stop } from './summary.js';

export const REPLAY_FORMAT_V2 = 'bellstep/replay@2';

/** Events kept in full (with their summaries) at the end of a file. */
export const RECENT = 256;

/** The run limits a recording was made under (null: none given). */
export interface ReplayLimits {
  until_ns: number | null;
  events: number | null;
}

/** Where a run ended: its event count and the digest after its last event. */
export interface ReplayFinal {
  events: number;
  digest: string;
}

/** Everything in a `@2` file's head: what to re-run, and how. */
export interface ReplayHead {
  tool: { name: string; version: string };
  inputs: { program_set: { file: string; text: string; sha256: string }; noise: { file: string; text: string; sha256: string } | null };
  seed: number;
  breakpoints: string[];
  expectations: string[];
  limits: ReplayLimits;
}

/** Something whose one-line text is built when read (an applied event). */
export interface SummaryOf {
  readonly summary: string;
}

/** One block line, as it stands in the file. */
interface BlockLine {
  first: number;
  count: number;
  start_ns: number;
  time: string;
  event: string;
  digest: string;
}

const CHECKSUM_LINE = '\n  "checksum": ';

/** Writes a `@2` file to `sink` as events arrive. */
export class ReplayWriter {
  private readonly hash: Hash = createHash('sha256');
  private readonly nodeIndex = new Map<string, number>();
  private readonly times = new ByteSink();
  private readonly codes = new ByteSink();
  private readonly digests = new ByteSink();
  private blockFirst = 0;
  private blockStart = 0;
  private lastTime = 0;
  private count = 0;
  private firstBlock = true;
  /** The last events' fields in rings, made into records only when the file ends. */
  private readonly recentTime = new Float64Array(RECENT);
  private readonly recentHi = new Uint32Array(RECENT);
  private readonly recentLo = new Uint32Array(RECENT);
  private readonly recentNode: string[] = new Array(RECENT);
  private readonly recentKind: string[] = new Array(RECENT);
  /** The last events' texts, or how to make them (an event's text is built only if it ends up in the file). */
  private readonly recentThunk: (string | null | SummaryOf)[] = new Array(RECENT);
  private finished = false;

  constructor(
    head: ReplayHead,
    private readonly nodes: readonly string[],
    private readonly sink: (chunk: string) => void,
  ) {
    nodes.forEach((n, i) => this.nodeIndex.set(n, i));
    const lines = [
      `  "format": ${JSON.stringify(REPLAY_FORMAT_V2)}`,
      `  "tool": ${JSON.stringify(head.tool)}`,
      `  "inputs": ${JSON.stringify(head.inputs)}`,
      `  "seed": ${JSON.stringify(head.seed)}`,
      `  "breakpoints": ${JSON.stringify(head.breakpoints)}`,
      `  "expectations": ${JSON.stringify(head.expectations)}`,
      `  "limits": ${JSON.stringify(head.limits)}`,
      `  "tables": ${JSON.stringify({ nodes, kinds: KINDS })}`,
    ];
    this.out(`{\n${lines.join(',\n')},\n  "blocks": [`);
  }

  private out(text: string): void {
    this.hash.update(text, 'utf8');
    this.sink(text);
  }

  /** Events written so far. */
  get events(): number {
    return this.count;
  }

  /** Adds the next event; `hi` and `lo` are its digest's halves. */
  add(time: number, node: string, kind: string, hi: number, lo: number, summary: string | null | SummaryOf): void {
    const n = this.nodeIndex.get(node);
    const k = KINDS.indexOf(kind);
    if (n === undefined || k < 0 || time < this.lastTime) throw new Error(`replay: cannot record an event at ${node} (${kind}, t=${time})`);
    this.times.varint(time - this.lastTime);
    this.codes.varint(n * 3 + k);
    this.digests.u32(hi);
    this.digests.u32(lo);
    this.lastTime = time;
    const slot = this.count % RECENT;
    this.recentTime[slot] = time;
    this.recentHi[slot] = hi;
    this.recentLo[slot] = lo;
    this.recentNode[slot] = node;
    this.recentKind[slot] = kind;
    this.recentThunk[slot] = summary;
    this.count++;
    if (this.count - this.blockFirst === BLOCK) this.flush();
  }

  private flush(): void {
    const count = this.count - this.blockFirst;
    if (count === 0) return;
    const line: BlockLine = {
      first: this.blockFirst,
      count,
      start_ns: this.blockStart,
      time: this.times.base64(),
      event: this.codes.base64(),
      digest: this.digests.base64(),
    };
    this.out(`${this.firstBlock ? '' : ','}\n    ${JSON.stringify(line)}`);
    this.firstBlock = false;
    this.times.clear();
    this.codes.clear();
    this.digests.clear();
    this.blockFirst = this.count;
    this.blockStart = this.lastTime;
  }

  /** Writes the rest of the file: the last events in full, the stop, the final count and digest, and the checksum. */
  finish(stop: Stop, final: ReplayFinal): void {
    if (this.finished) return;
    this.finished = true;
    this.flush();
    const recent: ReplayEvent[] = [];
    for (let i = Math.max(0, this.count - RECENT); i < this.count; i++) {
      const k = i % RECENT;
      const t = this.recentThunk[k];
      recent.push({ index: i, time_ns: this.recentTime[k], node: this.recentNode[k], kind: this.recentKind[k], summary: t !== null && typeof t === 'object' ? t.summary : t, digest: hex(this.recentHi[k], this.recentLo[k]) });
    }
    const tail = recent.map((e) => `    ${JSON.stringify(e)}`).join(',\n');
    this.out(
      `${this.firstBlock ? '' : '\n  '}],\n  "recent": [${recent.length ? `\n${tail}\n  ` : ''}],\n` +
        `  "stop": ${JSON.stringify(stop)},\n  "final": ${JSON.stringify(final)},`,
    );
    const sum = this.hash.digest('hex');
    this.sink(`${CHECKSUM_LINE}"sha256:${sum}"\n}\n`);
  }
}

function hex(hi: number, lo: number): string {
  return (hi >>> 0).toString(16).padStart(8, '0') + (lo >>> 0).toString(16).padStart(8, '0');
}

/** The checksum a `@2` file should carry: SHA-256 of every byte before its checksum line. */
export function checksumV2(text: string): string | undefined {
  const at = text.lastIndexOf(CHECKSUM_LINE);
  if (at < 0) return undefined;
  return `sha256:${createHash('sha256').update(text.slice(0, at), 'utf8').digest('hex')}`;
}

/** A `@2` file's event columns from its parsed `tables`, `blocks` and `recent`; throws a plain Error naming what is wrong. */
export function decodeEvents(tables: { nodes: readonly string[]; kinds: readonly string[] }, blocks: readonly BlockLine[], recent: readonly ReplayEvent[]): ReplayEvents {
  if (tables.kinds.length !== KINDS.length || tables.kinds.some((k, i) => k !== KINDS[i])) throw new Error(`"tables.kinds" must be ${JSON.stringify(KINDS)}`);
  const cols = new EventColumns(tables.nodes, KINDS);
  let time = 0;
  for (const [b, block] of blocks.entries()) {
    if (block.first !== cols.length) throw new Error(`block ${b} starts at event ${block.first}, but ${cols.length} events come before it`);
    if (block.start_ns !== time) throw new Error(`block ${b} starts at ${block.start_ns} ns, but the event before it is at ${time} ns`);
    const times = new ByteSource(Buffer.from(block.time, 'base64'));
    const codes = new ByteSource(Buffer.from(block.event, 'base64'));
    const digests = new ByteSource(Buffer.from(block.digest, 'base64'));
    for (let i = 0; i < block.count; i++) {
      time += times.varint();
      const code = codes.varint();
      if (Math.floor(code / 3) >= tables.nodes.length) throw new Error(`block ${b}, event ${i}: node index ${Math.floor(code / 3)} is not in "tables.nodes"`);
      cols.push(time, code, digests.u32(), digests.u32());
    }
    if (!times.done || !codes.done || !digests.done) throw new Error(`block ${b} holds more than its ${block.count} events`);
  }
  for (const e of recent) {
    if (e.index < 0 || e.index >= cols.length || cols.digest(e.index) !== e.digest || cols.time(e.index) !== e.time_ns) {
      throw new Error(`"recent" event ${e.index} does not match the blocks`);
    }
    cols.setSummary(e.index, e.summary ?? undefined);
  }
  return cols;
}

/**
 * The text of a `@2` file with its checksum recomputed, as anyone can: the checksum only
 * catches accidents. Verify re-runs to the recorded stop, so a re-signed edit is still found.
 */
export function resignV2(text: string): string {
  const at = text.lastIndexOf(CHECKSUM_LINE);
  if (at < 0) throw new Error('not a @2 replay (no checksum line)');
  return `${text.slice(0, at)}${CHECKSUM_LINE}"${checksumV2(text)}"\n}\n`;
}
