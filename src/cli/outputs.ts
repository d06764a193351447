/**
 * Output files (docs/cli.md, "Files"): an output never overwrites an input of the same
 * command, and a path that cannot be written is an input error (exit 2) that names it,
 * found before any work is done. Every output goes through here: `--record`, `--junit`,
 * `-o`, `--save-failures` and the debugger's `save`.
 */
import { dirname, resolve } from 'node:path';
import { InputError } from '../model/errors.js';
import type { CliIo, FileWriter, PathInfo } from './io.js';

function usage(path: string, flag: string, message: string, fix: string): InputError {
  return new InputError({ code: 'usage', file: path, field: flag, message, fix });
}

/** Refuses an output path that is one of the command's inputs, by name or as the same file under another name. */
export function checkNotInput(path: string, flag: string, inputs: readonly (string | undefined)[], io?: CliIo): void {
  const target = resolve(path);
  const out = io?.stat(path);
  const clash = inputs.find((i) => {
    if (i === undefined) return false;
    if (resolve(i) === target) return true;
    // a link or another spelling of the same file: same device and inode
    const inp = io?.stat(i);
    return out?.id !== undefined && inp?.id !== undefined && out.id === inp.id;
  });
  if (clash !== undefined) {
    throw usage(path, flag, `${path} is also an input of this command (${clash}); writing it would overwrite that input`, `write ${flag} to another path`);
  }
}

/** The first ancestor of `path` that exists, and what it is. */
function nearestExisting(io: CliIo, path: string): { at: string; info: PathInfo } {
  let at = resolve(path);
  for (;;) {
    const parent = dirname(at);
    if (parent === at) return { at, info: io.stat(at) };
    at = parent;
    const info = io.stat(at);
    if (info.kind !== 'missing') return { at, info };
  }
}

/** Refuses a path whose folders cannot be made or written in. */
function checkCreatable(io: CliIo, path: string, flag: string, what: string): void {
  const { at, info } = nearestExisting(io, path);
  if (info.kind !== 'directory') throw usage(path, flag, `cannot create ${path}: ${at} is not a folder`, `give ${flag} a path under a folder, e.g. ${flag} ${what}`);
  if (!info.writable) throw usage(path, flag, `cannot create ${path}: the folder ${at} is not writable`, `give ${flag} a path in a folder you can write`);
}

/** Refuses a file output that is a directory or cannot be written, before any work is done (an existing file is replaced). */
export function checkFileOutput(io: CliIo, path: string, flag: string, example = 'out.json'): void {
  const info = io.stat(path);
  switch (info.kind) {
    case 'missing':
      checkCreatable(io, path, flag, example);
      return;
    case 'directory':
      throw usage(path, flag, `${path} is a directory`, `give ${flag} a file name, e.g. ${flag} ${example}`);
    case 'file':
      if (!info.writable) throw usage(path, flag, `cannot write ${path}: permission denied`, `give ${flag} a path you can write`);
      return;
    default:
      // writing to a pipe or a device could block until something reads it
      throw usage(path, flag, `${path} is not a regular file (a pipe or a device); bellstep writes only to files`, `give ${flag} a file name, e.g. ${flag} ${example}`);
  }
}

/** Refuses a folder output that is an existing file, or a folder that cannot be made or written. */
export function checkFolderOutput(io: CliIo, path: string, flag: string, example = 'failures'): void {
  const info = io.stat(path);
  if (info.kind === 'missing') return checkCreatable(io, path, flag, example);
  if (info.kind !== 'directory') throw usage(path, flag, `${path} is a file, not a folder`, `give ${flag} a folder, e.g. ${flag} ${example}`);
  if (!info.writable) throw usage(path, flag, `cannot write in the folder ${path}: permission denied`, `give ${flag} a folder you can write`);
}

/** Every check an output file gets: not an input, not a directory, writable. */
export function checkOutput(io: CliIo, path: string, flag: string, inputs: readonly (string | undefined)[], example?: string): void {
  checkNotInput(path, flag, inputs, io);
  checkFileOutput(io, path, flag, example);
}

/** Writes an output, turning a failure into an input error that names the path and the flag. */
export function writeOutput(io: CliIo, path: string, text: string, flag: string): void {
  try {
    io.writeFile(path, text);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why =
      code === 'EACCES' || code === 'EPERM' ? 'permission denied'
      : code === 'EISDIR' ? 'it is a directory'
      : code === 'ENOTDIR' ? 'a part of the path is a file'
      : code === 'EROFS' ? 'read-only file system'
      : code === 'ENOSPC' ? 'no space left on the device'
      : (e as Error).message;
    throw new InputError({ code: 'file', file: path, field: flag, message: `cannot write ${path}: ${why}`, fix: `give ${flag} a path you can write` });
  }
}

/** Opens an output to write in pieces; a failure is an input error naming the path and the flag. */
export function openOutput(io: CliIo, path: string, flag: string): FileWriter {
  const kind = io.pathKind(path);
  if (kind === 'dir' || kind === 'other') {
    throw new InputError({ code: 'file', file: path, field: flag, message: `cannot write ${path}: it is ${kind === 'dir' ? 'a directory' : 'not a regular file (a pipe or a device)'}`, fix: `give ${flag} a file path` });
  }
  try {
    return io.openWrite(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'EACCES' || code === 'EPERM' ? 'permission denied' : code === 'ENOTDIR' ? 'a part of the path is a file' : code === 'EROFS' ? 'read-only file system' : (e as Error).message;
    throw new InputError({ code: 'file', file: path, field: flag, message: `cannot write ${path}: ${why}`, fix: `give ${flag} a path you can write` });
  }
}

/**
 * Writes a whole file, refusing at once a path that is not a regular file: writing to a pipe
 * or a device could block the process (and with it the debugger and its signal handlers)
 * until something reads it. Throws an Error that says what is wrong.
 */
export function writeRegularFile(io: CliIo, path: string, text: string): void {
  const kind = io.pathKind(path);
  if (kind === 'dir') throw new Error(`${path} is a directory`);
  if (kind === 'other') throw new Error(`${path} is not a regular file (a pipe or a device); bellstep writes only to files`);
  io.writeFile(path, text);
}
