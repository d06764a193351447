/** One typed rule from validated YAML: its guards, then its steps, with the names each may read. */
import { RuleScope, type Binding } from './bindings.js';
import { buildGuard, guardBindings, type RuleBuild } from './build-guards.js';
import { buildSteps, stepBindingSites } from './build-steps.js';
import type { RawRule } from './schema-program.js';
import type { Guard, Rule, RuleOrigin } from './types.js';
import type { Path } from './yaml-source.js';

/** Builds the rule written at `path` for `node`, at `index` in the node's program. */
export function buildRule(rb: RuleBuild, raw: RawRule, path: Path, node: string, index: number, from?: RuleOrigin): Rule {
  const { ctx } = rb;
  // Every binding in the rule, so a name read too early can be told where it gets bound.
  const all = new Map<string, Binding>();
  raw.when.forEach((g, i) => {
    for (const b of guardBindings(rb, g, [...path, 'when', i])) if (!all.has(b.name)) all.set(b.name, b);
  });
  const sites = new Map<string, { by: string; path: Path }>();
  stepBindingSites(raw.do, [...path, 'do'], sites);
  for (const [name, s] of sites) if (!all.has(name)) all.set(name, { name, kind: 'bit', by: s.by, pos: ctx.pos(s.path) });

  const scope = new RuleScope(rb.nodeIds, all, ctx.errors, undefined, rb.params);
  const when: Guard[] = [];
  raw.when.forEach((g, i) => {
    const gp = [...path, 'when', i];
    const built = buildGuard(rb, g, gp, scope);
    if (built) when.push(built);
    for (const b of guardBindings(rb, g, gp)) scope.bind(b, gp);
  });
  const steps = buildSteps(rb, raw.do, [...path, 'do'], scope);
  return { name: raw.name, node, index, when, do: steps, pos: ctx.pos(path), ...(from ? { from } : {}) };
}
