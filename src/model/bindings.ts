/**
 * Which names a rule may read where: node ids everywhere, names bound by earlier guards,
 * and in steps names bound by earlier steps of the same block (an `if` branch sees its
 * own bindings, which end with the branch).
 */
import { CONSTANTS } from '../expr/index.js';
import { InputError } from './errors.js';
import { namePos } from './expressions.js';
import { didYouMean } from './suggest.js';
import type { Expr, SourcePos } from './types.js';
import { fieldName, type Path } from './yaml-source.js';

/** What a bound name stands for. */
export type BindingKind = 'pair' | 'message' | 'bit';

export interface Binding {
  readonly name: string;
  readonly kind: BindingKind;
  /** The binder, for messages: "the have guard", "the measure step". */
  readonly by: string;
  readonly pos: SourcePos;
}

/** A role's parameters while its rules are checked as written, before any node's values are put in. */
export interface RoleParams {
  readonly role: string;
  readonly names: ReadonlySet<string>;
  /** The nodes that play the role, for messages: " (used by s2, s4)". */
  readonly usedBy: string;
}

const RESERVED = new Set(['true', 'false', 'null', ...CONSTANTS.map((c) => c.name)]);
const KIND_WORDS: Record<BindingKind, string> = { pair: 'a pair', message: 'a message', bit: 'a measured bit' };

/** Nested name scopes of one rule, reporting misuse into a shared error list. */
export class RuleScope {
  private readonly names = new Map<string, Binding>();

  constructor(
    private readonly nodeIds: ReadonlySet<string>,
    /** Every binding anywhere in the rule, to explain "bound later". */
    private readonly all: ReadonlyMap<string, Binding>,
    private readonly errors: InputError[],
    private readonly parent?: RuleScope,
    /** Names that stand for node ids in a role's rules. */
    private readonly params?: RoleParams,
  ) {}

  /** A scope for an `if` branch. */
  child(): RuleScope {
    return new RuleScope(this.nodeIds, this.all, this.errors, this, this.params);
  }

  private isParam(name: string): boolean {
    return this.params?.names.has(name) ?? false;
  }

  lookup(name: string): Binding | undefined {
    return this.names.get(name) ?? this.parent?.lookup(name);
  }

  private visible(kind?: BindingKind): string[] {
    const mine = [...this.names.values()].filter((b) => kind === undefined || b.kind === kind).map((b) => b.name);
    return [...mine, ...(this.parent?.visible(kind) ?? [])];
  }

  /** Binds a name, refusing node ids, literals and names already bound. */
  bind(b: Binding, path: Path): void {
    const field = fieldName(path);
    if (this.params && this.isParam(b.name)) {
      this.errors.push(
        InputError.at(b.pos, {
          code: 'reference',
          field,
          message: `${b.by} may not bind "${b.name}": it is a parameter of role "${this.params.role}"${this.params.usedBy}, so it already stands for a node`,
          fix: `pick another name, e.g. "${b.name}_${b.kind}", or rename the parameter`,
        }),
      );
      return;
    }
    if (this.nodeIds.has(b.name)) {
      this.errors.push(
        InputError.at(b.pos, {
          code: 'reference',
          field,
          message: `${b.by} may not bind "${b.name}": that is a node id`,
          fix: `pick another name, e.g. "${b.name}_${b.kind}"`,
        }),
      );
      return;
    }
    if (RESERVED.has(b.name)) {
      this.errors.push(InputError.at(b.pos, { code: 'reference', field, message: `"${b.name}" is a ${CONSTANTS.some((c) => c.name === b.name) ? 'constant' : 'literal'} of expressions and cannot be bound`, fix: 'pick another name' }));
      return;
    }
    const prior = this.lookup(b.name);
    if (prior) {
      this.errors.push(
        InputError.at(b.pos, {
          code: 'duplicate',
          field,
          message: `"${b.name}" is already bound by ${prior.by} at line ${prior.pos.line}`,
          fix: 'give each bound value its own name',
        }),
      );
      return;
    }
    this.names.set(b.name, b);
  }

  private unbound(name: string, pos: SourcePos, field: string, what: 'name' | 'pair'): InputError {
    const later = this.all.get(name);
    if (later && (later.pos.line > pos.line || (later.pos.line === pos.line && later.pos.col > pos.col))) {
      return InputError.at(pos, {
        code: 'reference',
        field,
        message: `"${name}" is used before it is bound: ${later.by} at line ${later.pos.line} binds it`,
        fix: `move that ${later.by.replace(/^the /, '')} before this point, or use a name bound earlier`,
      });
    }
    if (later) {
      return InputError.at(pos, {
        code: 'reference',
        field,
        message: `"${name}" is not visible here: ${later.by} at line ${later.pos.line} binds it only inside its own branch`,
        fix: 'bind it before the if, or use it inside that branch',
      });
    }
    if (what === 'pair') {
      return InputError.at(pos, {
        code: 'reference',
        field,
        message: `unknown pair "${name}"${didYouMean(name, this.visible('pair'))}`,
        fix: `bind the pair first with "as: ${name}" on a have guard of this rule`,
      });
    }
    return InputError.at(pos, {
      code: 'reference',
      field,
      message: `unknown name "${name}"${didYouMean(name, [...this.visible(), ...(this.params?.names ?? []), ...this.nodeIds])}`,
      fix: `bind it first with "as: ${name}" on a have or got guard (or a measure step), or use a node id`,
    });
  }

  /** Checks every name an expression reads. */
  reads(e: Expr | undefined, path: Path): void {
    if (!e) return;
    for (const name of e.compiled.names) {
      if (this.nodeIds.has(name) || this.isParam(name) || this.lookup(name)) continue;
      this.errors.push(this.unbound(name, namePos(e, name), fieldName(path), 'name'));
    }
  }

  /** Checks that a step field names a pair bound by a have guard. */
  pair(name: string, pos: SourcePos, path: Path): void {
    const b = this.lookup(name);
    if (b?.kind === 'pair') return;
    const field = fieldName(path);
    if (b) {
      this.errors.push(
        InputError.at(pos, {
          code: 'reference',
          field,
          message: `"${name}" is ${KIND_WORDS[b.kind]} (bound by ${b.by} at line ${b.pos.line}), not a pair`,
          fix: 'name a pair bound by "as:" on a have guard',
        }),
      );
      return;
    }
    if (this.params && this.isParam(name)) {
      this.errors.push(
        InputError.at(pos, {
          code: 'reference',
          field,
          message: `"${name}" is a parameter of role "${this.params.role}" (it stands for a node), not a pair`,
          fix: `bind the pair you hold with it, e.g. "have: {partner: ${name}, as: p}", and name it here`,
        }),
      );
      return;
    }
    if (this.nodeIds.has(name)) {
      this.errors.push(
        InputError.at(pos, {
          code: 'reference',
          field,
          message: `"${name}" is a node, not a pair`,
          fix: `bind the pair you hold with it, e.g. "have: {partner: ${name}, as: p}", and name it here`,
        }),
      );
      return;
    }
    this.errors.push(this.unbound(name, pos, field, 'pair'));
  }
}
