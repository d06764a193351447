/**
 * The CLI: builds commander from the command table, runs one command and maps every
 * outcome to an exit code. Input errors print file:line:col, field and fix (exit 2);
 * anything unexpected is an internal error (exit 3) with a crash report.
 */
import { Command, CommanderError, Option } from 'commander';
import { InputError, InputErrors } from '../model/errors.js';
import { ProgramError } from '../engine/index.js';
import { BreakpointError } from '../session/breakpoints.js';
import type { CliIo } from './io.js';
import { EXIT, REFERENCE_PAGES, type CommandSpec } from './spec.js';
import { COMMANDS } from './commands/index.js';
import { reportInternalError } from './crash.js';

export const VERSION = '0.1.0';

/** How help points at the reference, which ships in the package's docs/ folder. */
const REFERENCE_NOTE = 'Reference (the docs/ folder of the bellstep package):';

function collect(value: string, previous: string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

function buildProgram(io: CliIo, commands: readonly CommandSpec[], result: { code: number }): Command {
  const program = new Command('bellstep')
    .description('Step-through debugger for quantum-network node programs')
    .version(VERSION)
    .exitOverride()
    .showHelpAfterError('(run with --help for usage)')
    .addHelpText('after', `\n${REFERENCE_NOTE} docs/README.md`)
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) });
  for (const spec of commands) {
    const cmd = program
      .command(spec.name)
      .description(spec.summary)
      .exitOverride()
      .addHelpText('after', `\n${REFERENCE_NOTE} ${REFERENCE_PAGES[spec.name] ?? 'docs/cli.md'}`)
      .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) });
    for (const a of spec.args.split(/\s+/).filter(Boolean)) cmd.argument(a);
    for (const o of spec.options) {
      const opt = new Option(o.flags, o.description);
      if (o.repeatable) opt.argParser(collect);
      cmd.addOption(opt);
    }
    cmd.action(async (...params: unknown[]) => {
      // commander passes positional args, then the options object, then the command
      const opts = params[params.length - 2] as Record<string, unknown>;
      const args = params.slice(0, params.length - 2).flat().filter((a): a is string => typeof a === 'string');
      result.code = await spec.run({ io }, args, opts);
    });
  }
  return program;
}

/** Runs the CLI on `argv` (without node and script) and returns the exit code. */
export async function main(argv: readonly string[], io: CliIo, commands: readonly CommandSpec[] = COMMANDS): Promise<number> {
  const result = { code: EXIT.ok };
  const program = buildProgram(io, commands, result);
  try {
    await program.parseAsync([...argv], { from: 'user' });
    return result.code;
  } catch (err) {
    if (err instanceof CommanderError) {
      if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') return EXIT.ok;
      // commander already printed its message
      return EXIT.input;
    }
    if (err instanceof InputError || err instanceof InputErrors || err instanceof ProgramError) {
      io.stderr(`bellstep: ${err.format()}\n`);
      return EXIT.input;
    }
    if (err instanceof BreakpointError) {
      io.stderr(`bellstep: ${err.message}\n  fix: make the breakpoint evaluable at every event, e.g. guard it with a check on delivered() or pairs()\n`);
      return EXIT.input;
    }
    return reportInternalError(io, err, argv);
  }
}
