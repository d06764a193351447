/**
 * What a rule's expressions can see while its guards are tried and its body runs: node ids,
 * the pairs, messages and bits bound so far, and the program functions.
 */
import { baseFunctions } from '../expr/index.js';
import type { ExprFunction, Scope, Value, ValueRecord } from '../expr/types.js';
import { joinIds } from './ids.js';
import type { Net } from './net.js';
import type { Message, PairRecord, World } from './types.js';
import { heldHalf } from './pair-state.js';
import { SmallMap, SmallSet } from './small-map.js';

/** Mutable bindings of one rule attempt; the matcher undoes them when it backtracks. */
export class Bindings {
  readonly pairs = new SmallMap<string, number>();
  readonly messages = new SmallMap<string, Message>();
  readonly values = new SmallMap<string, Value>();
  readonly usedQubits = new SmallSet<number>();
  readonly usedMessages = new SmallSet<number>();
  /** Record views of bound messages, built once per attempt. */
  readonly messageViews = new SmallMap<number, ValueRecord>();
  /** The last record of bound pairs that left the node earlier in the body (measured, discarded, delivered). */
  readonly released = new SmallMap<string, PairRecord>();
  /** When each of them left (their age is read at that moment). */
  readonly releasedAt = new SmallMap<string, number>();
  /**
   * Set by whoever adds to the maps above, so that clearing an unused set of bindings (most
   * rule attempts fail at their first guard) costs one test.
   */
  dirty = false;

  clear(): void {
    if (!this.dirty) return;
    this.dirty = false;
    if (this.pairs.size) this.pairs.clear();
    if (this.messages.size) this.messages.clear();
    if (this.values.size) this.values.clear();
    if (this.usedQubits.size) this.usedQubits.clear();
    if (this.usedMessages.size) this.usedMessages.clear();
    if (this.messageViews.size) this.messageViews.clear();
    if (this.released.size) {
      this.released.clear();
      this.releasedAt.clear();
    }
  }
}

/** The record view of a held half: `id partner stage age born` and noted values. */
export function pairValue(rec: PairRecord, now: number): ValueRecord {
  // built field by field: an object spread followed by more keys is very slow in V8 here
  const v: Record<string, Value> = { id: rec.id, partner: rec.partner, stage: rec.stage, age: now - rec.born, born: rec.born };
  for (const k in rec.notes) v[k] = rec.notes[k];
  return v;
}

/** The record view of a message: `kind from to pair sent` and its data fields. */
export function messageValue(m: Message): ValueRecord {
  const v: Record<string, Value> = { kind: m.kind, from: m.from, to: m.to, pair: m.pair, sent: m.sent };
  for (const k in m.data) v[k] = m.data[k];
  return v;
}

/** `join(a, b)`: the shared id of the pair a swap of a and b makes, for programs and breakpoints alike. */
export const joinFunction: ExprFunction = (args) => {
  if (args.length !== 2 || typeof args[0] !== 'string' || typeof args[1] !== 'string') {
    throw new Error('join takes two pair ids (strings), e.g. join(a.id, m.pair)');
  }
  return joinIds(args[0], args[1]);
};

/** The functions node programs may call: the base library plus `join`, `age`, `waited` and `now`. */
export function programFunctions(at: { now: () => number; pairById: (id: string) => PairRecord | undefined }): Record<string, ExprFunction> {
  return Object.assign(Object.create(null) as Record<string, ExprFunction>, baseFunctions, {
    join: joinFunction,
    now: (args) => {
      if (args.length !== 0) throw new Error('now takes no arguments');
      return at.now();
    },
    age: (args) => {
      if (args.length !== 1) throw new Error('age takes one pair (a bound name or a pair id)');
      const a = args[0];
      if (typeof a === 'string') {
        const rec = at.pairById(a);
        if (!rec) throw new Error(`age: this node holds no pair "${a}"`);
        return at.now() - rec.born;
      }
      if (a !== null && typeof a === 'object' && !Array.isArray(a) && typeof (a as ValueRecord).born === 'number') {
        return at.now() - ((a as ValueRecord).born as number);
      }
      throw new Error('age takes a pair (a bound name or a pair id)');
    },
    // the record of a bound pair carries no stage-entry time: it is read from the held half
    waited: (args) => {
      const a = args[0];
      const id = typeof a === 'string' ? a : a !== null && typeof a === 'object' && !Array.isArray(a) ? (a as ValueRecord).id : undefined;
      if (typeof id !== 'string') throw new Error('waited takes a pair (a bound name or a pair id)');
      const rec = at.pairById(id);
      if (!rec) throw new Error(`waited: this node no longer holds pair "${id}"`);
      return at.now() - rec.entered;
    },
  } satisfies Record<string, ExprFunction>);
}

/** A scope over one node's bindings; one per node, reused for every scan via `reset`. */
export class RuleScope implements Scope {
  readonly functions: Readonly<Record<string, ExprFunction>>;
  /** Local time of the rule body (advances with operation durations). */
  now: number;
  private w: World;
  private node: string;

  constructor(
    private readonly net: Net,
    w: World,
    node: string,
    readonly bindings: Bindings,
  ) {
    this.w = w;
    this.node = node;
    this.now = w.time;
    this.functions = programFunctions({
      now: () => this.now,
      pairById: (id) => this.w.nodes[this.node].pairs.find((p) => p.id === id) ?? this.releasedById(id),
    });
  }

  /** The last record of a pair this rule's body measured, discarded or delivered, by its id. */
  private releasedById(id: string): PairRecord | undefined {
    for (const [, rec] of this.bindings.released) if (rec.id === id) return rec;
    return undefined;
  }

  /** Points the scope at another world and node, clearing its bindings. */
  reset(w: World, node: string = this.node): void {
    this.node = node;
    this.w = w;
    this.now = w.time;
    this.bindings.clear();
  }

  lookup(name: string): Value | undefined {
    const b = this.bindings;
    const q = b.pairs.get(name);
    if (q !== undefined) {
      const rec = heldHalf(this.w.nodes[this.node].pairs, q);
      // a pair freed earlier in the body still reads as its last record
      if (rec) return pairValue(rec, this.now);
      const gone = b.released.get(name);
      return gone ? pairValue(gone, b.releasedAt.get(name)!) : null;
    }
    const m = b.messages.get(name);
    if (m !== undefined) {
      let v = b.messageViews.get(m.id);
      if (!v) {
        v = messageValue(m);
        b.messageViews.set(m.id, v);
      }
      return v;
    }
    const v = b.values.get(name);
    if (v !== undefined) return v;
    if (this.net.nodeSet.has(name)) return name;
    return undefined;
  }

  member(name: string, field: string): Value | undefined {
    const b = this.bindings;
    const q = b.pairs.get(name);
    if (q !== undefined) {
      let rec = heldHalf(this.w.nodes[this.node].pairs, q);
      let now = this.now;
      if (rec === undefined) {
        // a pair freed earlier in the body reads as its last record (see lookup)
        rec = b.released.get(name);
        if (rec === undefined) return undefined;
        now = b.releasedAt.get(name)!;
      }
      // noted values shadow the record's own fields, as in pairValue; a missing field takes the general path
      if (Object.hasOwn(rec.notes, field)) return rec.notes[field];
      switch (field) {
        case 'id':
          return rec.id;
        case 'partner':
          return rec.partner;
        case 'stage':
          return rec.stage;
        case 'age':
          return now - rec.born;
        case 'born':
          return rec.born;
      }
      return undefined;
    }
    const m = b.messages.get(name);
    if (m !== undefined) {
      // data fields shadow the message's own fields, as in messageValue
      if (Object.hasOwn(m.data, field)) return m.data[field];
      switch (field) {
        case 'kind':
          return m.kind;
        case 'from':
          return m.from;
        case 'to':
          return m.to;
        case 'pair':
          return m.pair;
        case 'sent':
          return m.sent;
      }
    }
    return undefined;
  }

  listNames(): Iterable<string> {
    return [...this.bindings.pairs.keys(), ...this.bindings.messages.keys(), ...this.bindings.values.keys()];
  }
}
