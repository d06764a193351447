/** The terminal's size, following stdout's 'resize' events (Ink 6.8 re-lays out on resize but does not track rows). */
import { useStdout } from 'ink';
import { useEffect, useState } from 'react';

export interface TerminalSize {
  readonly columns: number;
  readonly rows: number;
}

/** The current size; `fixed` (for tests) overrides the terminal. */
export function useTerminalSize(fixed?: TerminalSize): TerminalSize {
  const { stdout } = useStdout();
  const read = (): TerminalSize => ({ columns: stdout.columns || 80, rows: stdout.rows || 24 });
  const [size, setSize] = useState(read);
  useEffect(() => {
    if (fixed) return;
    const onResize = () => setSize(read());
    stdout.on('resize', onResize);
    return () => void stdout.off('resize', onResize);
  }, [stdout, fixed]);
  return fixed ?? size;
}
