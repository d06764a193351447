/**
 * A program set validated part by part: every node, link, role, rule and `use` entry is
 * checked on its own, and the valid ones are kept, so that one wrong entry does not hide
 * the mistakes of the others. A schema error and an unknown node in the same file are
 * reported in one pass.
 */
import type { InputError } from './errors.js';
import { validate } from './issues.js';
import { NODE_ID_RE, programValidation, type RawProgram, type RawProgramSet, type RawRole, type RawRule, type RawUse } from './schema-program.js';
import type { Path, SourceDoc } from './yaml-source.js';

/** The valid parts of a program set, and what the invalid ones still tell. */
export interface PartialProgramSet {
  /**
   * The file with every invalid entry left out. Lists keep their positions: a left-out
   * entry is a hole, which `forEach`, `map` and `filter` skip, so paths into the file
   * (`rules[3]`) still point at the right entry.
   */
  readonly raw: RawProgramSet;
  /** Node ids written in the file, also in entries that are otherwise wrong, so references to them are not reported again. */
  readonly declared: ReadonlySet<string>;
  /** Roles whose parameters or rule list are wrong: nodes that play them are not checked against them. */
  readonly brokenRoles: ReadonlySet<string>;
}

const parts = programValidation.parts;

function isMapping(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** A list with only the entries that pass `check`, at their own positions. */
function sparse<T>(items: readonly unknown[], check: (item: unknown, i: number) => T | undefined): T[] {
  const out: T[] = [];
  out.length = items.length;
  items.forEach((item, i) => {
    const ok = check(item, i);
    if (ok !== undefined) out[i] = ok;
  });
  return out;
}

/** Validates a program set part by part; errors go to `errors`, the valid parts come back. */
export function validateProgramParts(src: SourceDoc, errors: InputError[]): PartialProgramSet {
  const top = src.value as Record<string, unknown>;
  const check = <T>(schema: Parameters<typeof validate>[1], value: unknown, path: Path): T | undefined => validate(src, schema, value, errors, path) as T | undefined;
  // the top level with its lists and mappings unchecked inside: unknown keys, a missing "nodes"
  check(parts.shell, top, []);
  const list = (v: unknown): readonly unknown[] => (Array.isArray(v) ? v : []);
  const map = (v: unknown): Record<string, unknown> => (isMapping(v) ? v : {});

  const declared = new Set<string>();
  const nodes = sparse(list(top.nodes), (n, i) => {
    if (isMapping(n) && typeof n.id === 'string' && NODE_ID_RE.test(n.id)) declared.add(n.id);
    return check<RawProgramSet['nodes'][number]>(parts.node, n, ['nodes', i]);
  });
  const links = sparse(list(top.links), (l, i) => check<NonNullable<RawProgramSet['links']>[number]>(parts.link, l, ['links', i]));

  const brokenRoles = new Set<string>();
  const roles: Record<string, RawRole> = {};
  for (const [name, value] of Object.entries(map(top.roles))) {
    const shell = check<{ params?: string[]; rules: unknown[] }>(parts.roleShell, value, ['roles', name]);
    const rules = sparse(list(isMapping(value) ? value.rules : undefined), (r, i) => check<RawRule>(parts.rule, r, ['roles', name, 'rules', i]));
    // filter skips holes: fewer entries than the length means a rule was left out
    if (!shell || rules.filter(() => true).length !== rules.length) brokenRoles.add(name);
    roles[name] = { ...(shell?.params ? { params: shell.params } : {}), rules };
  }

  const programs: Record<string, RawProgram> = {};
  for (const [node, value] of Object.entries(map(top.programs))) {
    check(parts.programShell, value, ['programs', node]);
    const p = map(value);
    const use = Array.isArray(p.use) ? sparse(p.use, (u, i) => check<RawUse>(parts.use, u, ['programs', node, 'use', i])) : undefined;
    const rules = Array.isArray(p.rules) ? sparse(p.rules, (r, i) => check<RawRule>(parts.rule, r, ['programs', node, 'rules', i])) : undefined;
    programs[node] = { ...(use ? { use } : {}), ...(rules ? { rules } : {}) };
  }

  const raw: RawProgramSet = {
    format: String(top.format),
    ...(typeof top.title === 'string' ? { title: top.title } : {}),
    nodes,
    links,
    roles,
    programs,
  };
  return { raw, declared, brokenRoles };
}
