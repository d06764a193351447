/**
 * Runs the debugger full screen: switches to the alternate screen, renders, and restores the
 * terminal however it ends (quit, SIGTERM, SIGHUP, a crash, or process exit). A crash is
 * rethrown after the terminal is restored, so the CLI can report it and save the replay.
 */
import { render } from 'ink';
import type { Controller } from './controller.js';
import { DebuggerApp } from './app.js';
import { TerminalScreen } from './screen.js';

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
  const screen = new TerminalScreen(out);
  const instance = render(<DebuggerApp controller={controller} screen={screen} />, {
    stdin: io.stdin,
    stdout: out,
    stderr: io.stderr,
    exitOnCtrlC: false,
    patchConsole: false,
    // the screen draws the frames; Ink's own output stays empty
    incrementalRendering: false,
  });
  const onSignal = (sig: keyof typeof SIGNALS) => {
    screen.stop();
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
  try {
    await instance.waitUntilExit();
  } finally {
    screen.stop();
    for (const [sig, h] of handlers) process.off(sig, h);
    instance.unmount();
    restore();
    process.off('exit', restore);
  }
}
