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

/** One problem of an input error, as the CLI prints it (absent parts are null). */
export interface InputIssue {
  readonly file: string | null;
  readonly line: number | null;
  readonly column: number | null;
  /** Dotted path of the offending field, or the flag or option. */
  readonly field: string | null;
  readonly message: string;
  /** How to fix it. */
  readonly fix: string | null;
}

/** Something wrong with a user's files, flags, options or expressions; `issues` lists every problem found. */
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

  /** Every problem found: this one alone (several for `InputErrors`). */
  get issues(): readonly InputIssue[] {
    return [{ file: this.file ?? null, line: this.line ?? null, column: this.col ?? null, field: this.field ?? null, message: this.message, fix: this.fix ?? null }];
  }

  /** The error for an input file that could not be read (`cause` is the file system's error). */
  static unreadable(path: string, what: string, cause: unknown): InputError {
    const code = (cause as NodeJS.ErrnoException)?.code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : code === 'EACCES' ? 'permission denied' : String((cause as Error)?.message ?? cause);
    return new InputError({ code: 'file', file: path, message: `cannot read the ${what}: ${why}`, fix: `check the path of the ${what}` });
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

/**
 * Several input errors found in one pass; the CLI prints them all. It is an InputError
 * itself (located at the first), so one `instanceof InputError` catches every input error.
 */
export class InputErrors extends InputError {
  readonly errors: readonly InputError[];
  constructor(errors: readonly InputError[]) {
    const first = errors[0];
    super({ code: first?.code ?? 'schema', message: errors.map((e) => e.message).join('; '), file: first?.file, line: first?.line, col: first?.col, field: first?.field, fix: first?.fix });
    this.name = 'InputErrors';
    this.errors = errors;
  }

  override get issues(): readonly InputIssue[] {
    return this.errors.flatMap((e) => e.issues);
  }

  override format(): string {
    return this.errors.map((e) => e.format()).join('\n');
  }
}
