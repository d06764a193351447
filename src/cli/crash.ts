/** Internal errors: write a crash report, say where, exit 3. */
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { CliIo } from './io.js';
import { EXIT } from './spec.js';

/** A hook the running command sets so a crash can save a replay of the session so far. */
let saveReplay: ((why: string) => string | undefined) | undefined;

/** Registers (or clears) the function that writes an automatic replay on a crash; it returns the path. */
export function onCrashSaveReplay(fn: ((why: string) => string | undefined) | undefined): void {
  saveReplay = fn;
}

/** Where crash reports and automatic replays go: $BELLSTEP_CRASH_DIR or the system temp folder. */
export function crashDir(io: CliIo): string {
  return io.env.BELLSTEP_CRASH_DIR ?? join(tmpdir(), 'bellstep-crash');
}

/** A fresh path for an automatic replay. */
export function crashReplayPath(io: CliIo): string {
  return join(crashDir(io), `auto-${process.pid}-${Date.now()}.replay.json`);
}

export function reportInternalError(io: CliIo, err: unknown, argv: readonly string[]): number {
  const stamp = `${process.pid}-${Date.now()}`;
  const dir = crashDir(io);
  const reportPath = join(dir, `crash-${stamp}.txt`);
  const detail = err instanceof Error ? `${err.name}: ${err.message}\n${err.stack ?? ''}` : String(err);
  let replayPath: string | undefined;
  try {
    replayPath = saveReplay?.(err instanceof Error ? err.message : String(err));
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
