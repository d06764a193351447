/**
 * Input errors: anything wrong with a user's files, flags or expressions. The CLI reports
 * them as one block naming file:line:col, the field and the fix, and exits 2.
 */
import type { SourcePos } from './types.js';

/** Stable codes, so tests and tools can tell errors apart without parsing prose. */
export type InputErrorCode =
  | 'yaml'
  | 'schema'
  | 'unit'
  | 'reference'
  | 'duplicate'
  | 'expression'
  | 'format'
  | 'usage'
  | 'file'
  | 'replay';

export interface InputErrorInit {
  code: InputErrorCode;
  message: string;
  file?: string;
  line?: number;
  col?: number;
  /** Dotted path of the offending field, e.g. `programs.mill.rules[0].when[1].got.kind`. */
  field?: string;
  /** One sentence telling the user how to fix it. */
  fix?: string;
}

export class InputError extends Error {
  readonly code: InputErrorCode;
  readonly file?: string;
  readonly line?: number;
  readonly col?: number;
  readonly field?: string;
  readonly fix?: string;

  constructor(init: InputErrorInit) {
    super(init.message);
    this.name = 'InputError';
    this.code = init.code;
    this.file = init.file;
    this.line = init.line;
    this.col = init.col;
    this.field = init.field;
    this.fix = init.fix;
  }

  /** Builds an error located at a source position. */
  static at(pos: SourcePos | undefined, init: Omit<InputErrorInit, 'file' | 'line' | 'col'>): InputError {
    return new InputError({ ...init, file: pos?.file, line: pos?.line, col: pos?.col });
  }

  /** `file:line:col: field: message` plus an indented fix line. */
  format(): string {
    const where = this.file ? [this.file, this.line, this.col].filter((p) => p !== undefined).join(':') : '';
    const head = [where, this.field].filter(Boolean).join(': ');
    const first = head ? `${head}: ${this.message}` : this.message;
    // continuation lines of a fix (an excerpt with carets) line up under its first line
    return this.fix ? `${first}\n  fix: ${this.fix.split('\n').join('\n       ')}` : first;
  }
}

/** Several input errors found in one pass; the CLI prints them all. */
export class InputErrors extends Error {
  readonly errors: readonly InputError[];
  constructor(errors: readonly InputError[]) {
    super(errors.map((e) => e.message).join('; '));
    this.name = 'InputErrors';
    this.errors = errors;
  }
  format(): string {
    return this.errors.map((e) => e.format()).join('\n');
  }
}
