/**
 * The debugger as an Ink app: one top-level key handler that forwards to the controller, a
 * timer for autoplay, the terminal size, and the frame view. All state lives in the
 * controller; this component re-renders when it says something changed.
 */
import { useApp, useInput, useStdin, type Key } from 'ink';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { Controller } from './controller.js';
import { FrameView } from './components/frame-view.js';
import { buildFrame } from './frame.js';
import { useTerminalSize, type TerminalSize } from './use-terminal-size.js';

export interface DebuggerAppProps {
  readonly controller: Controller;
  /** A fixed size instead of the terminal's (tests). */
  readonly size?: TerminalSize;
}

/** The debugger's root component. */
export function DebuggerApp({ controller, size }: DebuggerAppProps) {
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

  return <FrameView frame={buildFrame(controller, term.columns, term.rows)} colour={controller.colour} />;
}
