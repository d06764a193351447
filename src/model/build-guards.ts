/** Typed guards from validated YAML, with the binding rules of docs/format.md. */
import type { Binding, RoleParams, RuleScope } from './bindings.js';
import type { ExprCompiler } from './expressions.js';
import type { FileCtx } from './file-ctx.js';
import type { RawItem } from './schema-program.js';
import type { Guard, HaveGuard, HaveIdGuard, SourcePos } from './types.js';
import { parseDuration } from './units.js';
import type { Path } from './yaml-source.js';

/** What guard and step builders share within one rule. */
export interface RuleBuild {
  readonly ctx: FileCtx;
  readonly ex: ExprCompiler;
  readonly nodeIds: ReadonlySet<string>;
  /** Set while a role's rules are checked as written (model/roles.ts). */
  readonly params?: RoleParams;
}

interface RawHave {
  partner?: string;
  id?: string;
  stage?: string;
  count?: number;
  as?: string | string[];
  pick?: 'oldest' | 'newest';
  min_age?: string;
  max_age?: string;
  min_wait?: string;
  max_wait?: string;
}
interface RawGot {
  from?: string;
  kind: string;
  as?: string;
}

function asList(v: string | readonly string[] | undefined): readonly string[] {
  if (v === undefined) return [];
  return typeof v === 'string' ? [v] : v;
}

/** The names a guard binds, with the position of each. */
export function guardBindings(rb: RuleBuild, raw: RawItem, path: Path): Binding[] {
  const out: Binding[] = [];
  if ('have' in raw) {
    const h = raw.have as RawHave;
    const single = typeof h.as === 'string';
    asList(h.as).forEach((name, i) => {
      const at = single ? [...path, 'have', 'as'] : [...path, 'have', 'as', i];
      out.push({ name, kind: 'pair', by: 'the have guard', pos: rb.ctx.pos(at) });
    });
  } else if ('got' in raw) {
    const g = raw.got as RawGot;
    if (g.as !== undefined) out.push({ name: g.as, kind: 'message', by: 'the got guard', pos: rb.ctx.pos([...path, 'got', 'as']) });
  }
  return out;
}

function buildHaveId(rb: RuleBuild, h: RawHave, path: Path, scope: RuleScope, pos: SourcePos): HaveIdGuard | undefined {
  const { ctx } = rb;
  for (const key of ['partner', 'count', 'pick', 'min_age', 'max_age', 'min_wait', 'max_wait'] as const) {
    if (h[key] !== undefined) {
      ctx.error(
        path,
        { code: 'schema', message: `"${key}" cannot be used with "id"`, fix: 'a have with id finds the one pair with that shared id; remove one of the two' },
        key,
      );
    }
  }
  const names = asList(h.as);
  if (names.length > 1) ctx.error([...path, 'as'], { code: 'schema', message: 'a have with id binds one pair, so "as" takes one name', fix: `write "as: ${names[0]}"` });
  const id = rb.ex.expr([...path, 'id'], h.id);
  scope.reads(id, [...path, 'id']);
  if (!id) return undefined;
  return { kind: 'have-id', id, ...(h.stage === undefined ? {} : { stage: h.stage }), ...(names[0] === undefined ? {} : { as: names[0] }), pos };
}

function buildHave(rb: RuleBuild, h: RawHave, path: Path, scope: RuleScope, pos: SourcePos): HaveGuard | HaveIdGuard | undefined {
  const { ctx } = rb;
  if (h.id !== undefined) return buildHaveId(rb, h, path, scope, pos);
  if (h.partner === undefined) {
    ctx.error(path, {
      code: 'schema',
      message: 'a have guard needs "partner" (the node the pairs are shared with) or "id"',
      fix: 'add e.g. "partner: mill"',
    });
    return undefined;
  }
  const names = asList(h.as);
  const count = h.count ?? (names.length > 0 ? names.length : 1);
  if (names.length > 0 && names.length !== count) {
    ctx.error([...path, 'as'], {
      code: 'schema',
      message: `"as" names ${names.length} pair${names.length === 1 ? '' : 's'} but "count" is ${count}`,
      fix: 'give one name per pair, or leave "count" out (it then follows the names)',
    });
  }
  const minAgeNs = h.min_age === undefined ? undefined : ctx.unit([...path, 'min_age'], h.min_age, parseDuration);
  const maxAgeNs = h.max_age === undefined ? undefined : ctx.unit([...path, 'max_age'], h.max_age, parseDuration);
  const minWaitNs = h.min_wait === undefined ? undefined : ctx.unit([...path, 'min_wait'], h.min_wait, parseDuration);
  const maxWaitNs = h.max_wait === undefined ? undefined : ctx.unit([...path, 'max_wait'], h.max_wait, parseDuration);
  for (const [lo, hi, loText, hiText, what] of [
    [minAgeNs, maxAgeNs, h.min_age, h.max_age, 'age'],
    [minWaitNs, maxWaitNs, h.min_wait, h.max_wait, 'wait'],
  ] as const) {
    if (lo !== undefined && hi !== undefined && lo > hi) {
      ctx.error([...path, `max_${what}`], {
        code: 'schema',
        message: `max_${what} (${hiText}) is less than min_${what} (${loText}), so no pair can ever match`,
        fix: `swap them, or make max_${what} at least min_${what}`,
      });
    }
  }
  const partner = rb.ex.expr([...path, 'partner'], h.partner);
  scope.reads(partner, [...path, 'partner']);
  if (!partner) return undefined;
  return {
    kind: 'have',
    partner,
    stage: h.stage ?? 'link',
    count,
    as: names,
    pick: h.pick ?? 'oldest',
    ...(minAgeNs === undefined ? {} : { minAgeNs }),
    ...(maxAgeNs === undefined ? {} : { maxAgeNs }),
    ...(minWaitNs === undefined ? {} : { minWaitNs }),
    ...(maxWaitNs === undefined ? {} : { maxWaitNs }),
    pos,
  };
}

/** Builds one guard (its names are bound by the caller, after it is built). */
export function buildGuard(rb: RuleBuild, raw: RawItem, path: Path, scope: RuleScope): Guard | undefined {
  const pos = rb.ctx.pos(path);
  if ('have' in raw) return buildHave(rb, raw.have as RawHave, [...path, 'have'], scope, pos);
  if ('got' in raw) {
    const g = raw.got as RawGot;
    const from = g.from === undefined ? undefined : rb.ex.expr([...path, 'got', 'from'], g.from);
    scope.reads(from, [...path, 'got', 'from']);
    if (g.from !== undefined && !from) return undefined;
    return { kind: 'got', ...(from ? { from } : {}), msgKind: g.kind, ...(g.as === undefined ? {} : { as: g.as }), pos };
  }
  const expr = rb.ex.expr([...path, 'check'], raw.check);
  scope.reads(expr, [...path, 'check']);
  return expr ? { kind: 'check', expr, pos } : undefined;
}
