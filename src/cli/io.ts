/** The outside world as the CLI sees it, so tests can run commands in-process. */
import { closeSync, mkdirSync, openSync, writeFileSync, writeSync } from 'node:fs';
import { dirname } from 'node:path';
import { readBounded, statPath, type PathInfo } from '../api/files.js';

export type { PathInfo, PathKind } from '../api/files.js';

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  /**
   * Reads a regular file as UTF-8. With `maxBytes`, a file that is larger (or that grows
   * past it while being read) throws an error with code `EFBIG`; a path that is not a
   * regular file throws one with code `ENOTREG`, before anything is read.
   */
  readFile(path: string, maxBytes?: number): string;
  writeFile(path: string, text: string): void;
  /** Opens a file to write in pieces, as a replay is written while its run goes on. */
  openWrite(path: string): FileWriter;
  /** What a path is, without opening it (a FIFO or a device is never read to find out). */
  stat(path: string): PathInfo;
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

/** The coarse kind of `pathKind` from what `stat` tells. */
export function coarseKind(info: PathInfo): 'file' | 'dir' | 'other' | 'missing' {
  return info.kind === 'file' ? 'file' : info.kind === 'directory' ? 'dir' : info.kind === 'missing' ? 'missing' : 'other';
}

/** The real file system, without the streams: what tests that need real files combine with their own output. */
export function fileIo(): Pick<CliIo, 'readFile' | 'writeFile' | 'openWrite' | 'stat' | 'pathKind'> {
  return {
    readFile: readBounded,
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
    stat: statPath,
    pathKind: (p) => coarseKind(statPath(p)),
  };
}

/** The real process streams and file system. */
export function processIo(): CliIo {
  return {
    ...fileIo(),
    stdout: (t) => void process.stdout.write(t),
    stderr: (t) => void process.stderr.write(t),
    stdoutIsTTY: process.stdout.isTTY === true,
    stderrIsTTY: process.stderr.isTTY === true,
    stdinIsTTY: process.stdin.isTTY === true,
    env: process.env,
  };
}
