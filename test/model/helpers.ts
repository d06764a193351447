/** Shared bits of the model tests: fixtures, positions found in text, error capture. */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { InputError, InputErrors } from '../../src/model/errors.js';

const here = dirname(fileURLToPath(import.meta.url));

/** The text of a fixture under test/model/fixtures. */
export function fixture(name: string): string {
  return readFileSync(join(here, 'fixtures', name), 'utf8');
}

/** 1-based line and column of the first occurrence of `needle` in `text` (after line `after`). */
export function where(text: string, needle: string, after = 0): { line: number; col: number } {
  const lines = text.split('\n');
  for (let i = after; i < lines.length; i++) {
    const c = lines[i].indexOf(needle);
    if (c >= 0) return { line: i + 1, col: c + 1 };
  }
  throw new Error(`"${needle}" not found in the text`);
}

/** The input errors `fn` throws (failing the test if it throws none). */
export function inputErrors(fn: () => unknown): readonly InputError[] {
  try {
    fn();
  } catch (e) {
    if (e instanceof InputErrors) return e.errors;
    if (e instanceof InputError) return [e];
    throw e;
  }
  throw new Error('expected input errors, got none');
}
