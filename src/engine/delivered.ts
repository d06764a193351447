/**
 * Delivery records, kept compactly: column by column in one append-only log that every world
 * of a run shares. A world sees the log through a small frozen view (`count` records), so
 * appending never copies earlier records and a world's records never change. Each record
 * costs its id's bytes plus about 80 bytes, which keeps a run of millions of events flat in memory.
 */
import type { DeliveryRecord, World } from './types.js';

/** Numbers stored per record: time, fidelity, the four Bell coefficients and the earliest birth behind the pair. */
const NUMS = 7;

const encoder = new TextEncoder();
const decoder = new TextDecoder();

/** Entries per chunk of a chunked column: columns grow by whole chunks, never by copying. */
const CHUNK = 4096;

/** A growable list of 32-bit integers in fixed-size typed-array chunks (no object per entry, no copy on growth). */
class IntList {
  length = 0;
  private readonly chunks: Int32Array[] = [];

  push(x: number): void {
    const c = this.length >>> 12;
    if (c === this.chunks.length) this.chunks.push(new Int32Array(CHUNK));
    this.chunks[c][this.length & (CHUNK - 1)] = x;
    this.length++;
  }

  at(i: number): number {
    return this.chunks[i >>> 12][i & (CHUNK - 1)];
  }
}

/** A growable list of 64-bit floats, `width` per record, in fixed-size chunks of records. */
class FloatColumns {
  private readonly chunks: Float64Array[] = [];

  constructor(private readonly width: number) {}

  /** The chunk holding record k (created when k is the first record past the end), and the record's offset in it. */
  slot(k: number): [Float64Array, number] {
    const c = k >>> 12;
    if (c === this.chunks.length) this.chunks.push(new Float64Array(CHUNK * this.width));
    return [this.chunks[c], (k & (CHUNK - 1)) * this.width];
  }
}

/**
 * The shared log. Records are only ever appended; a world that is behind the log's head and
 * delivers a different record than the one stored next (a world edited by hand, or a run
 * from another start) gets a log of its own, so no world's records change under it. Records
 * live in typed arrays (numbers, ends as indices into a table of names, ids as UTF-8 bytes),
 * outside the garbage-collected heap: a million-event run keeps them in a few megabytes.
 */
export class DeliveryLog {
  /** Records stored. */
  length = 0;
  private readonly nums = new FloatColumns(NUMS);
  private readonly ends = new IntList();
  private readonly names: string[] = [];
  private readonly nameIndex = new Map<string, number>();
  /** Ids as UTF-8, in chunks of at least CHUNK_BYTES; a record's id never spans two chunks. */
  private readonly idChunks: Uint8Array[] = [];
  private idUsed = 0;
  /** Each record's id as (chunk, start, end) in `idChunks`. */
  private readonly idAt3 = new IntList();
  /** Indices of the records with each pair of ends ("a b", sorted) and with each end. */
  private readonly byEnds = new Map<string, IntList>();
  private readonly byNode = new Map<string, IntList>();

  /** Record k (k < length). */
  get(k: number): DeliveryRecord {
    const [n, o] = this.nums.slot(k);
    return {
      id: this.idAt(k),
      ends: [this.names[this.ends.at(2 * k)], this.names[this.ends.at(2 * k + 1)]],
      time_ns: n[o],
      fidelity: n[o + 1],
      bell: [n[o + 2], n[o + 3], n[o + 4], n[o + 5]],
      born_ns: n[o + 6],
    };
  }

  /** The id of record k. */
  idAt(k: number): string {
    return decoder.decode(this.idChunks[this.idAt3.at(3 * k)].subarray(this.idAt3.at(3 * k + 1), this.idAt3.at(3 * k + 2)));
  }

  /** Whether record k equals `r`, bit for bit. */
  matches(k: number, r: DeliveryRecord): boolean {
    const [n, o] = this.nums.slot(k);
    return (
      this.idAt(k) === r.id && this.names[this.ends.at(2 * k)] === r.ends[0] && this.names[this.ends.at(2 * k + 1)] === r.ends[1] &&
      Object.is(n[o], r.time_ns) && Object.is(n[o + 1], r.fidelity) && Object.is(n[o + 2], r.bell[0]) &&
      Object.is(n[o + 3], r.bell[1]) && Object.is(n[o + 4], r.bell[2]) && Object.is(n[o + 5], r.bell[3]) && Object.is(n[o + 6], r.born_ns)
    );
  }

  /** Appends a record. */
  push(r: DeliveryRecord): void {
    const k = this.length++;
    const [n, o] = this.nums.slot(k);
    n[o] = r.time_ns;
    n[o + 1] = r.fidelity;
    n[o + 2] = r.bell[0];
    n[o + 3] = r.bell[1];
    n[o + 4] = r.bell[2];
    n[o + 5] = r.bell[3];
    n[o + 6] = r.born_ns;
    this.ends.push(this.name(r.ends[0]));
    this.ends.push(this.name(r.ends[1]));
    // UTF-8 takes at most three bytes per UTF-16 unit
    const need = 3 * r.id.length;
    let chunk = this.idChunks[this.idChunks.length - 1];
    if (chunk === undefined || this.idUsed + need > chunk.length) {
      chunk = new Uint8Array(Math.max(CHUNK_BYTES, need));
      this.idChunks.push(chunk);
      this.idUsed = 0;
    }
    const { written } = encoder.encodeInto(r.id, chunk.subarray(this.idUsed));
    this.idAt3.push(this.idChunks.length - 1);
    this.idAt3.push(this.idUsed);
    this.idAt3.push(this.idUsed + written);
    this.idUsed += written;
    indexAt(this.byEnds, `${r.ends[0]} ${r.ends[1]}`, k);
    indexAt(this.byNode, r.ends[0], k);
    if (r.ends[1] !== r.ends[0]) indexAt(this.byNode, r.ends[1], k);
  }

  private name(s: string): number {
    let i = this.nameIndex.get(s);
    if (i === undefined) {
      i = this.names.length;
      this.names.push(s);
      this.nameIndex.set(s, i);
    }
    return i;
  }

  /** A log holding this one's first `count` records. */
  prefix(count: number): DeliveryLog {
    const out = new DeliveryLog();
    for (let k = 0; k < count; k++) out.push(this.get(k));
    return out;
  }

  /** Among the first `count` records, how many have both ends a and b (a ≤ b, or a = b for one end). */
  countWith(count: number, a: string, b?: string): number {
    const list = b === undefined || a === b ? this.byNode.get(a) : this.byEnds.get(a < b ? `${a} ${b}` : `${b} ${a}`);
    return list === undefined ? 0 : below(list, count);
  }
}

/** Bytes per chunk of ids. */
const CHUNK_BYTES = 1 << 16;

function indexAt(m: Map<string, IntList>, key: string, k: number): void {
  let list = m.get(key);
  if (list === undefined) {
    list = new IntList();
    m.set(key, list);
  }
  list.push(k);
}

/** How many entries of an ascending list are below n. */
function below(list: IntList, n: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (list.at(mid) < n) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * What a world sees of the delivery log: its first `count` records. The log itself is not
 * an enumerable field, so comparing and serialising worlds looks at what they hold (the
 * records, through `toJSON`), not at how far the shared log has grown since.
 */
export class DeliveredView {
  declare readonly log: DeliveryLog;

  constructor(
    log: DeliveryLog,
    readonly count: number,
    /** The lowest fidelity among them (1 when there are none). */
    readonly minFidelity: number,
  ) {
    Object.defineProperty(this, 'log', { value: log, enumerable: false });
  }

  toJSON(): { count: number; minFidelity: number; records: DeliveryRecord[] } {
    const records: DeliveryRecord[] = [];
    for (let k = 0; k < this.count; k++) records.push(this.log.get(k));
    return { count: this.count, minFidelity: this.minFidelity, records };
  }
}

/** Appends a delivery to a (draft) world. */
export function addDelivery(w: World, record: DeliveryRecord): void {
  const v = w.delivered;
  const count = v?.count ?? 0;
  let log = v?.log ?? new DeliveryLog();
  // a deterministic run that is behind the log's head delivers exactly the record stored next
  if (log.length > count && !log.matches(count, record)) log = log.prefix(count);
  if (log.length === count) log.push(record);
  w.delivered = new DeliveredView(log, count + 1, Math.min(v?.minFidelity ?? 1, record.fidelity));
}

/** Number of pairs delivered so far. */
export function deliveredCount(w: World): number {
  return w.delivered?.count ?? 0;
}

/** Pairs delivered so far with ends a and b (either may be left out). */
export function deliveredWith(w: World, a?: string, b?: string): number {
  const v = w.delivered;
  if (!v) return 0;
  if (a === undefined) return b === undefined ? v.count : v.log.countWith(v.count, b);
  return v.log.countWith(v.count, a, b);
}

/** Every delivery record, oldest first. */
export function deliveries(w: World): DeliveryRecord[] {
  const out: DeliveryRecord[] = [];
  for (const r of eachDelivery(w)) out.push(r);
  return out;
}

/** Delivery records oldest first, built one at a time (for output that streams). */
export function* eachDelivery(w: World): Generator<DeliveryRecord> {
  const v = w.delivered;
  if (!v) return;
  for (let k = 0; k < v.count; k++) yield v.log.get(k);
}

/** The newest delivery records first, visiting at most `limit`. */
export function* recentDeliveries(w: World, limit = Infinity): Generator<DeliveryRecord> {
  const v = w.delivered;
  if (!v) return;
  for (let k = v.count - 1, n = 0; k >= 0 && n < limit; k--, n++) yield v.log.get(k);
}

/** The newest delivery record with this pair id, if any. */
export function findDelivery(w: World, id: string): DeliveryRecord | undefined {
  const v = w.delivered;
  if (!v) return undefined;
  for (let k = v.count - 1; k >= 0; k--) if (v.log.idAt(k) === id) return v.log.get(k);
  return undefined;
}
