/** Internal errors: write a crash report, say where, exit 3. */
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { CliIo } from './io.js';
import { EXIT } from './spec.js';

/** A hook the running command sets so a crash can save a replay of the session so far. */
let saveReplay: (() => string | undefined) | undefined;

/** Registers (or clears) the function that writes an automatic replay on a crash. */
export function onCrashSaveReplay(fn: (() => string | undefined) | undefined): void {
  saveReplay = fn;
}

function crashDir(io: CliIo): string {
  return io.env.BELLSTEP_CRASH_DIR ?? join(tmpdir(), 'bellstep-crash');
}

export function reportInternalError(io: CliIo, err: unknown, argv: readonly string[]): number {
  const stamp = `${process.pid}-${Date.now()}`;
  const dir = crashDir(io);
  const reportPath = join(dir, `crash-${stamp}.txt`);
  const detail = err instanceof Error ? `${err.name}: ${err.message}\n${err.stack ?? ''}` : String(err);
  let replayPath: string | undefined;
  try {
    replayPath = saveReplay?.();
  } catch {
    replayPath = undefined;
  }
  try {
    io.writeFile(reportPath, `bellstep internal error\nargs: ${JSON.stringify(argv)}\n\n${detail}\n`);
  } catch {
    // the report is best effort; the message below still tells the user what happened
  }
  const first = err instanceof Error ? err.message : String(err);
  io.stderr(
    `bellstep: internal error: ${first}\n` +
      `  crash report: ${reportPath}\n` +
      (replayPath ? `  automatic replay of the session so far: ${replayPath}\n` : '') +
      `  please file the report with the replay; this is a bug in bellstep, not in your files.\n`,
  );
  return EXIT.internal;
}
