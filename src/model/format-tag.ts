/** The `format:` line of each file kind, checked first so a wrong file gets a clear word. */
import { InputError, InputErrors } from './errors.js';
import type { SourceDoc } from './yaml-source.js';

/** The file kinds bellstep reads, with the keys that give each away. */
export const FILE_KINDS = {
  'program set': { tag: 'bellstep/program-set@1', telltales: ['nodes', 'links', 'programs'], how: 'pass it as the NET.yaml argument' },
  'noise model': { tag: 'bellstep/noise@1', telltales: ['seed', 'defaults', 'faults'], how: 'pass it with --noise' },
} as const;

export type FileKind = keyof typeof FILE_KINDS;

/** Throws unless the document's `format` is the tag of `kind`, saying what the file looks like instead. */
export function checkFormatTag(src: SourceDoc, kind: FileKind): void {
  const value = src.value as Record<string, unknown>;
  const expected = FILE_KINDS[kind].tag;
  const other = (Object.keys(FILE_KINDS) as FileKind[]).find((k) => k !== kind) as FileKind;
  const otherInfo = FILE_KINDS[other];
  const keys = Object.keys(value);
  const looksOther = value.format === otherInfo.tag || (otherInfo.telltales.some((k) => keys.includes(k)) && !FILE_KINDS[kind].telltales.some((k) => keys.includes(k)));
  const hint = looksOther ? `; this file looks like a ${other}: ${otherInfo.how}` : '';
  if (!('format' in value)) {
    throw new InputErrors([
      new InputError({
        code: 'format',
        file: src.file,
        line: 1,
        col: 1,
        field: 'format',
        message: `missing "format: ${expected}" (a ${kind} starts with it)${hint}`,
        fix: `add "format: ${expected}" as the first line`,
      }),
    ]);
  }
  if (value.format !== expected) {
    throw new InputErrors([
      InputError.at(src.posAt(['format']), {
        code: 'format',
        field: 'format',
        message: `expected format "${expected}" for a ${kind}, got ${JSON.stringify(value.format)}${hint}`,
        fix: looksOther ? `${otherInfo.how}, and give the ${kind} its own file` : `write "format: ${expected}"`,
      }),
    ]);
  }
}
