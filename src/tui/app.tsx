/**
 * The debugger as an Ink app: one top-level key handler that forwards to the controller, a
 * timer for autoplay, the terminal size, and the frame drawn on the screen (screen.ts) after
 * every change. All state lives in the controller; this component re-renders when it says
 * something changed. Ink itself draws nothing: it keeps raw mode, the keys and the exit.
 */
import { useApp, useInput, useStdin, type Key } from 'ink';
import { useCallback, useEffect, useLayoutEffect, useRef, useState } from 'react';
import type { Controller } from './controller.js';
import { buildFrame } from './frame.js';
import type { Screen } from './screen.js';
import { useTerminalSize, type TerminalSize } from './use-terminal-size.js';

export interface DebuggerAppProps {
  readonly controller: Controller;
  /** Where frames are drawn: the terminal, or memory in tests. */
  readonly screen: Screen;
  /** A fixed size instead of the terminal's (tests). */
  readonly size?: TerminalSize;
}

/** The debugger's root component. */
export function DebuggerApp({ controller, screen, size }: DebuggerAppProps) {
  const { exit } = useApp();
  const { isRawModeSupported } = useStdin();
  const term = useTerminalSize(size);
  const [, setVersion] = useState(controller.version);

  useEffect(() => controller.subscribe(() => setVersion(controller.version)), [controller]);
  useEffect(() => controller.onExit((error) => exit(error)), [controller, exit]);

  // Ink 6.8 re-subscribes useInput whenever the handler changes: keep one stable handler
  const latest = useRef(controller);
  latest.current = controller;
  const onKey = useCallback((input: string, key: Key) => latest.current.handleKey(input, key), []);
  useInput(onKey, { isActive: isRawModeSupported === true });

  const playing = controller.autoplay?.playing === true;
  const rate = controller.autoplay?.rate ?? 1;
  useEffect(() => {
    if (!playing) return;
    const timer = setInterval(() => controller.autoStep(), Math.max(10, 1000 / rate));
    return () => clearInterval(timer);
  }, [controller, playing, rate]);

  // after every render: a version bump, a resize or a new prop
  useLayoutEffect(() => {
    screen.draw(buildFrame(controller, term.columns, term.rows), controller.colour);
  });

  return null;
}
