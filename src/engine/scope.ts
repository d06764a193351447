/**
 * What a rule's expressions can see while its guards are tried and its body runs: node ids,
 * the pairs, messages and bits bound so far, and the program functions.
 */
import { baseFunctions } from '../expr/index.js';
import type { ExprFunction, Scope, Value, ValueRecord } from '../expr/types.js';
import { joinIds } from './ids.js';
import type { Net } from './net.js';
import type { Message, PairRecord, World } from './types.js';

/** Mutable bindings of one rule attempt; the matcher undoes them when it backtracks. */
export class Bindings {
  readonly pairs = new Map<string, string>();
  readonly messages = new Map<string, Message>();
  readonly values = new Map<string, Value>();
  readonly usedQubits = new Set<string>();
  readonly usedMessages = new Set<string>();

  clear(): void {
    this.pairs.clear();
    this.messages.clear();
    this.values.clear();
    this.usedQubits.clear();
    this.usedMessages.clear();
  }
}

/** The record view of a held half: `id partner stage age born` and noted values. */
export function pairValue(rec: PairRecord, now: number): ValueRecord {
  return { ...rec.notes, id: rec.id, partner: rec.partner, stage: rec.stage, age: now - rec.born, born: rec.born };
}

/** The record view of a message: `kind from to pair sent` and its data fields. */
export function messageValue(m: Message): ValueRecord {
  return { ...m.data, kind: m.kind, from: m.from, to: m.to, pair: m.pair, sent: m.sent };
}

/** The functions node programs may call: the base library plus `join`, `age` and `now`. */
export function programFunctions(at: { now: () => number; pairById: (id: string) => PairRecord | undefined }): Record<string, ExprFunction> {
  return {
    ...baseFunctions,
    join: (args) => {
      if (args.length !== 2 || typeof args[0] !== 'string' || typeof args[1] !== 'string') {
        throw new Error('join takes two pair ids (strings), e.g. join(a.id, m.pair)');
      }
      return joinIds(args[0], args[1]);
    },
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
  };
}

/** A scope over one node's bindings, reused across the rules of one scan. */
export class RuleScope implements Scope {
  readonly functions: Readonly<Record<string, ExprFunction>>;
  /** Local time of the rule body (advances with operation durations). */
  now: number;

  constructor(
    private readonly net: Net,
    private readonly w: World,
    private readonly node: string,
    readonly bindings: Bindings,
  ) {
    this.now = w.time;
    this.functions = programFunctions({
      now: () => this.now,
      pairById: (id) => Object.values(this.w.nodes[this.node].pairs).find((p) => p.id === id),
    });
  }

  lookup(name: string): Value | undefined {
    const b = this.bindings;
    const q = b.pairs.get(name);
    if (q !== undefined) {
      const rec = this.w.nodes[this.node].pairs[q];
      // a pair freed earlier in the body still reads as its last record
      return rec ? pairValue(rec, this.now) : (b.values.get(`\u0000pair:${name}`) ?? null);
    }
    const m = b.messages.get(name);
    if (m !== undefined) return messageValue(m);
    const v = b.values.get(name);
    if (v !== undefined) return v;
    if (this.net.nodeSet.has(name)) return name;
    return undefined;
  }

  listNames(): Iterable<string> {
    return [...this.bindings.pairs.keys(), ...this.bindings.messages.keys(), ...this.bindings.values.keys()].filter(
      (n) => !n.startsWith('\u0000'),
    );
  }
}
