/** Public types of the expression language (docs/expressions.md). */

/** A value an expression can produce or read. Records are plain frozen objects. */
export type Value = number | string | boolean | null | readonly Value[] | ValueRecord;
export interface ValueRecord {
  readonly [key: string]: Value;
}

/** Syntax tree node; `start`/`end` are 0-based offsets into the source text. */
export type ExprNode =
  | { readonly type: 'literal'; readonly value: number | string | boolean | null; readonly start: number; readonly end: number }
  | { readonly type: 'name'; readonly name: string; readonly start: number; readonly end: number }
  | { readonly type: 'member'; readonly object: ExprNode; readonly property: string; readonly start: number; readonly end: number }
  | { readonly type: 'index'; readonly object: ExprNode; readonly index: ExprNode; readonly start: number; readonly end: number }
  | { readonly type: 'unary'; readonly op: '-' | '+' | '!'; readonly argument: ExprNode; readonly start: number; readonly end: number }
  | {
      readonly type: 'binary';
      readonly op: '+' | '-' | '*' | '/' | '%' | '<' | '<=' | '>' | '>=' | '==' | '!=' | '&&' | '||';
      readonly left: ExprNode;
      readonly right: ExprNode;
      readonly start: number;
      readonly end: number;
    }
  | { readonly type: 'conditional'; readonly test: ExprNode; readonly consequent: ExprNode; readonly alternate: ExprNode; readonly start: number; readonly end: number }
  | { readonly type: 'call'; readonly callee: string; readonly args: readonly ExprNode[]; readonly start: number; readonly end: number };

/** A parsed expression, ready to evaluate many times. */
export interface Compiled {
  /** The source text as given. */
  readonly source: string;
  readonly ast: ExprNode;
  /** Free names read by the expression (not function names), in first-use order, without duplicates. */
  readonly names: readonly string[];
  /** Function names called, in first-use order, without duplicates. */
  readonly calls: readonly string[];
  /** The expression compiled to closures (not enumerable; built by the parser). */
  readonly run?: (scope: Scope) => Value;
}

/** A log line split into literal text and `{expr}` holes (see `parseTemplate`). */
export interface Template {
  /** Literal text (braces already unescaped) and compiled holes, in order. */
  readonly parts: (string | Compiled)[];
}

/** A function callable from expressions. Throw `ExprEvalError`-style messages as plain Error; the evaluator adds the position. */
export type ExprFunction = (args: readonly Value[]) => Value;

/** What an evaluation can see: names and a whitelist of functions. */
export interface Scope {
  /** Value of a name, or undefined when the name is not bound. */
  lookup(name: string): Value | undefined;
  /** Functions callable by name; only own properties are consulted. Treat a table as unchanging once used: calls cache their lookup per table. */
  readonly functions: Readonly<Record<string, ExprFunction>>;
  /** Names this scope can bind, used only to suggest a fix for an unknown name. */
  listNames?(): Iterable<string>;
  /**
   * A shortcut for `name.field`: the same value that reading the field of `lookup(name)`
   * would give, or undefined to take the general path (which also explains errors). Lets a
   * scope answer without building the whole record.
   */
  member?(name: string, field: string): Value | undefined;
}
