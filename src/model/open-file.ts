/** The first steps every input file takes: parse with positions, check the format tag, validate the shape. */
import type { z } from 'zod';
import { FileCtx } from './file-ctx.js';
import { checkFormatTag, type FileKind } from './format-tag.js';
import { validate } from './issues.js';
import { SourceDoc, type DuplicateKeyHook } from './yaml-source.js';

/**
 * Parses a file and validates it against a schema; throws InputErrors naming file:line:col
 * for anything wrong, so what comes back is the raw value of the right shape.
 */
export function openFile<T>(file: string, text: string, kind: FileKind, schema: z.ZodType<unknown>, onDuplicate?: DuplicateKeyHook): { ctx: FileCtx; raw: T } {
  const src = SourceDoc.parse(file, text, onDuplicate);
  checkFormatTag(src, kind);
  const ctx = new FileCtx(src);
  const raw = validate(src, schema, src.value, ctx.errors) as T | undefined;
  ctx.throwIfErrors();
  if (!raw) throw new Error('unreachable: validation returned nothing without errors');
  return { ctx, raw };
}
