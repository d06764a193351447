/** The outside world as the CLI sees it, so tests can run commands in-process. */
import { readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { dirname } from 'node:path';

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): string;
  writeFile(path: string, text: string): void;
  /** True when stdout is a terminal (progress goes to stderr otherwise). */
  readonly stdoutIsTTY: boolean;
  /** True when stderr is a terminal (a sweep draws its progress bar there). */
  readonly stderrIsTTY: boolean;
  /** True when stdin is a terminal (the debugger needs one). */
  readonly stdinIsTTY: boolean;
  readonly env: Readonly<Record<string, string | undefined>>;
}

/** The real process streams and file system. */
export function processIo(): CliIo {
  return {
    stdout: (t) => void process.stdout.write(t),
    stderr: (t) => void process.stderr.write(t),
    readFile: (p) => readFileSync(p, 'utf8'),
    writeFile: (p, t) => {
      mkdirSync(dirname(p), { recursive: true });
      writeFileSync(p, t);
    },
    stdoutIsTTY: process.stdout.isTTY === true,
    stderrIsTTY: process.stderr.isTTY === true,
    stdinIsTTY: process.stdin.isTTY === true,
    env: process.env,
  };
}
