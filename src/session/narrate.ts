/**
 * One plain sentence about an event, for the debugger's events pane and teaching mode: what
 * happened, which rules fired and what they did, in the words a person would use to
 * explain it at a whiteboard. Pure and headless, so tests and `run` can read it too.
 */
import { article } from '../model/words.js';
import type { EngineEvent, FireRecord, SendRecord } from '../engine/index.js';
import { formatDuration } from '../model/units.js';

const GATES = new Set(['x', 'y', 'z', 'h', 's', 'sdg', 't', 'rx', 'ry', 'rz', 'cnot', 'cz', 'swap']);

/** The short form `#3+4` of a pair id such as `quay~ridge#3+4`. */
function short(id: string): string {
  const hash = id.indexOf('#');
  return hash > 0 ? id.slice(hash) : id;
}

/** `a`, `a and b`, `a, b and c`. */
function andList(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/**
 * Rephrases one of the engine's action phrases (engine/fire.ts) in plainer words; a phrase
 * this does not recognise is kept as it is, so new actions still read sensibly.
 */
function plainAction(a: string): string {
  let m: RegExpExecArray | null;
  if ((m = /^Bell-measured (\S+) and (\S+): z=(\d) x=(\d)$/.exec(a))) {
    return `Bell-measured ${m[1]} and ${m[2]} (outcomes z=${m[3]}, x=${m[4]}), entangling their far ends`;
  }
  if ((m = /^measured (\S+) in (\w+): (\d)$/.exec(a))) return `measured ${m[1]} in the ${m[2]} basis and got ${m[3]}`;
  if ((m = /^sent (\S+) to (\S+)( \(lost\))?$/.exec(a))) return `sent ${article(m[1])} "${m[1]}" message to ${m[2]}${m[3] ? ' that was lost' : ''}`;
  if ((m = /^delivered its half of (\S+)$/.exec(a))) return `handed its half of ${m[1]} to the application`;
  if ((m = /^delivered (\S+) \(F ([0-9.]+)\)$/.exec(a))) {
    return `handed its half of ${m[1]} to the application, completing the pair at fidelity ${m[2]}`;
  }
  if ((m = /^corrected (\S+) \(none\)$/.exec(a))) return `found that ${m[1]} needed no correction`;
  if ((m = /^corrected (\S+) \((\w+)\)$/.exec(a))) return `corrected ${m[1]} with ${m[2].split('').join(' then ')}`;
  if ((m = /^(\S+) is now (\S+) with (\S+)$/.exec(a))) return `relabelled ${m[1]} as ${m[2]}, now shared with ${m[3]}`;
  if ((m = /^discarded (\S+)$/.exec(a))) return `discarded ${m[1]}`;
  if ((m = /^(\S+) → (\S+)$/.exec(a))) return `moved ${m[1]} to stage "${m[2]}"`;
  if ((m = /^(\w+) (.+)$/.exec(a)) && GATES.has(m[1])) {
    const on = m[2].split('→');
    if (on.length === 2) return m[1] === 'cnot' ? `applied cnot from ${on[0]} onto ${on[1]}` : `applied ${m[1]} to ${on[0]} and ${on[1]}`;
    return `applied ${m[1]} to ${m[2]}`;
  }
  return a;
}

function fireClause(f: FireRecord): string {
  const did = f.actions.map(plainAction);
  const logs = f.log.map((l) => `logged "${l}"`);
  const all = [...did, ...logs];
  return all.length ? `${f.node} ran ${f.rule}, which ${andList(all)}` : `${f.node} ran ${f.rule}, which did nothing`;
}

/** What set the event off, read from the event's fields and its one-line summary. */
function cause(ev: EngineEvent): string {
  const base = ev.summary.split('; fired ')[0];
  if (ev.type === 'herald') {
    const id = ev.pair ?? '';
    const link = id.includes('#') ? id.slice(0, id.indexOf('#')) : '';
    const ends = link.split('~');
    const f = /\(F ([0-9.]+)\)/.exec(base);
    const between = ends.length === 2 ? `the ${ends[0]}–${ends[1]} link` : 'a link';
    return `${between} produced pair ${short(id)}${f ? ` with fidelity ${f[1]}` : ''}`;
  }
  if (ev.type === 'arrive') {
    const m = /^(\S+) got (\S+) from (\S+)(?: about (\S+))?/.exec(base);
    if (m) return `${article(m[2])} "${m[2]}" message from ${m[3]} reached ${m[1]}${m[4] ? ` about pair ${m[4]}` : ''}`;
    return `a message reached ${ev.node}`;
  }
  const m = /^\S+ woke \((.*)\)$/.exec(base);
  return `${ev.node} woke up${m ? ` (${m[1]})` : ''}`;
}

function lostClause(s: SendRecord): string {
  return `the "${s.kind}" message from ${s.from} to ${s.to} was lost (${s.dropped})`;
}

/** The event at the cursor described in one plain sentence (the start of the run when null). */
export function narrate(event: EngineEvent | null): string {
  if (event === null) return 'Nothing has happened yet: the run is at its start, at time 0.';
  const parts: string[] = [`At ${formatDuration(event.time)}, ${cause(event)}`];
  if (event.fires.length === 0) {
    parts[0] += event.type === 'arrive' ? ', and no rule could use it yet, so it waits in the inbox' : ', and no rule fired';
  } else {
    parts[0] += `; then ${event.fires.map(fireClause).join('; then ')}`;
  }
  const lost = event.sends.filter((s) => s.dropped);
  if (lost.length) parts.push(andList(lost.map(lostClause)));
  return `${parts.join('; ')}.`;
}
