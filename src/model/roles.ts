/**
 * Roles (docs/format.md, "Roles"). A role's rules are checked once as written, with its
 * parameters standing for node ids. Then, for every node that plays the role, they are built
 * again with that node's values put into the text of each expression, so an expanded rule is
 * exactly what the same rule written out by hand would be. Each expanded rule keeps where it
 * came from (role, rule, node, values) for every message a person reads about it.
 */
import type { Document } from 'yaml';
import type { RoleParams } from './bindings.js';
import { buildRule } from './build-rule.js';
import type { RuleBuild } from './build-guards.js';
import { ExprCompiler } from './expressions.js';
import type { FileCtx } from './file-ctx.js';
import { argText, originText } from './role-args.js';
import { RESERVED_NAMES } from './zod-kit.js';
import { LABEL_RE, type RawProgramSet, type RawRole, type RawUse } from './schema-program.js';
import { closest, didYouMean, listWords } from './suggest.js';
import type { Rule, RuleOrigin } from './types.js';
import { fieldName, type Path } from './yaml-source.js';

/** A role as declared, once checked. */
export interface RoleDef {
  readonly name: string;
  readonly params: readonly string[];
  readonly raw: RawRole;
  /** Its parameters are usable names, so the values nodes give can be checked against them. */
  readonly paramsOk: boolean;
  /** Its rules built without errors, so nodes may play it. */
  readonly sound: boolean;
}

const RESERVED = new Set(['true', 'false', 'null']);

/** The nodes whose `use` lists name each role. */
function usersOf(raw: RawProgramSet): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const [node, prog] of Object.entries(raw.programs ?? {})) {
    // forEach skips the holes that entries with schema errors leave (model/partial-program.ts)
    (prog.use ?? []).forEach((u) => {
      const name = typeof u === 'string' ? u : u.role;
      const list = out.get(name) ?? [];
      if (!list.includes(node)) list.push(node);
      out.set(name, list);
    });
  }
  return out;
}

function usedByText(nodes: readonly string[] | undefined): string {
  if (!nodes || nodes.length === 0) return ' (played by no node)';
  const shown = nodes.slice(0, 6).join(', ');
  return ` (played by ${shown}${nodes.length > 6 ? ` and ${nodes.length - 6} more` : ''})`;
}

function checkParams(ctx: FileCtx, name: string, params: readonly string[], nodeIds: ReadonlySet<string>, usedBy: string): boolean {
  let ok = true;
  params.forEach((p, i) => {
    const path = ['roles', name, 'params', i];
    const first = params.indexOf(p);
    if (first !== i) {
      ok = false;
      ctx.error(path, { code: 'duplicate', message: `role "${name}" declares parameter "${p}" twice (first as params[${first}])`, fix: 'list each parameter once' });
    } else if (nodeIds.has(p)) {
      ok = false;
      ctx.error(path, {
        code: 'reference',
        message: `parameter "${p}" of role "${name}" is named like a node id${usedBy}, so "${p}" in its rules could mean either`,
        fix: `rename the parameter to a word that is not a node id, e.g. "${p}_site" or "left"`,
      });
    } else if (RESERVED.has(p)) {
      ok = false;
      ctx.error(path, { code: 'reference', message: `"${p}" is a literal and cannot be a parameter of role "${name}"`, fix: 'pick another name' });
    }
  });
  return ok;
}

/** Checks every role as written: its name, its parameters and its rules (with the parameters standing for nodes). */
export function checkRoles(ctx: FileCtx, raw: RawProgramSet, nodeIds: ReadonlySet<string>, broken: ReadonlySet<string> = new Set()): Map<string, RoleDef> {
  const users = usersOf(raw);
  const roles = new Map<string, RoleDef>();
  for (const [name, role] of Object.entries(raw.roles ?? {})) {
    const before = ctx.errors.length;
    if (!LABEL_RE.test(name)) {
      ctx.error(['roles'], { code: 'schema', message: `"${name}" is not a role name`, fix: 'use letters, digits, "_" and "-", starting with a letter, e.g. "repeater"' }, name);
    } else if (RESERVED_NAMES.has(name)) {
      ctx.error(['roles'], { code: 'schema', message: `"${name}" is a reserved word and cannot be used as a role name`, fix: 'pick another name, e.g. "repeater"' }, name);
    }
    // its own errors are reported; the nodes that play it are not checked against half a role
    if (broken.has(name)) {
      roles.set(name, { name, params: role.params ?? [], raw: role, paramsOk: false, sound: false });
      continue;
    }
    const params = role.params ?? [];
    const usedBy = usedByText(users.get(name));
    const paramsOk = checkParams(ctx, name, params, nodeIds, usedBy);
    const rp: RoleParams = { role: name, names: new Set(params), usedBy };
    const rb: RuleBuild = { ctx, ex: new ExprCompiler(ctx.src, ctx.errors), nodeIds, params: rp };
    const names = new Map<string, number>();
    role.rules.forEach((r, i) => {
      const path = ['roles', name, 'rules', i];
      const first = names.get(r.name);
      if (first !== undefined) {
        ctx.error([...path, 'name'], {
          code: 'duplicate',
          message: `duplicate rule name "${r.name}" in role "${name}" (first at line ${ctx.pos(['roles', name, 'rules', first]).line})`,
          fix: 'give every rule of a role its own name',
        });
      } else names.set(r.name, i);
      buildRule(rb, r, path, '', i);
    });
    roles.set(name, { name, params, raw: role, paramsOk, sound: ctx.errors.length === before });
  }
  return roles;
}

/** The values one `use` entry gives, as text to substitute; undefined (with errors recorded) when they are wrong. */
function bindArgs(ctx: FileCtx, node: string, role: RoleDef, u: RawUse, usePath: Path, nodeIds: ReadonlySet<string>): Map<string, string> | undefined {
  const given = typeof u === 'string' ? {} : (u.args ?? {});
  const argsPath = [...usePath, 'args'];
  const out = new Map<string, string>();
  let ok = true;
  for (const [key, value] of Object.entries(given)) {
    if (!role.params.includes(key)) {
      ok = false;
      const takes = role.params.length ? `its parameters are ${listWords(role.params, 'and')}` : 'it takes no parameters: remove "args"';
      ctx.error(argsPath, { code: 'reference', message: `role "${role.name}" has no parameter "${key}"${didYouMean(key, role.params)} (at ${node})`, fix: takes }, key);
      continue;
    }
    const text = argText(value, nodeIds);
    if (typeof text !== 'string') {
      ok = false;
      ctx.error([...argsPath, key], { code: 'reference', message: `parameter "${key}" of role "${role.name}" at ${node}: ${text.message}`, fix: text.fix });
      continue;
    }
    out.set(key, text);
  }
  const missing = role.params.filter((p) => !Object.hasOwn(given, p));
  // a misspelt name was reported above with its suggestion; do not also call the intended one missing
  const misspelt = new Set(Object.keys(given).filter((k) => !role.params.includes(k)).map((k) => closest(k, role.params)));
  const reallyMissing = missing.filter((p) => !misspelt.has(p));
  if (reallyMissing.length > 0) {
    ok = false;
    const example = role.params.map((p) => `${p}: ${out.get(p) ?? '...'}`).join(', ');
    ctx.error(typeof u === 'string' || u.args === undefined ? usePath : argsPath, {
      code: 'reference',
      message: `role "${role.name}" at ${node} needs a value for ${reallyMissing.length === 1 ? 'parameter' : 'parameters'} ${listWords(reallyMissing, 'and')}`,
      fix: `give every parameter a value (a node id, a number or a quoted string): "{role: ${role.name}, args: {${example}}}"`,
    });
  }
  return ok && missing.length === 0 ? out : undefined;
}

/** The rules a node gets from the roles it plays, in its `use` order, each with its origin. */
export function expandUses(ctx: FileCtx, node: string, uses: readonly RawUse[], roles: ReadonlyMap<string, RoleDef>, nodeIds: ReadonlySet<string>): Rule[] {
  const rules: Rule[] = [];
  const played = new Map<string, number>();
  uses.forEach((u, i) => {
    const usePath = ['programs', node, 'use', i];
    const name = typeof u === 'string' ? u : u.role;
    const role = roles.get(name);
    if (!role) {
      const declared = [...roles.keys()];
      ctx.error(typeof u === 'string' ? usePath : [...usePath, 'role'], {
        code: 'reference',
        message: `unknown role "${name}"${didYouMean(name, declared)} (at ${node})`,
        fix: declared.length ? `declare it under "roles:", or use one of ${listWords(declared)}` : 'declare it under "roles:" with its rules',
      });
      return;
    }
    const first = played.get(name);
    if (first !== undefined) {
      ctx.error(usePath, {
        code: 'duplicate',
        message: `${node} plays role "${name}" twice (first at line ${ctx.pos(['programs', node, 'use', first]).line}); its rule names would clash`,
        fix: 'play each role once at a node; for a second neighbour pair, write a role whose rules have other names',
      });
      return;
    }
    played.set(name, i);
    // values for parameters that are themselves wrong would only repeat that error at every node
    if (!role.paramsOk) return;
    const args = bindArgs(ctx, node, role, u, usePath, nodeIds);
    if (!args || !role.sound) return;
    const rb: RuleBuild = { ctx, ex: new ExprCompiler(ctx.src, ctx.errors, args), nodeIds };
    const values = role.params.map((p) => [p, args.get(p) as string] as const);
    const usePos = ctx.pos(usePath);
    role.raw.rules.forEach((r, j) => {
      const path = ['roles', name, 'rules', j];
      const from: RuleOrigin = { role: name, index: j, node, args: values, usePos, use: i, text: originText(fieldName(path), node, values) };
      rules.push(buildRule(rb, r, path, node, rules.length, from));
    });
  });
  return rules;
}

/** How a rule's source is named in a clash: its role entry, or the node's own list. */
function source(r: Rule): string {
  return r.from ? `from ${r.from.text}, line ${r.pos.line}` : `of its own rules (line ${r.pos.line})`;
}

/** Reports rule names used twice at a node once its roles are expanded, naming both sources. */
export function checkRuleNames(ctx: FileCtx, node: string, rules: readonly Rule[], fileIndex?: (r: Rule) => number): void {
  const seen = new Map<string, Rule>();
  // role rules come first, so an own rule's index in the file is its index past them
  const fromRoles = rules.filter((x) => x.from).length;
  rules.forEach((r, k) => {
    const own = fileIndex ? fileIndex(r) : k - fromRoles;
    const first = seen.get(r.name);
    if (!first) {
      seen.set(r.name, r);
      return;
    }
    // a role with one name twice was reported once, at the role
    if (first.from && r.from && first.from.use === r.from.use) return;
    if (!first.from && !r.from) {
      ctx.error(['programs', node, 'rules', own, 'name'], {
        code: 'duplicate',
        message: `duplicate rule name "${r.name}" at ${node} (first at line ${first.pos.line})`,
        fix: 'give every rule of a node its own name',
      });
      return;
    }
    const path = r.from ? ['programs', node, 'use', r.from.use] : ['programs', node, 'rules', own, 'name'];
    ctx.error(path, {
      code: 'duplicate',
      message: `at ${node}, rule name "${r.name}" ${source(r)} clashes with "${first.name}" ${source(first)}`,
      fix: "rename one of the two: a node's rule names must be unique once its roles are expanded",
    });
  });
}

/** A clearer message than "duplicate key" for a parameter given twice or a role declared twice. */
export function roleDuplicateKey(doc: Document.Parsed, mapping: Path, key: string): { message: string; fix: string } | undefined {
  if (mapping.length === 1 && mapping[0] === 'roles') {
    return { message: `role "${key}" is declared twice`, fix: 'declare each role once; give a second rule list its own role name' };
  }
  if (mapping.length === 5 && mapping[0] === 'programs' && mapping[2] === 'use' && mapping[4] === 'args') {
    const role = doc.getIn([...mapping.slice(0, 4), 'role']);
    return {
      message: `parameter "${key}" is given twice to role "${String(role)}" at ${String(mapping[1])}`,
      fix: `give each parameter one value: remove one of the two "${key}:"`,
    };
  }
  return undefined;
}
