/**
 * Runs the debugger full screen: switches to the alternate screen, renders, and restores the
 * terminal however it ends (quit, SIGTERM, SIGHUP, a crash, or process exit). A crash is
 * rethrown after the terminal is restored, so the CLI can report it and save the replay.
 */
import { render } from 'ink';
import type { Controller } from './controller.js';
import { DebuggerApp } from './app.js';

export interface TerminalStreams {
  readonly stdin: NodeJS.ReadStream;
  readonly stdout: NodeJS.WriteStream;
  readonly stderr: NodeJS.WriteStream;
}

const ALT_ON = '\x1b[?1049h\x1b[H\x1b[2J';
const ALT_OFF = '\x1b[?25h\x1b[?1049l';
const SIGNALS = { SIGTERM: 15, SIGHUP: 1, SIGINT: 2 } as const;

/** Shows the debugger until the user quits; rejects with the error of a crash (after restoring the terminal). */
export async function startDebugger(controller: Controller, io: TerminalStreams): Promise<void> {
  const out = io.stdout;
  let restored = false;
  const restore = () => {
    if (restored) return;
    restored = true;
    try {
      out.write(ALT_OFF);
    } catch {
      // the terminal may already be gone (SIGHUP); nothing left to restore
    }
  };
  out.write(ALT_ON);
  const instance = render(<DebuggerApp controller={controller} />, {
    stdin: io.stdin,
    stdout: out,
    stderr: io.stderr,
    exitOnCtrlC: false,
    patchConsole: false,
    // Ink 6.8's incremental mode draws every changed row one row too low after the first
    // frame (seen in tmux): the standard mode rewrites the frame, which at rows − 1 is cheap
    incrementalRendering: false,
    maxFps: 60,
  });
  const onSignal = (sig: keyof typeof SIGNALS) => {
    instance.unmount();
    restore();
    process.exit(128 + SIGNALS[sig]);
  };
  const handlers = Object.keys(SIGNALS).map((sig) => {
    const h = () => onSignal(sig as keyof typeof SIGNALS);
    process.on(sig, h);
    return [sig, h] as const;
  });
  process.on('exit', restore);
  // after a resize, rows drawn at the old size would linger: clear them before Ink redraws
  const onResize = () => out.write('\x1b[2J');
  out.on('resize', onResize);
  try {
    await instance.waitUntilExit();
  } finally {
    out.off('resize', onResize);
    for (const [sig, h] of handlers) process.off(sig, h);
    instance.unmount();
    restore();
    process.off('exit', restore);
  }
}
