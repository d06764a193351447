/**
 * Typed program set and noise model, as produced by model/ from the YAML files
 * (docs/format.md and docs/noise.md). Every user-facing element keeps its source position so that engine,
 * session and lint messages can point at file:line:col.
 */
import type { Compiled } from '../expr/index.js';

/** A place in an input file; line and col are 1-based. */
export interface SourcePos {
  readonly file: string;
  readonly line: number;
  readonly col: number;
}

/** An expression from a file: its compiled form plus where its text starts. */
export interface Expr {
  readonly compiled: Compiled;
  readonly pos: SourcePos;
  /**
   * Set when role parameters were substituted into the text (model/roles.ts): the text as
   * written in the file, so that positions still point at it (`exprPos`).
   */
  readonly written?: WrittenText;
}

/** The text of an expression as written, and how substitution changed it. */
export interface WrittenText {
  readonly source: string;
  /** Replacements in order: `[from, to)` of the written text became `text` at `at` in the compiled source. */
  readonly edits: readonly { readonly from: number; readonly to: number; readonly at: number; readonly text: string }[];
}

export interface NodeDef {
  readonly id: string;
  readonly qubits: number;
  readonly pos: SourcePos;
}

export interface LinkDef {
  /** "a~b" with the ends sorted. */
  readonly id: string;
  /** Sorted ends. */
  readonly ends: readonly [string, string];
  readonly lengthM: number;
  readonly slots: number;
  readonly pos: SourcePos;
}

export type Pick = 'oldest' | 'newest';

export type Guard = HaveGuard | HaveIdGuard | GotGuard | CheckGuard;

/** `have: {partner, stage, count, as, pick, min_age, max_age, min_wait, max_wait}`. */
export interface HaveGuard {
  readonly kind: 'have';
  readonly partner: Expr;
  readonly stage: string;
  readonly count: number;
  /** Names bound in pick order; may be empty (the guard only counts). */
  readonly as: readonly string[];
  readonly pick: Pick;
  readonly minAgeNs?: number;
  readonly maxAgeNs?: number;
  /** Bounds on the time since the pair entered its current stage at this node (`min_wait`, `max_wait`). */
  readonly minWaitNs?: number;
  readonly maxWaitNs?: number;
  readonly pos: SourcePos;
}

/** `have: {id, stage?, as}`. */
export interface HaveIdGuard {
  readonly kind: 'have-id';
  readonly id: Expr;
  readonly stage?: string;
  readonly as?: string;
  readonly pos: SourcePos;
}

/** `got: {from?, kind, as?}`. */
export interface GotGuard {
  readonly kind: 'got';
  readonly from?: Expr;
  readonly msgKind: string;
  readonly as?: string;
  readonly pos: SourcePos;
}

/** `check: "expr"`. */
export interface CheckGuard {
  readonly kind: 'check';
  readonly expr: Expr;
  readonly pos: SourcePos;
}

export type GateOp = 'x' | 'y' | 'z' | 'h' | 's' | 'sdg' | 't' | 'rx' | 'ry' | 'rz' | 'cnot' | 'cz' | 'swap';
export const GATE_OPS: readonly GateOp[] = ['x', 'y', 'z', 'h', 's', 'sdg', 't', 'rx', 'ry', 'rz', 'cnot', 'cz', 'swap'];
export const TWO_QUBIT_OPS: readonly GateOp[] = ['cnot', 'cz', 'swap'];
export const ANGLE_OPS: readonly GateOp[] = ['rx', 'ry', 'rz'];

export type Basis = 'z' | 'x' | 'y';

export type Step =
  | GateStep
  | MeasureStep
  | BellMeasureStep
  | SendStep
  | StageStep
  | NoteStep
  | CorrectStep
  | RebindStep
  | DiscardStep
  | DeliverStep
  | IfStep
  | LogStep;

export interface GateStep {
  readonly kind: 'gate';
  readonly op: GateOp;
  /** Bound pair names; one for single-qubit ops, two (control, target) for two-qubit ops. */
  readonly on: readonly string[];
  readonly angle?: Expr;
  readonly pos: SourcePos;
}
export interface MeasureStep {
  readonly kind: 'measure';
  readonly on: string;
  readonly basis: Basis;
  readonly as?: string;
  readonly pos: SourcePos;
}
export interface BellMeasureStep {
  readonly kind: 'bell_measure';
  readonly on: readonly [string, string];
  /** [zBitName, xBitName]. */
  readonly as: readonly [string, string];
  readonly pos: SourcePos;
}
export interface SendStep {
  readonly kind: 'send';
  readonly to: Expr;
  readonly msgKind: string;
  readonly pair?: Expr;
  readonly data: Readonly<Record<string, Expr>>;
  readonly pos: SourcePos;
}
export interface StageStep {
  readonly kind: 'stage';
  readonly pair: string;
  readonly to: string;
  readonly pos: SourcePos;
}
export interface NoteStep {
  readonly kind: 'note';
  readonly pair: string;
  readonly set: Readonly<Record<string, Expr>>;
  readonly pos: SourcePos;
}
export interface CorrectStep {
  readonly kind: 'correct';
  readonly pair: string;
  readonly x?: Expr;
  readonly z?: Expr;
  readonly pos: SourcePos;
}
export interface RebindStep {
  readonly kind: 'rebind';
  readonly pair: string;
  readonly partner?: Expr;
  readonly id?: Expr;
  readonly pos: SourcePos;
}
export interface DiscardStep {
  readonly kind: 'discard';
  readonly pair: string;
  readonly pos: SourcePos;
}
export interface DeliverStep {
  readonly kind: 'deliver';
  readonly pair: string;
  readonly pos: SourcePos;
}
export interface IfStep {
  readonly kind: 'if';
  readonly cond: Expr;
  readonly then: readonly Step[];
  readonly else: readonly Step[];
  readonly pos: SourcePos;
}
export interface LogStep {
  readonly kind: 'log';
  /** Literal text and `{expr}` holes, in order. */
  readonly parts: readonly (string | Expr)[];
  readonly pos: SourcePos;
}

export interface Rule {
  readonly name: string;
  readonly node: string;
  /** Position of the rule within its node's program (0-based). */
  readonly index: number;
  readonly when: readonly Guard[];
  readonly do: readonly Step[];
  /** Where the rule is written: in its role's list for a rule that came from a role. */
  readonly pos: SourcePos;
  /** Present when a role made the rule for this node. */
  readonly from?: RuleOrigin;
}

/** Where a rule that came from a role was written, and with what parameter values (docs/format.md, "Roles"). */
export interface RuleOrigin {
  readonly role: string;
  /** Index of the rule in the role's list. */
  readonly index: number;
  /** The node that plays the role. */
  readonly node: string;
  /** Parameter values in the role's order, as substituted (`s0`, `3`, `'near'`). */
  readonly args: readonly (readonly [string, string])[];
  /** Where the node's `use` entry for this role is. */
  readonly usePos: SourcePos;
  /** Index of that entry in the node's `use` list. */
  readonly use: number;
  /** `roles.repeater.rules[0] (at s8, left=s0 right=s16)`, as every message shows it. */
  readonly text: string;
}

export interface Program {
  readonly node: string;
  readonly rules: readonly Rule[];
  readonly pos: SourcePos;
}

export interface ProgramSet {
  readonly file: string;
  /** The file's full text, kept for replay files. */
  readonly text: string;
  readonly title: string;
  readonly nodes: readonly NodeDef[];
  readonly links: readonly LinkDef[];
  /** Keyed by node id; nodes without rules have no entry. */
  readonly programs: Readonly<Record<string, Program>>;
}

// ---------------------------------------------------------------- noise model

export type PairStateSpec =
  | { readonly kind: 'werner'; readonly f: number }
  | { readonly kind: 'bit_flip'; readonly f: number }
  | { readonly kind: 'bell_diagonal'; readonly coeffs: readonly [number, number, number, number] };

export type SuccessSpec =
  | { readonly kind: 'fixed'; readonly p: number }
  | {
      readonly kind: 'derived';
      readonly scheme: 'double-click' | 'single-click';
      readonly fiberLossDbPerKm: number;
      readonly detectorEfficiency: number;
      /** Bright-state population, single-click only. */
      readonly brightState?: number;
    };

export interface LinkNoise {
  readonly pair: PairStateSpec;
  readonly success: SuccessSpec;
  /** 'fiber' = link length over the fiber speed; else nanoseconds. */
  readonly attemptPeriod: 'fiber' | number;
}

export interface MemoryNoise {
  readonly t1Ns?: number;
  readonly t2Ns?: number;
}

export interface GateNoise {
  readonly single: { readonly depolarizing: number; readonly durationNs: number };
  readonly two: { readonly depolarizing: number; readonly durationNs: number };
  readonly measure: { readonly flip: number; readonly durationNs: number };
}

export interface ClassicalNoise {
  /** Metres per second. */
  readonly speedMPerS: number;
  /** Probability that a message is lost (sampled from the world's generator). */
  readonly loss: number;
  readonly extraDelayNs: number;
}

export interface NodeNoise {
  readonly memory: MemoryNoise;
  readonly gates: GateNoise;
}

/** Which messages a fault applies to; a field left out matches any. */
export interface FaultMatch {
  readonly from?: string;
  readonly to?: string;
  readonly msgKind?: string;
}

export type Fault =
  | ({ readonly kind: 'drop'; readonly nth: number; readonly pos: SourcePos } & FaultMatch)
  | ({ readonly kind: 'delay'; readonly byNs: number; readonly pos: SourcePos } & FaultMatch);

export interface NoiseModel {
  /** Empty when no noise file was given (the ideal model). */
  readonly file: string;
  readonly text: string;
  readonly seed: number;
  readonly defaults: {
    readonly link: LinkNoise;
    readonly memory: MemoryNoise;
    readonly gates: GateNoise;
    readonly classical: ClassicalNoise;
  };
  /** Per-link settings already merged over defaults.link. */
  readonly links: Readonly<Record<string, LinkNoise>>;
  /** Per-node settings already merged over the defaults. */
  readonly nodes: Readonly<Record<string, NodeNoise>>;
  readonly faults: readonly Fault[];
}
