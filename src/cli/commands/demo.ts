/** `exact-dw demo`: the exact test on the bundled demo data (an invented scenario of our own). */
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { testCommand } from './test.js';
import type { Command } from './command.js';

/** Path of the bundled demo data, relative to the compiled module (dist/src/cli/commands). */
export function demoDataPath(): string {
  const here = dirname(fileURLToPath(import.meta.url));
  return join(here, '..', '..', '..', '..', 'docs', 'demo', 'apiary.csv');
}

export const demoCommand: Command = {
  name: 'demo',
  summary: 'run the exact test on the bundled demo data (invented apiary yields)',
  usage: 'exact-dw demo [--format text|json]',
  options: {
    format: { type: 'string', value: 'FMT', help: 'text (default) or json' },
  },
  run({ values, io }) {
    const path = demoDataPath();
    io.out(`Demo data: ${path}\n(invented for illustration: yearly honey yield of a fictional apiary, 1998-2021)\n`);
    io.out(`Command: exact-dw test ${path} --y yield_kg --x spring_rain_mm,june_temp_c --time year\n\n`);
    return testCommand.run({
      values: { ...values, y: 'yield_kg', x: 'spring_rain_mm,june_temp_c', time: 'year' },
      positionals: [path],
      io,
    });
  },
};
