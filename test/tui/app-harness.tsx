/** Runs the debugger app under ink-testing-library, drawing its frames into memory as plain text. */
import { render } from 'ink-testing-library';
import { DebuggerApp } from '../../src/tui/app.js';
import type { Controller } from '../../src/tui/controller.js';
import { MemoryScreen } from '../../src/tui/screen.js';
import { waitFor } from './helpers.js';

/** The app at a fixed size: `stdin` takes keys, `frame()` is the screen as the user would read it. */
export function openApp(c: Controller, columns = 100, rows = 40) {
  const screen = new MemoryScreen();
  const r = render(<DebuggerApp controller={c} screen={screen} size={{ columns, rows }} />);
  const frame = () => screen.text();
  const until = (what: string | RegExp) => waitFor(() => (typeof what === 'string' ? frame().includes(what) : what.test(frame())), frame);
  return { ...r, screen, frame, until };
}
