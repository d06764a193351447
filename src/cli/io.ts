/** The outside world as the CLI sees it, so tests can run commands in-process. */
import { accessSync, closeSync, constants, fstatSync, mkdirSync, openSync, readSync, statSync, writeFileSync, type Stats } from 'node:fs';
import { dirname } from 'node:path';

/** What a path names, as far as reading and writing it is concerned. */
export type PathKind = 'file' | 'directory' | 'fifo' | 'device' | 'socket' | 'other' | 'missing';

/** What `stat` tells about a path (symbolic links are followed). */
export interface PathInfo {
  readonly kind: PathKind;
  /** Bytes, for a regular file; 0 otherwise. */
  readonly size: number;
  /** Device and inode, so that two names of one file can be told apart from two files. */
  readonly id?: string;
  /** Whether this process may write it (for a folder: create files in it). */
  readonly writable: boolean;
}

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
  /** What a path is, without opening it (a FIFO or a device is never read to find out). */
  stat(path: string): PathInfo;
  /** True when stdout is a terminal (progress goes to stderr otherwise). */
  readonly stdoutIsTTY: boolean;
  /** True when stderr is a terminal (a sweep draws its progress bar there). */
  readonly stderrIsTTY: boolean;
  /** True when stdin is a terminal (the debugger needs one). */
  readonly stdinIsTTY: boolean;
  readonly env: Readonly<Record<string, string | undefined>>;
}

function kindOf(s: Stats): PathKind {
  if (s.isFile()) return 'file';
  if (s.isDirectory()) return 'directory';
  if (s.isFIFO()) return 'fifo';
  if (s.isCharacterDevice() || s.isBlockDevice()) return 'device';
  if (s.isSocket()) return 'socket';
  return 'other';
}

function ioError(code: string, message: string): Error {
  return Object.assign(new Error(message), { code });
}

/** Reads at most `maxBytes` (+1, to notice more) from a regular file, checked on the open descriptor. */
function readBounded(path: string, maxBytes: number | undefined): string {
  // O_NONBLOCK: should the path become a FIFO after it was checked, opening it must not wait for a writer
  const fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) throw ioError('ENOTREG', `${path} is not a regular file`);
    const limit = maxBytes ?? Number.MAX_SAFE_INTEGER;
    if (st.size > limit) throw ioError('EFBIG', `${path} is larger than ${limit} bytes`);
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const room = Math.min(1 << 20, limit + 1 - total);
      if (room <= 0) throw ioError('EFBIG', `${path} is larger than ${limit} bytes`);
      const buf = Buffer.allocUnsafe(room);
      const n = readSync(fd, buf, 0, room, null);
      if (n === 0) break;
      chunks.push(n === room ? buf : buf.subarray(0, n));
      total += n;
    }
    return Buffer.concat(chunks, total).toString('utf8');
  } finally {
    closeSync(fd);
  }
}

function statPath(path: string): PathInfo {
  let s: Stats | undefined;
  try {
    s = statSync(path, { throwIfNoEntry: false });
  } catch (e) {
    // a part of the path that is a file (ENOTDIR) or a loop of links: nothing can be there
    if ((e as NodeJS.ErrnoException).code === 'ENOTDIR' || (e as NodeJS.ErrnoException).code === 'ELOOP') return { kind: 'missing', size: 0, writable: false };
    throw e;
  }
  if (!s) return { kind: 'missing', size: 0, writable: false };
  let writable = true;
  try {
    accessSync(path, constants.W_OK);
  } catch {
    writable = false;
  }
  const kind = kindOf(s);
  return { kind, size: kind === 'file' ? s.size : 0, id: `${s.dev}:${s.ino}`, writable };
}

/** The real file system, without the streams: what tests that need real files combine with their own output. */
export function fileIo(): Pick<CliIo, 'readFile' | 'writeFile' | 'stat'> {
  return {
    readFile: readBounded,
    writeFile: (p, t) => {
      mkdirSync(dirname(p), { recursive: true });
      writeFileSync(p, t);
    },
    stat: statPath,
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
