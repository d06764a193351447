/** Loads a program set (`*.net.yaml`, docs/format.md) into the typed value of types.ts. */
import { CONSTANTS } from '../expr/index.js';
import type { RuleBuild } from './build-guards.js';
import { buildRule } from './build-rule.js';
import { ExprCompiler } from './expressions.js';
import { FileCtx } from './file-ctx.js';
import { checkFormatTag } from './format-tag.js';
import { validateProgramParts } from './partial-program.js';
import { checkRoles, checkRuleNames, expandUses, roleDuplicateKey } from './roles.js';
import type { RawProgramSet } from './schema-program.js';
import { didYouMean } from './suggest.js';
import type { LinkDef, NodeDef, Program, ProgramSet, Rule } from './types.js';
import { SourceDoc } from './yaml-source.js';
import { parseLength } from './units.js';

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
    if (CONSTANTS.some((c) => c.name === n.id)) {
      // expressions would read the constant, never the node
      ctx.error(['nodes', i, 'id'], { code: 'reference', message: `"${n.id}" is a constant of expressions (${n.id} = ${CONSTANTS.find((c) => c.name === n.id)?.value}) and cannot be a node id`, fix: 'pick another node id' });
      return;
    }
    nodes.push({ id: n.id, qubits: n.qubits, pos: ctx.pos(['nodes', i]) });
  });
  return nodes;
}

function buildLinks(ctx: FileCtx, raw: RawProgramSet, nodes: readonly NodeDef[], declared: ReadonlySet<string>): LinkDef[] {
  const ids = [...declared];
  const idSet = declared;
  const links: LinkDef[] = [];
  const seen = new Map<string, number>();
  (raw.links ?? []).forEach((l, i) => {
    let ok = true;
    l.ends.forEach((end, j) => {
      if (!idSet.has(end)) {
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
    if (lengthM === 0) {
      // a herald and every attempt would take no time: events would pile up at one instant
      ctx.error(['links', i, 'length'], { code: 'unit', message: `a link of length ${l.length} has no fiber to time its heralds and messages`, fix: 'give a length of more than 0, e.g. "1 m" for two nodes in one room' });
      return;
    }
    if (!ok || lengthM === undefined) return;
    seen.set(id, i);
    const ends = [l.ends[0], l.ends[1]].sort() as [string, string];
    links.push({ id, ends, lengthM, slots: l.slots, pos: ctx.pos(['links', i]) });
  });
  const byNode = new Map<string, LinkDef[]>();
  for (const l of links) {
    for (const end of l.ends) {
      const list = byNode.get(end);
      if (list) list.push(l);
      else byNode.set(end, [l]);
    }
  }
  nodes.forEach((n, i) => {
    const mine = byNode.get(n.id) ?? [];
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

function buildPrograms(ctx: FileCtx, raw: RawProgramSet, declared: ReadonlySet<string>, brokenRoles: ReadonlySet<string>): Record<string, Program> {
  // every id written counts, also of a node entry that is wrong otherwise: its error is enough
  const ids = [...declared];
  const nodeIds = declared;
  const rb: RuleBuild = { ctx, ex: new ExprCompiler(ctx.src, ctx.errors), nodeIds };
  const roles = checkRoles(ctx, raw, nodeIds, brokenRoles);
  const programs: Record<string, Program> = {};
  for (const [node, prog] of Object.entries(raw.programs ?? {})) {
    if (!nodeIds.has(node)) {
      ctx.error(['programs'], { code: 'reference', message: `unknown node "${node}"${didYouMean(node, ids)}`, fix: 'programs are keyed by node ids declared under "nodes"' }, node);
      continue;
    }
    // a node's roles come first, then its own rules (docs/format.md, "Roles")
    const rules = expandUses(ctx, node, prog.use ?? [], roles, nodeIds);
    const at = new Map<Rule, number>();
    (prog.rules ?? []).forEach((r, i) => {
      const rule = buildRule(rb, r, ['programs', node, 'rules', i], node, rules.length);
      at.set(rule, i);
      rules.push(rule);
    });
    checkRuleNames(ctx, node, rules, (r) => at.get(r) ?? 0);
    programs[node] = { node, rules, pos: ctx.src.keyPosAt(['programs'], node) };
  }
  return programs;
}

/** Parses and validates a program set; throws InputErrors naming file:line:col for anything wrong. */
export function loadProgramSet(file: string, text: string): ProgramSet {
  const src = SourceDoc.parse(file, text, roleDuplicateKey);
  checkFormatTag(src, 'program set');
  const ctx = new FileCtx(src);
  // part by part, so that a schema error and an unknown node are reported in one pass
  const { raw, declared, brokenRoles } = validateProgramParts(src, ctx.errors);
  const nodes = buildNodes(ctx, raw);
  const links = buildLinks(ctx, raw, nodes, declared);
  const programs = buildPrograms(ctx, raw, declared, brokenRoles);
  ctx.throwIfErrors();
  return { file, text, title: raw.title ?? '', nodes, links, programs };
}
