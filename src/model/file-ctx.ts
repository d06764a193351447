/** Per-file bookkeeping while building typed values: where things are and what went wrong. */
import { InputError, InputErrors, type InputErrorCode } from './errors.js';
import type { SourcePos } from './types.js';
import { fieldName, type Path, type SourceDoc } from './yaml-source.js';

export interface Problem {
  readonly code: InputErrorCode;
  readonly message: string;
  readonly fix?: string;
}

/** Collects located errors for one file. */
export class FileCtx {
  readonly errors: InputError[] = [];

  constructor(readonly src: SourceDoc) {}

  get file(): string {
    return this.src.file;
  }

  pos(path: Path): SourcePos {
    return this.src.posAt(path);
  }

  /** Records a problem with the value at `path` (or with its key `key`, when given). */
  error(path: Path, p: Problem, key?: string): void {
    const pos = key === undefined ? this.src.posAt(path) : this.src.keyPosAt(path, key);
    this.errors.push(InputError.at(pos, { ...p, field: fieldName(key === undefined ? path : [...path, key]) }));
  }

  /** Parses a quantity with `parse`, relocating its error to `path`. */
  unit(path: Path, text: string, parse: (t: string) => number): number | undefined {
    try {
      return parse(text);
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
      this.errors.push(InputError.at(this.src.posAt(path), { code: 'unit', field: fieldName(path), message: err.message, fix: err.fix }));
      return undefined;
    }
  }

  /** Throws everything collected so far, if anything. */
  throwIfErrors(): void {
    if (this.errors.length > 0) throw new InputErrors(sortErrors(this.errors));
  }
}

/** Errors in file order, so the first one printed is the first one in the file. */
export function sortErrors(errors: readonly InputError[]): InputError[] {
  return [...errors].sort((a, b) => (a.line ?? 0) - (b.line ?? 0) || (a.col ?? 0) - (b.col ?? 0));
}
