/**
 * Runs the real CLI in-process against an in-memory file system, returning what a person
 * would see: stdout, stderr and the exit code.
 */
import { main } from '../../src/cli/main.js';
import { dirname, resolve } from 'node:path';
import { coarseKind, type CliIo, type PathInfo, type PathKind } from '../../src/cli/io.js';

export interface MemoryIoOptions {
  readonly stdoutIsTTY?: boolean;
  readonly stdinIsTTY?: boolean;
  readonly stderrIsTTY?: boolean;
  readonly env?: Readonly<Record<string, string | undefined>>;
  /** Paths that are folders (besides the folders of the files given, which exist too). */
  readonly dirs?: readonly string[];
  /** Paths that are something other than a file or a folder, e.g. `{'/dev/zero': 'device'}`. */
  readonly special?: Readonly<Record<string, PathKind>>;
  /** Paths (files or folders) that cannot be written. */
  readonly readOnly?: readonly string[];
}

/** A CliIo over an in-memory file map that records everything written. */
export interface MemoryIo extends CliIo {
  /** Files by path: the ones given, plus every file the command wrote. */
  readonly files: Map<string, string>;
  /** Everything written to stdout so far. */
  stdoutText(): string;
  /** Everything written to stderr so far. */
  stderrText(): string;
}

function enoent(path: string): Error {
  // The same shape as node's fs error, so code that inspects `code` behaves as with real files.
  return Object.assign(new Error(`ENOENT: no such file or directory, open '${path}'`), { code: 'ENOENT', errno: -2, syscall: 'open', path });
}

/** An in-memory CliIo; reading a path not in `files` throws an ENOENT error like fs does. */
export function memoryIo(files: Record<string, string> = {}, opts: MemoryIoOptions = {}): MemoryIo {
  const store = new Map(Object.entries(files));
  const out: string[] = [];
  const err: string[] = [];
  const readOnly = new Set((opts.readOnly ?? []).map((p) => resolve(p)));
  // the folders that hold a file exist, up to the root; so do the ones declared
  const isDir = (p: string): boolean => {
    const r = resolve(p);
    if ((opts.dirs ?? []).some((d) => resolve(d) === r)) return true;
    for (const f of store.keys()) for (let d = dirname(resolve(f)); ; d = dirname(d)) {
      if (d === r) return true;
      if (dirname(d) === d) break;
    }
    return r === resolve('/') || r === resolve('.');
  };
  const stat = (p: string): PathInfo => {
    const special = opts.special?.[p];
    const writable = !readOnly.has(resolve(p));
    if (special !== undefined) return { kind: special, size: 0, writable };
    const r = resolve(p);
    const key = store.has(p) ? p : [...store.keys()].find((k) => resolve(k) === r);
    const text = key === undefined ? undefined : store.get(key);
    if (text !== undefined) return { kind: 'file', size: Buffer.byteLength(text), id: `mem:${r}`, writable };
    if (isDir(p)) return { kind: 'directory', size: 0, id: `mem:${resolve(p)}`, writable };
    return { kind: 'missing', size: 0, writable: false };
  };
  return {
    files: store,
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
    readFile: (p, maxBytes) => {
      const text = store.get(p);
      if (text === undefined) throw enoent(p);
      if (maxBytes !== undefined && Buffer.byteLength(text) > maxBytes) throw Object.assign(new Error(`EFBIG: ${p}`), { code: 'EFBIG' });
      return text;
    },
    writeFile: (p, t) => {
      const info = stat(p);
      if (info.kind === 'directory') throw Object.assign(new Error(`EISDIR: illegal operation on a directory, open '${p}'`), { code: 'EISDIR' });
      if (readOnly.has(resolve(p)) || readOnly.has(resolve(dirname(p)))) throw Object.assign(new Error(`EACCES: permission denied, open '${p}'`), { code: 'EACCES' });
      store.set(p, t);
    },
    openWrite: (p) => {
      store.set(p, '');
      return { write: (t) => void store.set(p, (store.get(p) ?? '') + t), close: () => undefined };
    },
    stat,
    pathKind: (p) => coarseKind(stat(p)),
    stdoutIsTTY: opts.stdoutIsTTY ?? false,
    stdinIsTTY: opts.stdinIsTTY ?? false,
    stderrIsTTY: opts.stderrIsTTY ?? false,
    env: opts.env ?? {},
    stdoutText: () => out.join(''),
    stderrText: () => err.join(''),
  };
}

export interface CliResult {
  readonly stdout: string;
  readonly stderr: string;
  readonly code: number;
  /** The file map after the run, including files the command wrote. */
  readonly files: Map<string, string>;
}

/** Runs `bellstep <argv>` in-process with `files` as the only readable files. */
export async function runCli(argv: string[], files: Record<string, string> = {}, opts: MemoryIoOptions = {}): Promise<CliResult> {
  const io = memoryIo(files, opts);
  const code = await main(argv, io);
  return { stdout: io.stdoutText(), stderr: io.stderrText(), code, files: io.files };
}
