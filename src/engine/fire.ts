/**
 * Running a rule body: the steps of docs/format.md, atomically, at the node's local time,
 * which advances with each operation's duration (sends leave when their step runs).
 */
import { formatValue } from '../expr/index.js';
import type { Value } from '../expr/types.js';
import type { Expr, Rule, Step } from '../model/types.js';
import { MAX_CLUSTER_QUBITS, ClusterTooLargeError } from '../quantum/index.js';
import { ProgramError } from './errors.js';
import { shortPairId } from './ids.js';
import { draw, releaseSlot } from './links.js';
import { evalIn, evalNode, truthy, type MatchContext } from './match.js';
import { send } from './messages.js';
import type { Net } from './net.js';
import { heldHalf, removeItem, twoQubitState } from './pair-state.js';
import { gate, measureQubit, traceOut, decayTo, earliestBirth } from './qubits.js';
import { bellCoefficients, fidelityPhiPlus } from '../quantum/index.js';
import type { EngineEvent, FireRecord, PairRecord } from './types.js';
import { addDelivery } from './delivered.js';
import { trace, traced } from './physics-trace.js';

interface BodyContext extends MatchContext {
  readonly net: Net;
  readonly rule: Rule;
  readonly ev: EngineEvent;
  readonly fire: FireRecord;
  /** Whether to record action phrases for the narration (off in headless runs). */
  readonly detail: boolean;
}

function fail(ctx: BodyContext, step: { pos: Step['pos'] }, message: string, fix?: string): never {
  throw new ProgramError(message, { pos: step.pos, node: ctx.node, rule: ctx.rule.name, fix });
}

type EventList = 'sends' | 'deliveries' | 'discards' | 'delivers';

/** Appends to one of the event's lists, which start as one shared, frozen empty list. */
function push<K extends EventList>(ev: EngineEvent, key: K, item: EngineEvent[K][number]): void {
  const list = ev[key] as EngineEvent[K][number][];
  if (list.length === 0) (ev[key] as EngineEvent[K][number][]) = [item];
  else list.push(item);
}

/** The record of a bound pair that is still held, or a program error. */
function held(ctx: BodyContext, name: string, step: Step): PairRecord {
  const qubit = ctx.scope.bindings.pairs.get(name);
  if (qubit === undefined) fail(ctx, step, `"${name}" is not a pair bound by this rule's guards`);
  const rec = heldHalf(ctx.w.nodes[ctx.node].pairs, qubit);
  if (!rec) fail(ctx, step, `pair "${name}" was already measured, discarded or delivered earlier in this rule`);
  return rec;
}

function bit(ctx: BodyContext, e: Expr | undefined, step: Step): 0 | 1 {
  if (!e) return 0;
  const v = evalIn(e, ctx.scope, ctx.node, ctx.rule.name);
  if (v === 1 || v === true) return 1;
  if (v === 0 || v === false) return 0;
  return fail(ctx, step, `"${e.compiled.source}" gave ${JSON.stringify(v)}, not a bit (0 or 1)`);
}

function value(ctx: BodyContext, e: Expr): Value {
  return evalIn(e, ctx.scope, ctx.node, ctx.rule.name);
}

/** A half leaves this node's memory; remember its last record so later steps can still read it. */
function release(ctx: BodyContext, name: string, rec: PairRecord): void {
  const node = ctx.w.nodes[ctx.node];
  ctx.scope.bindings.dirty = true;
  ctx.scope.bindings.released.set(name, rec);
  ctx.scope.bindings.releasedAt.set(name, ctx.scope.now);
  removeItem(node.pairs, rec);
  releaseSlot(ctx.net, ctx.w, rec.link, ctx.node, ctx.scope.now);
}

/** Rethrows an error of a gate step: a cluster over the cap is the program's mistake. */
function tooLarge(ctx: BodyContext, step: Step, e: unknown): never {
  if (e instanceof ClusterTooLargeError) fail(ctx, step, e.message, 'measure or discard halves before entangling more');
  throw e;
}

function deliver(ctx: BodyContext, name: string, rec: PairRecord): void {
  const w = ctx.w;
  const t = ctx.scope.now;
  decayTo(ctx.net, w, rec.qubit, t);
  w.qubits.get(rec.qubit)!.frozen = true;
  release(ctx, name, rec);
  push(ctx.ev, 'delivers', { node: ctx.node, pair: rec.id });
  // own entries only: a pair id chosen by a program may be a name every object has ("toString")
  const other = Object.hasOwn(w.halves, rec.id) ? w.halves[rec.id] : undefined;
  if (!other || other.node === ctx.node) {
    w.halves[rec.id] = { node: ctx.node, qubit: rec.qubit, time: t };
    if (ctx.detail) ctx.fire.actions.push(`delivered its half of ${shortPairId(rec.id)}`);
    return;
  }
  delete w.halves[rec.id];
  const [a, b] = ctx.node <= other.node ? [rec.qubit, other.qubit] : [other.qubit, rec.qubit];
  const rho = twoQubitState(ctx.net, w, a, b, t);
  if (trace) traced.bell(trace, rho.data);
  const ends: [string, string] = ctx.node <= other.node ? [ctx.node, other.node] : [other.node, ctx.node];
  const record = { id: rec.id, ends, time_ns: t, fidelity: fidelityPhiPlus(rho), bell: bellCoefficients(rho), born_ns: earliestBirth(w, a, b) };
  addDelivery(w, record);
  push(ctx.ev, 'deliveries', record);
  traceOut(w, a);
  traceOut(w, b);
  if (ctx.detail) ctx.fire.actions.push(`delivered ${shortPairId(rec.id)} (F ${record.fidelity.toFixed(3)})`);
}

/** Runs a block of steps. */
export function runSteps(ctx: BodyContext, steps: readonly Step[]): void {
  const w = ctx.w;
  const noise = ctx.net.nodeNoise(ctx.node).gates;
  const scope = ctx.scope;
  for (const step of steps) {
    switch (step.kind) {
      case 'gate': {
        const r1 = held(ctx, step.on[0], step);
        const r2 = step.on.length === 2 ? held(ctx, step.on[1], step) : undefined;
        decayTo(ctx.net, w, r1.qubit, scope.now);
        if (r2) decayTo(ctx.net, w, r2.qubit, scope.now);
        const angle = step.angle ? value(ctx, step.angle) : undefined;
        if (angle !== undefined && typeof angle !== 'number') fail(ctx, step, `angle "${step.angle!.compiled.source}" is not a number`);
        // arithmetic can overflow to Infinity (1e308 * 10): a rotation by it means nothing
        if (angle !== undefined && !Number.isFinite(angle)) fail(ctx, step, `angle "${step.angle!.compiled.source}" gave ${String(angle)}, not a finite number of radians`, 'keep the angle\'s arithmetic within the range of numbers');
        try {
          gate(ctx.net, w, step.op, r1.qubit, r2 ? r2.qubit : -1, angle as number | undefined, MAX_CLUSTER_QUBITS);
        } catch (e) {
          tooLarge(ctx, step, e);
        }
        scope.now += r2 ? noise.two.durationNs : noise.single.durationNs;
        if (ctx.detail) ctx.fire.actions.push(`${step.op} ${r2 ? `${shortPairId(r1.id)}→${shortPairId(r2.id)}` : shortPairId(r1.id)}`);
        break;
      }
      case 'measure': {
        const rec = held(ctx, step.on, step);
        decayTo(ctx.net, w, rec.qubit, scope.now);
        const b = measureQubit(ctx.net, w, rec.qubit, step.basis, draw(w));
        release(ctx, step.on, rec);
        if (step.as) {
          scope.bindings.dirty = true;
          scope.bindings.values.set(step.as, b);
        }
        scope.now += noise.measure.durationNs;
        if (ctx.detail) ctx.fire.actions.push(`measured ${shortPairId(rec.id)} in ${step.basis}: ${b}`);
        break;
      }
      case 'bell_measure': {
        const r1 = held(ctx, step.on[0], step);
        const r2 = held(ctx, step.on[1], step);
        decayTo(ctx.net, w, r1.qubit, scope.now);
        decayTo(ctx.net, w, r2.qubit, scope.now);
        try {
          gate(ctx.net, w, 'cnot', r1.qubit, r2.qubit, undefined, MAX_CLUSTER_QUBITS);
          gate(ctx.net, w, 'h', r1.qubit, -1, undefined, MAX_CLUSTER_QUBITS);
        } catch (e) {
          tooLarge(ctx, step, e);
        }
        const zb = measureQubit(ctx.net, w, r1.qubit, 'z', draw(w));
        const xb = measureQubit(ctx.net, w, r2.qubit, 'z', draw(w));
        release(ctx, step.on[0], r1);
        release(ctx, step.on[1], r2);
        scope.bindings.dirty = true;
        scope.bindings.values.set(step.as[0], zb);
        scope.bindings.values.set(step.as[1], xb);
        scope.now += noise.two.durationNs + noise.single.durationNs + noise.measure.durationNs;
        if (ctx.detail) ctx.fire.actions.push(`Bell-measured ${shortPairId(r1.id)} and ${shortPairId(r2.id)}: z=${zb} x=${xb}`);
        break;
      }
      case 'send': {
        const to = evalNode(step.to, ctx, ctx.rule.name);
        const pair = step.pair ? value(ctx, step.pair) : null;
        if (pair !== null && typeof pair !== 'string') fail(ctx, step, `pair "${step.pair!.compiled.source}" is not a pair id`);
        const data: Record<string, Value> = {};
        for (const k in step.data) data[k] = value(ctx, step.data[k]);
        if (!Number.isFinite(ctx.net.distance(ctx.node, to))) {
          fail(ctx, step, `no fiber path from ${ctx.node} to ${to}`, 'send only to nodes connected through links');
        }
        const rec = send(ctx.net, w, { from: ctx.node, to, kind: step.msgKind, pair: pair as string | null, data }, scope.now);
        push(ctx.ev, 'sends', rec);
        if (ctx.detail) ctx.fire.actions.push(`sent ${step.msgKind} to ${to}${rec.dropped ? ' (lost)' : ''}`);
        break;
      }
      case 'stage': {
        const rec = held(ctx, step.pair, step);
        rec.stage = step.to;
        // the stage timer restarts at the step's local time (min_wait, max_wait, waited())
        rec.entered = scope.now;
        if (ctx.detail) ctx.fire.actions.push(`${shortPairId(rec.id)} → ${step.to}`);
        break;
      }
      case 'note': {
        const rec = held(ctx, step.pair, step);
        // notes are shared until first written (a fresh pair's are one frozen empty record)
        if (Object.isFrozen(rec.notes)) {
          const own: Record<string, Value> = {};
          for (const k in rec.notes) own[k] = rec.notes[k];
          rec.notes = own;
        }
        for (const k in step.set) rec.notes[k] = value(ctx, step.set[k]);
        break;
      }
      case 'correct': {
        const rec = held(ctx, step.pair, step);
        const x = bit(ctx, step.x, step);
        const z = bit(ctx, step.z, step);
        decayTo(ctx.net, w, rec.qubit, scope.now);
        if (x) {
          gate(ctx.net, w, 'x', rec.qubit, -1, undefined, MAX_CLUSTER_QUBITS);
          scope.now += noise.single.durationNs;
        }
        if (z) {
          gate(ctx.net, w, 'z', rec.qubit, -1, undefined, MAX_CLUSTER_QUBITS);
          scope.now += noise.single.durationNs;
        }
        if (ctx.detail) ctx.fire.actions.push(`corrected ${shortPairId(rec.id)}${x || z ? ` (${x ? 'X' : ''}${z ? 'Z' : ''})` : ' (none)'}`);
        break;
      }
      case 'rebind': {
        const rec = held(ctx, step.pair, step);
        const before = rec.id;
        if (step.partner) rec.partner = evalNode(step.partner, ctx, ctx.rule.name);
        if (step.id) {
          const id = value(ctx, step.id);
          if (typeof id !== 'string') fail(ctx, step, `id "${step.id.compiled.source}" gave ${JSON.stringify(id)}, not a pair id`);
          if (id === '__proto__') fail(ctx, step, `id "${step.id.compiled.source}" gave "__proto__", which cannot be a pair id`, 'give the pair an id of your own, e.g. join(a.id, m.pair)');
          rec.id = id;
        }
        if (ctx.detail) ctx.fire.actions.push(`${shortPairId(before)} is now ${shortPairId(rec.id)} with ${rec.partner}`);
        break;
      }
      case 'discard': {
        const rec = held(ctx, step.pair, step);
        traceOut(w, rec.qubit);
        release(ctx, step.pair, rec);
        push(ctx.ev, 'discards', { node: ctx.node, pair: rec.id });
        if (ctx.detail) ctx.fire.actions.push(`discarded ${shortPairId(rec.id)}`);
        break;
      }
      case 'deliver':
        deliver(ctx, step.pair, held(ctx, step.pair, step));
        break;
      case 'if':
        runSteps(ctx, truthy(value(ctx, step.cond), step.cond, ctx.node, ctx.rule.name) ? step.then : step.else);
        break;
      case 'log':
        {
        const line = step.parts.map((p) => (typeof p === 'string' ? p : formatValue(value(ctx, p)))).join('');
        if (ctx.fire.log.length === 0) ctx.fire.log = [line];
        else ctx.fire.log.push(line);
      }
        break;
    }
  }
}
