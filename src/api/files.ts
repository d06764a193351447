/**
 * Reading input files safely (docs/cli.md, "Files"): an input must be a regular file within
 * the size of its kind, or it is an input error before anything is read. A device such as
 * /dev/zero, a named pipe or a folder is never opened for reading. The CLI and the library
 * read every input through here.
 */
import { accessSync, closeSync, constants, fstatSync, openSync, readSync, statSync, type Stats } from 'node:fs';
import { InputError } from '../model/errors.js';

/** The kinds of file bellstep reads, each with the largest size it may have. */
export const INPUT_LIMITS = {
  'program set': 16 * 1024 * 1024,
  'noise model': 16 * 1024 * 1024,
  'replay file': 256 * 1024 * 1024,
  'sweep file': 64 * 1024 * 1024,
} as const;

/** A kind of input file. */
export type InputKind = keyof typeof INPUT_LIMITS;

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

/** The two things reading an input needs, so that tests can give a file system in memory. */
export interface FileAccess {
  /** What a path is, without opening it. */
  stat(path: string): PathInfo;
  /** The text of a regular file; more than `maxBytes` throws with code `EFBIG`, not a regular file with `ENOTREG`. */
  readFile(path: string, maxBytes?: number): string;
}

/** `16 MiB`, `256 MiB`: a byte count as the limits are documented. */
export function mebibytes(bytes: number): string {
  return `${Math.round((bytes / 1024 / 1024) * 10) / 10} MiB`;
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
export function readBounded(path: string, maxBytes?: number): string {
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

/** What a path is on the real file system. */
export function statPath(path: string): PathInfo {
  let s: Stats | undefined;
  try {
    s = statSync(path, { throwIfNoEntry: false });
  } catch (e) {
    // a part of the path that is a file (ENOTDIR) or a loop of links: nothing can be there
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOTDIR' || code === 'ELOOP' || code === 'ENAMETOOLONG') return { kind: 'missing', size: 0, writable: false };
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

/** The real file system. */
export const realFiles: FileAccess = { stat: statPath, readFile: readBounded };

const KIND_WORDS: Partial<Record<PathKind, string>> = {
  directory: 'a directory',
  fifo: 'a named pipe (FIFO)',
  device: 'a device',
  socket: 'a socket',
  other: 'not a regular file',
};

function fileError(path: string, what: string, why: string, fix = `check the path of the ${what}`): InputError {
  return new InputError({ code: 'file', file: path, message: `cannot read the ${what}: ${why}`, fix });
}

/**
 * Reads an input file: a regular file within the size of its kind. A directory, a device, a
 * pipe or a file that is too large is an input error before anything is read.
 */
export function readInputFile(fs: FileAccess, path: string, what: InputKind): string {
  const limit = INPUT_LIMITS[what];
  const info = fs.stat(path);
  if (info.kind === 'missing') throw fileError(path, what, 'no such file');
  const notRegular = `give the path of a ${what} file; bellstep reads regular files only`;
  if (info.kind !== 'file') throw fileError(path, what, `${path} is ${KIND_WORDS[info.kind]}`, notRegular);
  const tooLarge = () => fileError(path, what, `it is larger than ${mebibytes(limit)}, the most a ${what} may be`, `a ${what} holds at most ${mebibytes(limit)}; check that this is the right file`);
  if (info.size > limit) throw tooLarge();
  try {
    return fs.readFile(path, limit);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'EFBIG') throw tooLarge();
    if (code === 'ENOTREG') throw fileError(path, what, `${path} is not a regular file`, notRegular);
    throw InputError.unreadable(path, what, e);
  }
}
