/**
 * What fields a rule can read, gathered once for the lint of rule bodies: the data each
 * sender of a message kind sets, and the values noted on pairs, by the stage a pair is in.
 * A pair's notes come only from `note` steps at its node, and it changes stage only by
 * `stage` steps there, so the values a pair in a stage can carry follow from the rules.
 */
import { MESSAGE_FIELDS, PAIR_FIELDS } from './build-steps.js';
import type { Facts } from './lint-facts.js';
import type { Kind } from './lint-types.js';
import type { ProgramSet, Rule, SendStep, Step } from './types.js';

/** `*`: a pair of any stage (bound by a have by id with no stage). */
const ANY = '*';

/** One pair name of a rule followed through its body: its stage and what is noted on it. */
interface Track {
  stage: string;
  noted: Set<string>;
  gone: boolean;
}

/** Every pair a rule binds: the stage it was bound in, and its states at the end of every path of the body. */
function ends(rule: Rule): Map<string, { bound: string; ends: Track[] }> {
  const start = new Map<string, Track>();
  for (const g of rule.when) {
    if (g.kind === 'have') for (const n of g.as) start.set(n, { stage: g.stage, noted: new Set(), gone: false });
    if (g.kind === 'have-id' && g.as) start.set(g.as, { stage: g.stage ?? ANY, noted: new Set(), gone: false });
  }
  const copy = (m: Map<string, Track>) => new Map([...m].map(([k, t]) => [k, { stage: t.stage, noted: new Set(t.noted), gone: t.gone }]));
  // both branches of an if are followed, so a path count can double per if: bodies are short
  const walk = (steps: readonly Step[], states: Map<string, Track>[]): Map<string, Track>[] => {
    let now = states;
    for (const s of steps) {
      if (s.kind === 'if') {
        now = [...walk(s.then, now.map(copy)), ...walk(s.else, now.map(copy))];
        continue;
      }
      const released = s.kind === 'measure' ? [s.on] : s.kind === 'discard' || s.kind === 'deliver' ? [s.pair] : s.kind === 'bell_measure' ? s.on : [];
      for (const st of now) {
        if (s.kind === 'stage') {
          const t = st.get(s.pair);
          if (t) t.stage = s.to;
        } else if (s.kind === 'note') {
          const t = st.get(s.pair);
          if (t) for (const k of Object.keys(s.set)) t.noted.add(k);
        }
        for (const n of released) {
          const t = st.get(n);
          if (t) t.gone = true;
        }
      }
    }
    return now;
  };
  const out = new Map<string, { bound: string; ends: Track[] }>();
  for (const [name, t] of start) out.set(name, { bound: t.stage, ends: [] });
  for (const st of walk(rule.do, [copy(start)])) for (const [name, t] of st) out.get(name)?.ends.push(t);
  return out;
}

/** The fields each sender of a kind sets, and the notes pairs in each stage may carry, gathered once. */
export class FieldIndex {
  /** Per node: the values a pair in each stage may carry (`*`: in any stage). */
  private readonly notes = new Map<string, Map<string, Set<string>>>();

  constructor(
    ps: ProgramSet,
    private readonly facts: Facts,
  ) {
    for (const program of Object.values(ps.programs)) this.notes.set(program.node, this.stageNotes(program.rules));
  }

  /** Which values pairs in each stage may carry at a node, to a fixed point over its rules. */
  private stageNotes(rules: readonly Rule[]): Map<string, Set<string>> {
    const inStage = new Map<string, Set<string>>();
    const add = (stage: string, keys: Iterable<string>): boolean => {
      const set = inStage.get(stage) ?? new Set<string>();
      const before = set.size;
      for (const k of keys) set.add(k);
      inStage.set(stage, set);
      return set.size > before;
    };
    const moves: { from: string; to: string }[] = [];
    for (const rule of rules) {
      for (const { bound, ends: outs } of ends(rule).values()) {
        for (const t of outs) {
          if (t.gone) continue;
          add(t.stage, t.noted);
          moves.push({ from: bound, to: t.stage });
        }
      }
    }
    // a pair keeps its notes when a rule moves it on: carry them along every move
    for (let changed = true; changed; ) {
      changed = false;
      for (const m of moves) {
        const from = m.from === ANY ? [...inStage.values()].flatMap((x) => [...x]) : [...(inStage.get(m.from) ?? [])];
        if (add(m.to, from)) changed = true;
      }
    }
    return inStage;
  }

  /** Whether some rule at `node` notes `key` on a pair at all. */
  notedAt(node: string, key: string): boolean {
    for (const keys of (this.notes.get(node) ?? new Map<string, Set<string>>()).values()) if (keys.has(key)) return true;
    return false;
  }

  /** Fields a message of this kind can have at `node` (from `from`), or undefined when no rule sends it there. */
  messageFields(msgKind: string, node: string, from: string | undefined): Set<string> | undefined {
    const senders = this.facts.sends.filter((s) => s.step.msgKind === msgKind && (s.to === undefined || s.to === node) && (from === undefined || s.node === from));
    if (senders.length === 0) return undefined;
    const out = new Set(MESSAGE_FIELDS);
    for (const s of senders) for (const k of Object.keys(s.step.data)) out.add(k);
    return out;
  }

  /** What each send's data values are, as far as the text tells (recorded by a first pass). */
  private readonly dataKinds = new Map<SendStep, Map<string, Kind>>();

  /** Records what the data values of a send are. */
  recordSend(step: SendStep, kinds: Map<string, Kind>): void {
    this.dataKinds.set(step, kinds);
  }

  /** What a data field of a message of this kind at `node` holds, when every sender agrees; else 'any'. */
  dataKind(msgKind: string, node: string, from: string | undefined, field: string): Kind {
    let out: Kind | undefined;
    for (const s of this.facts.sends) {
      if (s.step.msgKind !== msgKind || (s.to !== undefined && s.to !== node) || (from !== undefined && s.node !== from)) continue;
      const k = this.dataKinds.get(s.step)?.get(field);
      if (k === undefined) continue;
      if (out === undefined) out = k;
      else if (out !== k) return 'any';
    }
    return out ?? 'any';
  }

  /**
   * Fields a pair record can have when a rule at `node` bound it in `stage` (`*`: any) and
   * its body has noted `noted` on it so far: the built-in ones, and the values pairs in that
   * stage may carry.
   */
  pairFields(node: string, stage: string, noted: ReadonlySet<string>): Set<string> {
    const byStage = this.notes.get(node) ?? new Map<string, Set<string>>();
    const carried = stage === ANY ? [...byStage.values()].flatMap((x) => [...x]) : [...(byStage.get(stage) ?? []), ...(byStage.get(ANY) ?? [])];
    return new Set([...PAIR_FIELDS, ...carried, ...noted]);
  }
}
