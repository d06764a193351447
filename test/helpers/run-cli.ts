/**
 * Runs the real CLI in-process against an in-memory file system, returning what a person
 * would see: stdout, stderr and the exit code.
 */
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';

export interface MemoryIoOptions {
  readonly stdoutIsTTY?: boolean;
  readonly stdinIsTTY?: boolean;
  readonly stderrIsTTY?: boolean;
  readonly env?: Readonly<Record<string, string | undefined>>;
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
  return {
    files: store,
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
    readFile: (p) => {
      const text = store.get(p);
      if (text === undefined) throw enoent(p);
      return text;
    },
    writeFile: (p, t) => void store.set(p, t),
    openWrite: (p) => {
      store.set(p, '');
      return { write: (t) => void store.set(p, (store.get(p) ?? '') + t), close: () => undefined };
    },
    pathKind: (p) => (store.has(p) ? 'file' : [...store.keys()].some((k) => k.startsWith(`${p}/`)) ? 'dir' : 'missing'),
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
