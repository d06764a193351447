/** Loads a program set (`*.net.yaml`, FORMAT.md §1) into the typed value of types.ts. */
import { RuleScope, type Binding } from './bindings.js';
import { buildGuard, guardBindings, type RuleBuild } from './build-guards.js';
import { buildSteps, stepBindingSites } from './build-steps.js';
import { ExprCompiler } from './expressions.js';
import { FileCtx } from './file-ctx.js';
import { openFile } from './open-file.js';
import { programValidation, type RawProgramSet, type RawRule } from './schema-program.js';
import { didYouMean } from './suggest.js';
import type { Guard, LinkDef, NodeDef, Program, ProgramSet, Rule } from './types.js';
import { parseLength } from './units.js';
import type { Path } from './yaml-source.js';

/** The link id of two node ids: "a~b" with the ends sorted. */
export function linkId(a: string, b: string): string {
  return a < b ? `${a}~${b}` : `${b}~${a}`;
}

function buildNodes(ctx: FileCtx, raw: RawProgramSet): NodeDef[] {
  const seen = new Map<string, number>();
  const nodes: NodeDef[] = [];
  raw.nodes.forEach((n, i) => {
    const first = seen.get(n.id);
    if (first !== undefined) {
      ctx.error(['nodes', i, 'id'], { code: 'duplicate', message: `duplicate node id "${n.id}" (first declared at line ${ctx.pos(['nodes', first]).line})`, fix: 'give every node its own id' });
      return;
    }
    seen.set(n.id, i);
    nodes.push({ id: n.id, qubits: n.qubits, pos: ctx.pos(['nodes', i]) });
  });
  return nodes;
}

function buildLinks(ctx: FileCtx, raw: RawProgramSet, nodes: readonly NodeDef[]): LinkDef[] {
  const ids = nodes.map((n) => n.id);
  const links: LinkDef[] = [];
  const seen = new Map<string, number>();
  (raw.links ?? []).forEach((l, i) => {
    let ok = true;
    l.ends.forEach((end, j) => {
      if (!ids.includes(end)) {
        ok = false;
        ctx.error(['links', i, 'ends', j], { code: 'reference', message: `unknown node "${end}"${didYouMean(end, ids)}`, fix: 'declare it under "nodes", or fix the spelling' });
      }
    });
    if (l.ends[0] === l.ends[1]) {
      ok = false;
      ctx.error(['links', i, 'ends'], { code: 'reference', message: `a link joins two different nodes, got "${l.ends[0]}" twice`, fix: 'name the node at the other end' });
    }
    const id = linkId(l.ends[0], l.ends[1]);
    const first = seen.get(id);
    if (ok && first !== undefined) {
      ok = false;
      ctx.error(['links', i], { code: 'duplicate', message: `duplicate link ${id} (first declared at line ${ctx.pos(['links', first]).line})`, fix: 'declare each link once; raise its "slots" for more parallel pairs' });
    }
    const lengthM = ctx.unit(['links', i, 'length'], l.length, parseLength);
    if (!ok || lengthM === undefined) return;
    seen.set(id, i);
    const ends = [l.ends[0], l.ends[1]].sort() as [string, string];
    links.push({ id, ends, lengthM, slots: l.slots, pos: ctx.pos(['links', i]) });
  });
  nodes.forEach((n, i) => {
    const mine = links.filter((l) => l.ends.includes(n.id));
    const reserved = mine.reduce((s, l) => s + l.slots, 0);
    if (reserved > n.qubits) {
      const detail = mine.map((l) => `${l.slots} for ${l.id}`).join(', ');
      ctx.error(['nodes', i, 'qubits'], {
        code: 'schema',
        message: `node "${n.id}" has ${n.qubits} qubit${n.qubits === 1 ? '' : 's'} but its links reserve ${reserved} (${detail})`,
        fix: `raise qubits to at least ${reserved}, or lower the links' slots`,
      });
    }
  });
  return links;
}

function buildRule(rb: RuleBuild, raw: RawRule, path: Path, node: string, index: number): Rule {
  const { ctx } = rb;
  // Every binding in the rule, so a name read too early can be told where it gets bound.
  const all = new Map<string, Binding>();
  raw.when.forEach((g, i) => {
    for (const b of guardBindings(rb, g, [...path, 'when', i])) if (!all.has(b.name)) all.set(b.name, b);
  });
  const sites = new Map<string, { by: string; path: Path }>();
  stepBindingSites(raw.do, [...path, 'do'], sites);
  for (const [name, s] of sites) if (!all.has(name)) all.set(name, { name, kind: 'bit', by: s.by, pos: ctx.pos(s.path) });

  const scope = new RuleScope(rb.nodeIds, all, ctx.errors);
  const when: Guard[] = [];
  raw.when.forEach((g, i) => {
    const gp = [...path, 'when', i];
    const built = buildGuard(rb, g, gp, scope);
    if (built) when.push(built);
    for (const b of guardBindings(rb, g, gp)) scope.bind(b, gp);
  });
  const steps = buildSteps(rb, raw.do, [...path, 'do'], scope);
  return { name: raw.name, node, index, when, do: steps, pos: ctx.pos(path) };
}

function buildPrograms(ctx: FileCtx, raw: RawProgramSet, nodes: readonly NodeDef[]): Record<string, Program> {
  const ids = nodes.map((n) => n.id);
  const rb: RuleBuild = { ctx, ex: new ExprCompiler(ctx.src, ctx.errors), nodeIds: new Set(ids) };
  const programs: Record<string, Program> = {};
  for (const [node, prog] of Object.entries(raw.programs ?? {})) {
    if (!ids.includes(node)) {
      ctx.error(['programs'], { code: 'reference', message: `unknown node "${node}"${didYouMean(node, ids)}`, fix: 'programs are keyed by node ids declared under "nodes"' }, node);
      continue;
    }
    const names = new Map<string, number>();
    const rules = prog.rules.map((r, i) => {
      const path = ['programs', node, 'rules', i];
      const first = names.get(r.name);
      if (first !== undefined) {
        ctx.error([...path, 'name'], { code: 'duplicate', message: `duplicate rule name "${r.name}" at ${node} (first at line ${ctx.pos(['programs', node, 'rules', first]).line})`, fix: 'give every rule of a node its own name' });
      } else names.set(r.name, i);
      return buildRule(rb, r, path, node, i);
    });
    programs[node] = { node, rules, pos: ctx.src.keyPosAt(['programs'], node) };
  }
  return programs;
}

/** Parses and validates a program set; throws InputErrors naming file:line:col for anything wrong. */
export function loadProgramSet(file: string, text: string): ProgramSet {
  const { ctx, raw } = openFile<RawProgramSet>(file, text, 'program set', programValidation.programSet);
  const nodes = buildNodes(ctx, raw);
  const links = buildLinks(ctx, raw, nodes);
  const programs = buildPrograms(ctx, raw, nodes);
  ctx.throwIfErrors();
  return { file, text, title: raw.title ?? '', nodes, links, programs };
}
