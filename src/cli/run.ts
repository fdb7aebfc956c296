/**
 * The CLI dispatcher: `exact-dw COMMAND [options]`. Exit status 0 on success, 2 on bad input or
 * an unmet limit (one line on stderr, no stack trace: the message, the hint and the error code in
 * brackets, e.g. `[CSV_RAGGED]`), 1 on an internal fault (a bug: the line asks for a report).
 */
import { isDwError, DwError } from '../errors.js';
import { parseOptions } from './args.js';
import { cliLine } from './suggest.js';
import { COMMANDS } from './commands/index.js';
import type { Command } from './commands/command.js';
import { processIo, type CliIo } from './io.js';
import { VERSION } from '../version.js';

function commandHelp(c: Command): string {
  const lines = [`usage: ${c.usage}`, '', c.summary];
  if (c.details) lines.push('', c.details);
  lines.push('', 'options:');
  for (const [name, spec] of Object.entries(c.options)) {
    const flag = spec.type === 'boolean' ? `--${name}` : `--${name} ${spec.value ?? 'VALUE'}`;
    lines.push(`  ${flag.padEnd(24)} ${spec.help}`);
  }
  lines.push(`  ${'--help'.padEnd(24)} show this help`);
  return lines.join('\n') + '\n';
}

function overview(): string {
  const lines = [
    `exact-dw ${VERSION}: the exact Durbin-Watson test for your own design matrix`,
    '',
    'usage: exact-dw COMMAND [options]      (exact-dw COMMAND --help for its options)',
    '',
    'commands:',
  ];
  for (const c of COMMANDS) lines.push(`  ${c.name.padEnd(10)} ${c.summary}`);
  lines.push(`  ${'help'.padEnd(10)} this overview, or 'help COMMAND'`);
  lines.push(`  ${'version'.padEnd(10)} print the version`);
  return lines.join('\n') + '\n';
}

/** The command called `name`, or COMMAND_UNKNOWN naming the nearest one. */
function findCommand(name: string): Command {
  const command = COMMANDS.find((c) => c.name === name);
  if (command) return command;
  const near = COMMANDS.find((c) => c.name.startsWith(name.slice(0, 3)) && name.length >= 3);
  throw new DwError('COMMAND_UNKNOWN', `There is no command '${name}'.`,
    `${near ? `Did you mean '${near.name}'? ` : ''}Commands: ${COMMANDS.map((c) => c.name).join(', ')}. See 'exact-dw help'.`);
}

/**
 * Run the CLI on `argv` (without the node and script names) and return the exit status.
 *
 * @example
 * ```ts
 * const status = await runCli(['critical', '--design', 'X.csv', '--format', 'json']);
 * ```
 */
export async function runCli(argv: string[], io: CliIo = processIo): Promise<number> {
  const [name, ...rest] = argv;
  try {
    if (name === undefined || name === 'help' || name === '--help' || name === '-h') {
      if (rest[0] === undefined) { io.out(overview()); return 0; }
      io.out(commandHelp(findCommand(rest[0])));
      return 0;
    }
    if (name === 'version' || name === '--version') { io.out(`${VERSION}\n`); return 0; }
    const command = findCommand(name);
    const { values, positionals } = parseOptions(rest, command.options, command.name);
    if (values.help) { io.out(commandHelp(command)); return 0; }
    if (positionals.length > (command.positionals ?? 0)) {
      throw new DwError('ARGUMENT_EXTRA', `'${command.name}' does not take the argument '${positionals[command.positionals ?? 0]}'.`,
        `See 'exact-dw ${command.name} --help'.`);
    }
    return await command.run({ values, positionals, io });
  } catch (err) {
    if (isDwError(err)) {
      // one line whatever the message quotes (a quoted cell may hold a line break), ending with the
      // stable code that docs/errors-and-limits.md lists
      const e = err as DwError;
      io.err(`exact-dw: ${cliLine(e).replace(/[\u0000-\u001f\u007f]+/g, ' ')} [${e.code}]\n`);
      return 2;
    }
    const e = err as Error;
    if (e instanceof RangeError && /allocation failed|Invalid (typed )?array length|out of memory/i.test(e.message)) {
      io.err(`exact-dw: the problem is too large for the memory available (${e.message}). See the size limits in docs/errors-and-limits.md, or choose --method eigenfree, which needs no n x n matrix.\n`);
      return 2;
    }
    io.err(`exact-dw: internal error (${e?.message ?? String(err)}). This is a bug; please report it with the command you ran.\n`);
    return 1;
  }
}
