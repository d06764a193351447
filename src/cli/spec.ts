/** Typed tables of commands and options: they drive commander, `--help` and the README. */
import type { CliIo } from './io.js';

export interface OptionSpec {
  /** Commander flag syntax, e.g. `--seed <S>`. */
  readonly flags: string;
  readonly description: string;
  /** The flag may be given several times; values collect into an array. */
  readonly repeatable?: boolean;
}

export interface CommandContext {
  readonly io: CliIo;
}

export interface CommandSpec {
  readonly name: string;
  /** Commander argument syntax, e.g. `<NET.yaml>` or `[NAME]`. */
  readonly args: string;
  readonly summary: string;
  readonly options: readonly OptionSpec[];
  /** Runs the command and returns the exit code (docs/cli.md). */
  run(ctx: CommandContext, args: readonly string[], opts: Readonly<Record<string, unknown>>): Promise<number>;
}

/** Exit codes fixed by docs/cli.md. */
export const EXIT = { ok: 0, problems: 1, input: 2, internal: 3 } as const;

/** The pages of docs/ that `COMMAND --help` points to, by command (every other command: cli.md). */
export const REFERENCE_PAGES: Readonly<Record<string, string>> = {
  run: 'docs/cli.md (the summary, exit codes, files), docs/expressions.md (--break, --expect)',
  check: 'docs/checks.md (what it finds), docs/format.md, docs/noise.md',
  debug: 'docs/debugging.md (walkthroughs, keys, commands), docs/expressions.md',
  demo: 'docs/debugging.md',
  schema: 'docs/format.md, docs/noise.md',
  sweep: 'docs/cli.md, docs/expressions.md (--break, --expect)',
};
