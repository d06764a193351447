/**
 * Output files (FORMAT.md §5): an output never overwrites an input of the same command, and
 * a path that cannot be written is an input error (exit 2) that names it.
 */
import { resolve } from 'node:path';
import { InputError } from '../model/errors.js';
import type { CliIo, FileWriter } from './io.js';

/** Refuses an output path that is one of the command's inputs. */
export function checkNotInput(path: string, flag: string, inputs: readonly (string | undefined)[]): void {
  const target = resolve(path);
  const clash = inputs.find((i) => i !== undefined && resolve(i) === target);
  if (clash !== undefined) {
    throw new InputError({ code: 'usage', field: flag, message: `${path} is also an input of this command; it would be overwritten`, fix: `write ${flag} to another path` });
  }
}

/** Refuses a file output that is a directory, before any work is done (an existing file is fine: it is replaced). */
export function checkFileOutput(io: CliIo, path: string, flag: string): void {
  try {
    io.readFile(path);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'EISDIR') {
      throw new InputError({ code: 'usage', field: flag, message: `${path} is a directory`, fix: `give ${flag} a file name, e.g. ${flag} report.xml` });
    }
  }
}

/** Refuses a folder output that is an existing file. */
export function checkFolderOutput(io: CliIo, path: string, flag: string): void {
  let isFile = false;
  try {
    io.readFile(path);
    isFile = true;
  } catch {
    // missing (it will be made) or a folder: both are fine
  }
  if (isFile) throw new InputError({ code: 'usage', field: flag, message: `${path} is a file, not a folder`, fix: `give ${flag} a folder, e.g. ${flag} failures` });
}

/** Writes an output, turning a failure into an input error that names the path and the flag. */
export function writeOutput(io: CliIo, path: string, text: string, flag: string): void {
  try {
    io.writeFile(path, text);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'EACCES' || code === 'EPERM' ? 'permission denied' : code === 'EISDIR' ? 'it is a directory' : code === 'ENOTDIR' ? 'a part of the path is a file' : code === 'EROFS' ? 'read-only file system' : (e as Error).message;
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
