/**
 * Breakpoints (docs/expressions.md): a condition over the debugger functions, or an event form
 * (`on fire NODE.RULE`, `on send KIND`, `on deliver`, `on discard`, `on stall`).
 * A condition hits when it becomes true (false before the event, true after it). A name
 * in a condition that is not a node id stands for any held pair id: `fidelity(p) < 0.9`
 * hits when some pair's fidelity drops below 0.9.
 */
import { evaluate, ExprError, formatValue, parseExpr, closest } from '../expr/index.js';
import type { Compiled, Value } from '../expr/types.js';
import { InputError } from '../model/errors.js';
import type { EngineEvent, Net, World } from '../engine/index.js';
import { debugScope } from './debug-functions.js';
import { checkDebugExpr } from './expr-check.js';

export type BreakKind = 'condition' | 'fire' | 'send' | 'deliver' | 'discard' | 'stall';

export interface Breakpoint {
  readonly id: number;
  /** The text as the user wrote it. */
  readonly spec: string;
  readonly kind: BreakKind;
  readonly enabled: boolean;
  readonly hits: number;
  readonly compiled?: Compiled;
  /** Names in the condition that range over held pair ids. */
  readonly pairVars: readonly string[];
  readonly node?: string;
  readonly rule?: string;
  readonly msgKind?: string;
}

/** A breakpoint that could not be evaluated: a clear error, never a silent false. */
export class BreakpointError extends Error {
  constructor(
    readonly breakpoint: Breakpoint,
    message: string,
  ) {
    super(`breakpoint ${breakpoint.id} (${breakpoint.spec}): ${message}`);
    this.name = 'BreakpointError';
  }
}

export { ALLOWED_CALLS } from './expr-check.js';

function usage(message: string, fix: string, field = 'breakpoint'): InputError {
  return new InputError({ code: 'usage', field, message, fix });
}

/** Message kinds that some rule sends, for checking and completing `on send KIND`. */
export function sentKinds(net: Net): Set<string> {
  const kinds = new Set<string>();
  const visit = (steps: readonly import('../model/types.js').Step[]): void => {
    for (const s of steps) {
      if (s.kind === 'send') kinds.add(s.msgKind);
      if (s.kind === 'if') {
        visit(s.then);
        visit(s.else);
      }
    }
  };
  for (const rules of net.rules.values()) for (const r of rules) visit(r.do);
  return kinds;
}

/** Parses a breakpoint (or watch) spec against a network; throws InputError with a fix when it is wrong. */
export function parseBreakpoint(net: Net, spec: string, id: number, field = 'breakpoint'): Breakpoint {
  const text = spec.trim();
  const base = { id, spec: text, enabled: true, hits: 0, pairVars: [] as string[] };
  const on = /^on\s+(\S+)(?:\s+(.*))?$/.exec(text);
  if (on) {
    const [, what, arg = ''] = on;
    const a = arg.trim();
    switch (what) {
      case 'fire': {
        const m = /^([a-z][a-z0-9-]*)\.([A-Za-z_][A-Za-z0-9_-]*)$/.exec(a);
        if (!m) throw usage(`"on fire" needs NODE.RULE, got "${a}"`, 'write e.g. "on fire mill.swap"', field);
        const [, node, rule] = m;
        if (!net.nodeSet.has(node)) {
          const near = closest(node, net.nodeIds);
          throw usage(`unknown node "${node}"${near ? ` (did you mean "${near}"?)` : ''}`, `use one of: ${net.nodeIds.join(', ')}`, field);
        }
        const names = (net.rules.get(node) ?? []).map((r) => r.name);
        if (!names.includes(rule)) {
          const near = closest(rule, names);
          throw usage(`${node} has no rule "${rule}"${near ? ` (did you mean "${near}"?)` : ''}`, `rules of ${node}: ${names.join(', ') || 'none'}`, field);
        }
        return { ...base, kind: 'fire', node, rule };
      }
      case 'send': {
        if (!a) throw usage('"on send" needs a message kind', 'write e.g. "on send parity"', field);
        const kinds = sentKinds(net);
        if (!kinds.has(a)) {
          const near = closest(a, [...kinds]);
          throw usage(`no rule sends "${a}"${near ? ` (did you mean "${near}"?)` : ''}`, `kinds sent: ${[...kinds].sort().join(', ') || 'none'}`, field);
        }
        return { ...base, kind: 'send', msgKind: a };
      }
      case 'deliver':
      case 'discard':
      case 'stall':
        if (a) throw usage(`"on ${what}" takes nothing after it, got "${a}"`, `write "on ${what}"`, field);
        return { ...base, kind: what };
      default:
        throw usage(`unknown event form "on ${what}"`, 'use on fire NODE.RULE, on send KIND, on deliver, on discard or on stall', field);
    }
  }
  let compiled: Compiled;
  try {
    compiled = parseExpr(text);
  } catch (e) {
    if (e instanceof ExprError) throw usage(`${e.detail} at column ${e.col} of "${text}"`, `check the expression:\n${e.excerpt()}`, field);
    throw e;
  }
  const pairVars = checkDebugExpr(net, text, compiled, { field, what: field === 'watch' ? 'watch' : 'breakpoint', pairVars: true });
  return { ...base, kind: 'condition', compiled, pairVars };
}

/** Every assignment of held pair ids to the breakpoint's pair variables. */
function assignments(w: World, vars: readonly string[]): Map<string, Value>[] {
  if (vars.length === 0) return [new Map()];
  const ids = new Set<string>();
  for (const n of Object.values(w.nodes)) for (const p of Object.values(n.pairs)) ids.add(p.id);
  const sorted = [...ids].sort();
  let out: Map<string, Value>[] = [new Map()];
  for (const v of vars) out = out.flatMap((m) => sorted.map((id) => new Map(m).set(v, id)));
  return out;
}

/**
 * Whether a condition breakpoint holds in a world, and for which pair binding. Errors
 * (other than the pair of a binding not being fully held) become BreakpointError.
 */
export function conditionHolds(net: Net, w: World, bp: Breakpoint): { holds: boolean; binding?: string; value?: Value } {
  if (!bp.compiled) return { holds: false };
  for (const a of assignments(w, bp.pairVars)) {
    let v: Value;
    try {
      v = evaluate(bp.compiled, debugScope(net, w, a));
    } catch (e) {
      // a pair held at one end only (mid-swap) is skipped for pair variables
      if (bp.pairVars.length > 0 && e instanceof ExprError && /is held at both ends/.test(e.detail)) continue;
      const msg = e instanceof ExprError ? e.detail : e instanceof Error ? e.message : String(e);
      throw new BreakpointError(bp, `cannot be evaluated at event ${w.events}: ${msg}`);
    }
    if (v === true || v === 1) {
      const binding = [...a].map(([k, x]) => `${k} = ${formatValue(x)}`).join(', ');
      return { holds: true, binding: binding || undefined, value: v };
    }
    if (v !== false && v !== 0) throw new BreakpointError(bp, `gave ${formatValue(v)}, not true or false`);
  }
  return { holds: false };
}

/** Whether an event-form breakpoint is hit by an event. */
export function eventHits(bp: Breakpoint, ev: EngineEvent): string | undefined {
  switch (bp.kind) {
    case 'fire':
      return ev.fires.some((f) => f.node === bp.node && f.rule === bp.rule) ? `${bp.node}.${bp.rule} fired` : undefined;
    case 'send': {
      const s = ev.sends.find((x) => x.kind === bp.msgKind);
      return s ? `${s.from} sent ${s.kind} to ${s.to}` : undefined;
    }
    case 'deliver': {
      const d = ev.delivers[0];
      return d ? `${d.node} delivered ${d.pair}` : undefined;
    }
    case 'discard': {
      const d = ev.discards[0];
      return d ? `${d.node} discarded ${d.pair}` : undefined;
    }
    default:
      return undefined;
  }
}

/** A breakpoint hit: which breakpoint, and what hit it in words. */
export interface Hit {
  readonly bp: Breakpoint;
  readonly what: string;
}

/**
 * A function that says, event by event, which enabled breakpoint (if any) the event hits,
 * starting from the world `start`. Condition breakpoints hit when they change from false
 * to true, so it keeps each condition's last value; `on stall` is decided by the caller.
 */
export function breakpointScanner(net: Net, breakpoints: readonly Breakpoint[], start: World): (ev: EngineEvent, w: World) => Hit | undefined {
  const active = breakpoints.filter((b) => b.enabled && b.kind !== 'stall');
  const held = new Map(active.filter((b) => b.kind === 'condition').map((b) => [b.id, conditionHolds(net, start, b).holds]));
  return (ev, w) => {
    let found: Hit | undefined;
    for (const bp of active) {
      let what: string | undefined;
      if (bp.kind === 'condition') {
        const now = conditionHolds(net, w, bp);
        if (now.holds && !held.get(bp.id)) what = `${bp.spec}${now.binding ? ` (${now.binding})` : ''}`;
        held.set(bp.id, now.holds);
      } else what = eventHits(bp, ev);
      if (what && !found) found = { bp, what };
    }
    return found;
  };
}
