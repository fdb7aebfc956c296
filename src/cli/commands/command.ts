/** The shape of a CLI command. */
import type { OptionSpecs, OptionValues } from '../args.js';
import type { CliIo } from '../io.js';

export interface CommandContext {
  values: OptionValues;
  positionals: string[];
  io: CliIo;
}

export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Usage line. */
  usage: string;
  options: OptionSpecs;
  /** Number of positional arguments accepted (default 0). */
  positionals?: number;
  /** Longer help text shown under the usage line. */
  details?: string;
  run(ctx: CommandContext): number | Promise<number>;
}
