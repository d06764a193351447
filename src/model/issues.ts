/** Runs a zod schema over part of a YAML file and turns its issues into located InputErrors. */
import type { z } from 'zod';
import { InputError } from './errors.js';
import { decodeIssue, humanErrorMap } from './zod-kit.js';
import { fieldName, type Path, type PathPart, type SourceDoc } from './yaml-source.js';

/** Converts zod issues (paths relative to `base`) to errors pointing into `src`. */
export function issuesToErrors(src: SourceDoc, issues: readonly z.core.$ZodIssue[], base: Path = []): InputError[] {
  const out: InputError[] = [];
  const seen = new Set<string>();
  for (const issue of issues) {
    const path: PathPart[] = [...base, ...issue.path.map((p) => (typeof p === 'number' ? p : String(p)))];
    const p = decodeIssue(issue.message);
    let error: InputError;
    if (p.missing) {
      const name = String(path[path.length - 1]);
      const fix = p.f ? `add "${name}:" (${p.f[0].toLowerCase()}${p.f.slice(1).replace(/\.$/, '')})` : `add "${name}:"`;
      error = InputError.at(src.posAt(path.slice(0, -1)), { code: 'schema', field: fieldName(path), message: `missing required field "${name}"`, fix });
    } else if (p.k !== undefined) {
      error = InputError.at(src.keyPosAt(path, p.k), { code: 'schema', field: fieldName([...path, p.k]), message: p.m, fix: p.f });
    } else {
      error = InputError.at(src.posAt(path), { code: 'schema', field: fieldName(path), message: p.m, fix: p.f });
    }
    // Zod can report one fault twice (a type check and a refinement); say it once.
    const key = `${error.line}:${error.col}:${error.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(error);
  }
  return out;
}

/** Validates `value` (found at `base` in `src`) against `schema`; returns the data or pushes errors. */
export function validate<T>(src: SourceDoc, schema: z.ZodType<T>, value: unknown, errors: InputError[], base: Path = []): T | undefined {
  const r = schema.safeParse(value, { error: humanErrorMap });
  if (r.success) return r.data;
  errors.push(...issuesToErrors(src, r.error.issues, base));
  return undefined;
}
