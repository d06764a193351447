#!/usr/bin/env node
import { setFlagsFromString } from 'node:v8';
// React's development build is about 4x slower per frame; set production before it loads.
process.env.NODE_ENV ??= 'production';
// V8 doubles the young generation as a long run allocates, up to 3 x 16 MiB, so a plain run's
// peak memory grew with its length (86 MB after 100k events, 118 MB after 1M). Keeping the
// young generation at its first size holds it flat (73 and 90 MB) at the same speed; this is
// read at every growth, so setting it here, before the work starts, is enough (DEVELOPERS.md).
setFlagsFromString('--semi-space-growth-factor=1');
// Node writes to a pipe without blocking and queues what the pipe cannot take yet; a command
// that writes a long output in one go (`run --json` of a million events: 21 MB) never yields,
// so the whole output waited in memory (230 MB peak against 93 MB into a file). A blocking
// pipe makes each write wait for the reader instead, as writes to a file do.
const stdoutHandle = (process.stdout as unknown as { _handle?: { setBlocking?: (on: boolean) => unknown } })._handle;
if (!process.stdout.isTTY) stdoutHandle?.setBlocking?.(true);
// A reader that stops early (`| head`) closes the pipe: the rest of the output has nowhere to
// go, so end quietly rather than with Node's unhandled-error trace.
process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  if (e.code !== 'EPIPE') throw e;
  process.exit(typeof process.exitCode === 'number' ? process.exitCode : 0);
});
const { main } = await import('./main.js');
const { processIo } = await import('./io.js');
process.exitCode = await main(process.argv.slice(2), processIo());
