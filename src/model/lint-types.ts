/**
 * What the names and fields of a rule's expressions hold, known before a run: a field that no
 * sender of the message kind sets (`m.bti` where senders set `bit`), a field no rule notes on
 * a pair, and values used where they can never fit (a pair as an angle, the field of a
 * literal, text where a bit is needed). Only certain mistakes are reported: a value whose
 * kind is not known from the text is taken to fit.
 */
import { functionSpec } from '../expr/index.js';
import type { ExprNode } from '../expr/types.js';
import { MESSAGE_FIELDS } from './build-steps.js';
import { exprPos } from './expressions.js';
import type { FieldIndex } from './lint-fields.js';
import { finding, type Finding } from './lint-facts.js';
import { closest } from './suggest.js';
import type { Expr, Rule, Step } from './types.js';

/** What a value is, as far as the text tells. */
export type Kind = 'number' | 'string' | 'id' | 'label' | 'boolean' | 'null' | 'pair' | 'message' | 'list' | 'any';

/**
 * A name a rule binds: a pair (with the stage it was bound in, `*` for any, and the values
 * the body has noted on it so far), a message (of a kind, maybe from one sender) or a bit.
 */
export type Bound =
  | { readonly kind: 'pair'; readonly stage: string; readonly noted: Set<string> }
  | { readonly kind: 'message'; readonly msgKind: string; readonly from?: string }
  | { readonly kind: 'bit' };

// a pair id ("mill~quay#3") is text that is never a node id: node ids have no "~"
const FIELD_KINDS: Readonly<Record<string, Kind>> = { id: 'id', partner: 'string', stage: 'string', age: 'number', born: 'number', kind: 'string', from: 'string', to: 'string', sent: 'number' };

/** The value of an arithmetic expression made of number literals only, else undefined. */
function constant(n: ExprNode): number | undefined {
  if (n.type === 'literal') return typeof n.value === 'number' ? n.value : undefined;
  if (n.type === 'unary' && n.op !== '!') {
    const v = constant(n.argument);
    return v === undefined ? undefined : n.op === '-' ? -v : v;
  }
  if (n.type !== 'binary') return undefined;
  const a = constant(n.left);
  const b = constant(n.right);
  if (a === undefined || b === undefined) return undefined;
  switch (n.op) {
    case '+':
      return a + b;
    case '-':
      return a - b;
    case '*':
      return a * b;
    case '/':
      return b === 0 ? undefined : a / b;
    case '%':
      return b === 0 ? undefined : a % b;
    default:
      return undefined;
  }
}

/** A pair id is text, except where a node id is needed. */
const text = (k: Kind): Kind => (k === 'id' || k === 'label' ? 'string' : k);

const WORDS: Readonly<Record<Kind, string>> = {
  number: 'a number',
  string: 'text',
  id: 'a pair id',
  label: 'a message kind, not a node',
  boolean: 'true or false',
  null: 'null',
  pair: 'a pair record',
  message: 'a message record',
  list: 'a list',
  any: 'a value',
};

/** What a step needs an expression to give. */
export type Want = 'truth' | 'number' | 'node' | 'id' | 'id-or-null' | 'any';

/** Checks the expressions of one rule with what its names hold at each point. */
export class ExprKinds {
  readonly out: Finding[] = [];

  constructor(
    private readonly fields: FieldIndex,
    private readonly nodeIds: ReadonlySet<string>,
    private readonly rule: Rule,
  ) {}

  private report(e: Expr, at: { start: number }, code: string, message: string, fix: string): void {
    this.out.push(finding(code, exprPos(e, at.start), message, fix, this.rule));
  }

  private text(e: Expr, n: ExprNode): string {
    return e.compiled.source.slice(n.start, n.end);
  }

  /** The kind of `n`, reporting every certain mistake inside it. */
  kind(e: Expr, n: ExprNode, env: ReadonlyMap<string, Bound>): Kind {
    switch (n.type) {
      case 'literal':
        return n.value === null ? 'null' : typeof n.value === 'number' ? 'number' : typeof n.value === 'string' ? 'string' : 'boolean';
      case 'name': {
        const b = env.get(n.name);
        if (b) return b.kind === 'bit' ? 'number' : b.kind;
        return this.nodeIds.has(n.name) ? 'string' : 'any';
      }
      case 'member':
        return this.member(e, n, env);
      case 'index': {
        const o = text(this.kind(e, n.object, env));
        const i = text(this.kind(e, n.index, env));
        if (o !== 'list' && o !== 'any') this.report(e, n, 'type-mismatch', `\`${this.text(e, n.object)}\` is ${WORDS[o]}, which cannot be indexed`, 'only lists can be indexed; read a field of a record with ".name"');
        else if (i !== 'number' && i !== 'any') this.report(e, n.index, 'type-mismatch', `an index must be a whole number, but \`${this.text(e, n.index)}\` is ${WORDS[i]}`, 'index with a number, e.g. [0]');
        return 'any';
      }
      case 'unary': {
        const a = text(this.kind(e, n.argument, env));
        if (n.op === '!') {
          this.truth(e, n.argument, a, '"!"');
          return 'boolean';
        }
        if (a !== 'number' && a !== 'any') this.report(e, n, 'type-mismatch', `"${n.op}" needs a number, but \`${this.text(e, n.argument)}\` is ${WORDS[a]}`, 'apply it to a number');
        return 'number';
      }
      case 'binary':
        return this.binary(e, n, env);
      case 'conditional': {
        this.truth(e, n.test, this.kind(e, n.test, env), 'the condition of "? :"');
        const a = this.kind(e, n.consequent, env);
        const b = this.kind(e, n.alternate, env);
        return a === b ? a : 'any';
      }
      case 'call':
        return this.call(e, n, env);
    }
  }

  private member(e: Expr, n: Extract<ExprNode, { type: 'member' }>, env: ReadonlyMap<string, Bound>): Kind {
    const o = text(this.kind(e, n.object, env));
    const what = `\`${this.text(e, n.object)}\``;
    const at = { start: n.end - n.property.length };
    if (o === 'pair' || o === 'message') {
      const b = n.object.type === 'name' ? env.get(n.object.name) : undefined;
      const known = !b ? undefined : b.kind === 'pair' ? this.fields.pairFields(this.rule.node, b.stage, b.noted) : b.kind === 'message' ? this.fields.messageFields(b.msgKind, this.rule.node, b.from) : undefined;
      if (known && !known.has(n.property)) {
        const near = closest(n.property, known);
        const hint = near ? `did you mean "${near}"? ` : '';
        if (b?.kind === 'message') {
          this.report(e, at, 'message-field-unknown', `no sender of "${b.msgKind}" to ${this.rule.node} sets the field "${n.property}" read in ${what}.${n.property} (${hint}its fields: ${[...known].sort().join(', ')})`, near ? `write ${this.text(e, n.object)}.${near}, or add "${n.property}" to the data of every send of "${b.msgKind}"` : `add "${n.property}" to the data of the sends of "${b.msgKind}", or read a field they set`);
        } else {
          const stage = b?.kind === 'pair' && b.stage !== '*' ? b.stage : undefined;
          const why = this.fields.notedAt(this.rule.node, n.property)
            ? `pairs bound in stage "${stage}" at ${this.rule.node} do not carry "${n.property}" at this point (it is noted on pairs in other stages, or later)`
            : `no rule at ${this.rule.node} notes "${n.property}" on a pair`;
          this.report(e, at, 'pair-field-unknown', `${why}, so ${what}.${n.property} has no value (${hint}its fields: ${[...known].sort().join(', ')})`, near ? `write ${this.text(e, n.object)}.${near}` : `note it first with "note: {pair: ${this.text(e, n.object)}, set: {${n.property}: ...}}" before this point, or read a field the pair has`);
        }
        return 'any';
      }
      if (b?.kind === 'message' && !MESSAGE_FIELDS.includes(n.property)) return this.fields.dataKind(b.msgKind, this.rule.node, b.from, n.property);
      // a message's kind is the one its got guard names: text that may not be a node id
      if (b?.kind === 'message' && n.property === 'kind') return this.nodeIds.has(b.msgKind) ? 'string' : 'label';
      // own keys only: a noted field may be called "toString"
      // a message's pair is a pair id or null: neither a number nor a node nor a truth value
      if (b?.kind === 'message' && n.property === 'pair') return 'id';
      return Object.hasOwn(FIELD_KINDS, n.property) ? FIELD_KINDS[n.property] : 'any';
    }
    if (o !== 'any') {
      this.report(e, n, 'type-mismatch', `${what} is ${WORDS[o]}, not a record, so it has no field "${n.property}"`, 'read fields of a bound pair or message, e.g. p.id or m.pair');
    }
    return 'any';
  }

  private binary(e: Expr, n: Extract<ExprNode, { type: 'binary' }>, env: ReadonlyMap<string, Bound>): Kind {
    // a pair id is text to every operator
    const a = text(this.kind(e, n.left, env));
    const b = text(this.kind(e, n.right, env));
    const bad = (want: string) => this.report(e, n, 'type-mismatch', `"${n.op}" needs ${want}, but \`${this.text(e, n.left)}\` is ${WORDS[a]} and \`${this.text(e, n.right)}\` is ${WORDS[b]}`, `give "${n.op}" ${want}`);
    const isAny = (k: Kind) => k === 'any';
    switch (n.op) {
      case '+':
        if (a === 'number' && b === 'number' && !Number.isFinite(constant(n) ?? 0)) {
          this.report(e, n, 'number-overflow', `\`${this.text(e, n)}\` is too large a number to hold (it gives ${constant(n)})`, 'keep the arithmetic within about 1e308');
        }
        if (!isAny(a) && !isAny(b) && !((a === 'number' && b === 'number') || (a === 'string' && b === 'string'))) bad('two numbers or two texts');
        else if ((isAny(a) && !['number', 'string', 'any'].includes(b)) || (isAny(b) && !['number', 'string', 'any'].includes(a))) bad('two numbers or two texts');
        return a === 'string' || b === 'string' ? 'string' : a === 'number' && b === 'number' ? 'number' : 'any';
      case '-':
      case '*':
      case '/':
      case '%':
        if ((!isAny(a) && a !== 'number') || (!isAny(b) && b !== 'number')) bad('two numbers');
        else if ((n.op === '/' || n.op === '%') && n.right.type === 'literal' && n.right.value === 0) {
          this.report(e, n, 'division-by-zero', `\`${this.text(e, n)}\` divides by zero`, 'divide by a number other than 0');
        } else if (!Number.isFinite(constant(n) ?? 0)) {
          this.report(e, n, 'number-overflow', `\`${this.text(e, n)}\` is too large a number to hold (it gives ${constant(n)})`, 'keep the arithmetic within about 1e308');
        }
        return 'number';
      case '<':
      case '<=':
      case '>':
      case '>=': {
        const orderable = (k: Kind) => k === 'number' || k === 'string' || k === 'any';
        if (!orderable(a) || !orderable(b) || (a !== b && !isAny(a) && !isAny(b))) bad('two numbers or two texts');
        return 'boolean';
      }
      case '==':
      case '!=':
        return 'boolean';
      case '&&':
      case '||':
        this.truth(e, n.left, a, `"${n.op}"`);
        this.truth(e, n.right, b, `"${n.op}"`);
        return 'boolean';
    }
  }

  private call(e: Expr, n: Extract<ExprNode, { type: 'call' }>, env: ReadonlyMap<string, Bound>): Kind {
    const spec = functionSpec(n.callee);
    n.args.forEach((arg, i) => {
      const k = text(this.kind(e, arg, env));
      const param = spec?.params[Math.min(i, spec.params.length - 1)];
      if (!param || k === 'any') return;
      const fits =
        param.kind === 'number' ? k === 'number' || k === 'list'
        : param.kind === 'bit' ? k === 'number' || k === 'boolean'
        : param.kind === 'pair' ? k === 'pair' || k === 'string'
        : param.kind === 'pair-id' ? k === 'string'
        : true;
      if (!fits) this.report(e, arg, 'type-mismatch', `${n.callee}() takes ${param.kind === 'pair' ? 'a pair (a bound name or a pair id)' : param.kind === 'pair-id' ? 'a pair id (text)' : param.kind === 'bit' ? 'bits' : 'numbers'}, but \`${this.text(e, arg)}\` is ${WORDS[k]}`, `pass ${n.callee}() ${param.kind === 'pair-id' ? 'an id, e.g. p.id' : 'the right kind of value'}`);
    });
    if (['xor', 'min', 'max', 'abs', 'floor', 'round', 'age', 'waited', 'now'].includes(n.callee)) return 'number';
    if (n.callee === 'join') return 'id';
    return 'any';
  }

  /** Reports a value that can never be a truth value (text, null, a record, a list, a number other than 0 and 1). */
  truth(e: Expr, n: ExprNode, k: Kind, what: string): void {
    const c = constant(n);
    if (c !== undefined && c !== 0 && c !== 1) {
      this.report(e, n, 'type-mismatch', `${what} needs true/false (or a bit 0/1), but \`${this.text(e, n)}\` is the number ${c}`, 'write true or false, or a comparison such as m.bit == 1');
      return;
    }
    if (k === 'string' || k === 'id' || k === 'label' || k === 'null' || k === 'pair' || k === 'message' || k === 'list') {
      this.report(e, n, 'type-mismatch', `${what} needs true/false (or a bit 0/1), but \`${this.text(e, n)}\` is ${WORDS[k]}`, 'compare it with something, e.g. m.ok == 1 or p.stage == \'waiting\'');
    }
  }

  /** Checks an expression that must give a value of one of `want` kinds (where a step uses it). */
  expect(e: Expr | undefined, env: ReadonlyMap<string, Bound>, want: Want, what: string): void {
    if (!e) return;
    const k = this.kind(e, e.compiled.ast, env);
    if (want === 'truth') return this.truth(e, e.compiled.ast, k, what);
    if (k === 'any') return;
    const literal = e.compiled.ast.type === 'literal' ? e.compiled.ast.value : undefined;
    // a node written as text must be a node of the network
    if (want === 'node' && typeof literal === 'string' && !this.nodeIds.has(literal)) {
      this.report(e, e.compiled.ast, 'type-mismatch', `${what} needs a node id, but ${JSON.stringify(literal)} is not a node of the network`, `write one of ${[...this.nodeIds].sort().join(', ')}`);
      return;
    }
    const t = text(k);
    const ok = want === 'number' ? t === 'number' : want === 'node' ? k === 'string' : want === 'id' ? t === 'string' : want === 'id-or-null' ? t === 'string' || t === 'null' : true;
    if (ok) return;
    const fix =
      want === 'node'
        ? k === 'pair' ? `write ${e.compiled.source}.partner for the node at its other end`
        : k === 'message' ? `write ${e.compiled.source}.from for its sender`
        : k === 'id' && /\.id$/.test(e.compiled.source) ? `a pair id names a pair, not a node: write ${e.compiled.source.replace(/\.id$/, '.partner')} for the node at its other end`
        : k === 'label' && /\.kind$/.test(e.compiled.source) ? `write ${e.compiled.source.replace(/\.kind$/, '.from')} for the message's sender`
        : 'write a node id'
      : want === 'id' || want === 'id-or-null' ? (k === 'pair' ? `write ${e.compiled.source}.id` : 'write a pair id (text)')
      : 'write a number';
    this.report(e, e.compiled.ast, 'type-mismatch', `${what} needs ${want === 'node' ? 'a node id' : want === 'number' ? 'a number' : 'a pair id'}, but \`${e.compiled.source}\` is ${WORDS[k]}`, fix);
  }
}

/** The expressions a step reads, with what each must give. */
export function stepExpressions(s: Step): { e: Expr | undefined; want: Want; what: string }[] {
  switch (s.kind) {
    case 'gate':
      return [{ e: s.angle, want: 'number', what: 'the angle' }];
    case 'send':
      return [{ e: s.to, want: 'node', what: '"to"' }, { e: s.pair, want: 'id-or-null', what: '"pair"' }, ...Object.values(s.data).map((e) => ({ e, want: 'any' as const, what: 'a data value' }))];
    case 'note':
      return Object.values(s.set).map((e) => ({ e, want: 'any' as const, what: 'a noted value' }));
    case 'correct':
      return [{ e: s.x, want: 'truth', what: '"x"' }, { e: s.z, want: 'truth', what: '"z"' }];
    case 'rebind':
      return [{ e: s.partner, want: 'node', what: '"partner"' }, { e: s.id, want: 'id', what: '"id"' }];
    case 'if':
      return [{ e: s.cond, want: 'truth', what: 'the condition of "if"' }];
    case 'log':
      return s.parts.filter((p): p is Expr => typeof p !== 'string').map((e) => ({ e, want: 'any' as const, what: 'a log value' }));
    default:
      return [];
  }
}
