/**
 * The debugger functions of docs/expressions.md, for breakpoints, watches and expectations. They
 * read a world (never change it) and are evaluated with the same expression language as
 * node programs.
 */
import { baseFunctions } from '../expr/index.js';
import type { ExprFunction, Scope, Value } from '../expr/types.js';
import { deliveredWith, farHalf, findDelivery, hasNext, joinFunction, quiescence, twoQubitState, type Net, type World } from '../engine/index.js';
import { bellCoefficients, fidelityPhiPlus } from '../quantum/index.js';
import { DEBUGGER_FUNCTIONS } from '../model/index.js';

/** The debugger functions (docs/expressions.md); the model layer keeps the list, so programs are told they are for breakpoints. */
export const DEBUG_FUNCTION_NAMES = DEBUGGER_FUNCTIONS;

function str(name: string, v: Value | undefined, what: string): string | undefined {
  if (v === undefined || v === null) return undefined;
  if (typeof v !== 'string') throw new Error(`${name}: ${what} must be a string, got ${JSON.stringify(v)}`);
  return v;
}

function node(net: Net, name: string, v: Value | undefined, what: string): string | undefined {
  const s = str(name, v, what);
  if (s !== undefined && !net.nodeSet.has(s)) throw new Error(`${name}: "${s}" is not a node (nodes: ${net.nodeIds.join(', ')})`);
  return s;
}

/** The two halves of a held pair with this id, ends in sorted order, or undefined. */
export function locatePair(w: World, id: string): [number, number] | undefined {
  for (const n of Object.keys(w.nodes).sort()) {
    for (const rec of Object.values(w.nodes[n].pairs)) {
      if (rec.id !== id || rec.partner < n) continue;
      const far = farHalf(w, n, rec.qubit);
      if (far) return [rec.qubit, far];
    }
  }
  return undefined;
}

/** Fidelity and Bell coefficients of a pair id: held (decayed to now) or delivered. */
export function pairTruth(net: Net, w: World, id: string): { fidelity: number; bell: [number, number, number, number] } | undefined {
  const held = locatePair(w, id);
  if (held) {
    const rho = twoQubitState(net, w, held[0], held[1], w.time);
    return { fidelity: fidelityPhiPlus(rho), bell: bellCoefficients(rho) };
  }
  const d = findDelivery(w, id);
  return d ? { fidelity: d.fidelity, bell: [...d.bell] as [number, number, number, number] } : undefined;
}

/** Debugger functions over one world. */
export function debugFunctions(net: Net, w: World): Record<string, ExprFunction> {
  const truth = (name: string, args: readonly Value[]) => {
    if (args.length !== 1 || typeof args[0] !== 'string') throw new Error(`${name} takes one pair id, e.g. ${name}("mill~quay#3")`);
    const t = pairTruth(net, w, args[0]);
    if (!t) throw new Error(`${name}: no pair "${args[0]}" is held at both ends or delivered`);
    return t;
  };
  return Object.assign(Object.create(null) as Record<string, ExprFunction>, baseFunctions, {
    join: joinFunction,
    fidelity: (args) => truth('fidelity', args).fidelity,
    bell: (args) => truth('bell', args).bell,
    pairs: (args) => {
      const at = node(net, 'pairs', args[0], 'NODE');
      if (!at) throw new Error('pairs takes a node, e.g. pairs(mill) or pairs(mill, quay, "link")');
      const partner = node(net, 'pairs', args[1], 'PARTNER');
      const stage = str('pairs', args[2], 'STAGE');
      return Object.values(w.nodes[at].pairs).filter(
        (p) => (partner === undefined || p.partner === partner) && (stage === undefined || p.stage === stage),
      ).length;
    },
    inflight: (args) => {
      const from = node(net, 'inflight', args[0], 'FROM');
      const to = node(net, 'inflight', args[1], 'TO');
      const kind = str('inflight', args[2], 'KIND');
      return [...w.inflight.values()].filter(
        (m) => (from === undefined || m.from === from) && (to === undefined || m.to === to) && (kind === undefined || m.kind === kind),
      ).length;
    },
    delivered: (args) => {
      const a = node(net, 'delivered', args[0], 'A');
      const b = node(net, 'delivered', args[1], 'B');
      return deliveredWith(w, a, b);
    },
    // the minimum over no deliveries is 1, the identity for a minimum of fidelities
    min_fidelity_delivered: () => w.delivered?.minFidelity ?? 1,
    fired: (args) => {
      const at = node(net, 'fired', args[0], 'NODE');
      const rule = str('fired', args[1], 'RULE');
      if (!at || rule === undefined) throw new Error('fired takes a node and a rule name, e.g. fired(mill, "swap")');
      if (!(net.rules.get(at) ?? []).some((r) => r.name === rule)) {
        throw new Error(`fired: ${at} has no rule "${rule}" (rules: ${(net.rules.get(at) ?? []).map((r) => r.name).join(', ') || 'none'})`);
      }
      return w.nodes[at].fired[rule] ?? 0;
    },
    stalled: () => !hasNext(w) && quiescence(w) === 'stall',
    time: () => w.time,
    event: () => w.events,
  } satisfies Record<string, ExprFunction>);
}

/** A scope for debugger expressions: node ids as names, plus extra bindings. */
export function debugScope(net: Net, w: World, extra?: ReadonlyMap<string, Value>): Scope {
  const functions = debugFunctions(net, w);
  return {
    functions,
    lookup: (name) => extra?.get(name) ?? (net.nodeSet.has(name) ? name : undefined),
    listNames: () => [...net.nodeIds, ...(extra?.keys() ?? [])],
  };
}
