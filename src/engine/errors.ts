/**
 * Program errors: a node program did something that can only be seen while it runs (a
 * rule loop, an expression that reads a missing field, a send to an unreachable node).
 * They point at the rule or step in the program file, like input errors, and stop the run.
 */
import type { Rule, SourcePos } from '../model/types.js';

export class ProgramError extends Error {
  readonly pos?: SourcePos;
  readonly node: string;
  readonly rule?: string;
  readonly fix?: string;
  /** For a rule that came from a role: `roles.repeater.rules[0] (at s8, left=s0 right=s16)`. */
  from?: string;

  constructor(message: string, where: { pos?: SourcePos; node: string; rule?: string; fix?: string }) {
    super(message);
    this.name = 'ProgramError';
    this.pos = where.pos;
    this.node = where.node;
    this.rule = where.rule;
    this.fix = where.fix;
  }

  /**
   * Names the role the failing rule came from, found among the network's rules, so the
   * message points at the role's text and says which node played it. Returns the error.
   */
  traced(rules: ReadonlyMap<string, readonly Rule[]>): this {
    if (this.from === undefined && this.rule !== undefined) this.from = rules.get(this.node)?.find((r) => r.name === this.rule)?.from?.text;
    return this;
  }

  /** `file:line:col: node.rule: message` plus a fix line, like InputError.format(). */
  format(): string {
    const at = this.pos ? `${this.pos.file}:${this.pos.line}:${this.pos.col}: ` : '';
    const who = (this.rule ? `${this.node}.${this.rule}` : this.node) + (this.from ? ` from ${this.from}` : '');
    const head = `${at}${who}: ${this.message}`;
    return this.fix ? `${head}\n  fix: ${this.fix}` : head;
  }
}
