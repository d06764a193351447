/** The outside world as the CLI sees it, so tests can run commands in-process. */
import { closeSync, mkdirSync, openSync, readFileSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { dirname } from 'node:path';

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): string;
  writeFile(path: string, text: string): void;
  /** Opens a file to write in pieces, as a replay is written while its run goes on. */
  openWrite(path: string): FileWriter;
  /** What is at a path: a regular file, a folder, something else (a pipe, a device), or nothing. */
  pathKind(path: string): 'file' | 'dir' | 'other' | 'missing';
  /** True when stdout is a terminal (progress goes to stderr otherwise). */
  readonly stdoutIsTTY: boolean;
  /** True when stderr is a terminal (a sweep draws its progress bar there). */
  readonly stderrIsTTY: boolean;
  /** True when stdin is a terminal (the debugger needs one). */
  readonly stdinIsTTY: boolean;
  readonly env: Readonly<Record<string, string | undefined>>;
}

/** A file being written in pieces. */
export interface FileWriter {
  write(text: string): void;
  close(): void;
}

/** The real process streams and file system. */
export function processIo(): CliIo {
  return {
    stdout: (t) => void process.stdout.write(t),
    stderr: (t) => void process.stderr.write(t),
    readFile: (p) => readFileSync(p, 'utf8'),
    writeFile: (p, t) => {
      mkdirSync(dirname(p), { recursive: true });
      writeFileSync(p, t);
    },
    openWrite: (p) => {
      mkdirSync(dirname(p), { recursive: true });
      const fd = openSync(p, 'w');
      return {
        write: (t) => void writeSync(fd, t),
        close: () => closeSync(fd),
      };
    },
    pathKind: (p) => {
      try {
        const st = statSync(p);
        return st.isFile() ? 'file' : st.isDirectory() ? 'dir' : 'other';
      } catch {
        return 'missing';
      }
    },
    stdoutIsTTY: process.stdout.isTTY === true,
    stderrIsTTY: process.stderr.isTTY === true,
    stdinIsTTY: process.stdin.isTTY === true,
    env: process.env,
  };
}
