/** Run the CLI in-process with a real file system and captured output. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/run.js';
import { processIo, type CliIo } from '../../src/cli/io.js';

export interface CliRun { status: number; out: string; err: string }

export async function cli(...argv: string[]): Promise<CliRun> {
  let out = '';
  let err = '';
  const io: CliIo = { ...processIo, out: (t) => { out += t; }, err: (t) => { err += t; } };
  const status = await runCli(argv, io);
  return { status, out, err };
}

/** A fresh temporary folder. */
export function scratch(): string {
  return mkdtempSync(join(tmpdir(), 'exact-dw-test-'));
}
