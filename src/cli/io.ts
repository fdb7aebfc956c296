/**
 * The CLI's contact with the outside world, behind an interface so that tests can run commands
 * in-process: output streams, reading files, and writing files without ever replacing one the
 * user already has (unless they ask with --force).
 */
import { existsSync, readFileSync, statSync, writeFileSync, mkdirSync, openSync, closeSync } from 'node:fs';
import { dirname } from 'node:path';
import { DwError } from '../errors.js';

/** What a command may do. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  readText(path: string): string;
  /** Write a new file; refuses to replace an existing one unless `force`. */
  writeText(path: string, text: string, force: boolean): void;
  exists(path: string): boolean;
}

/** The real file system and process streams. */
export const processIo: CliIo = {
  out: (t) => { process.stdout.write(t); },
  err: (t) => { process.stderr.write(t); },
  readText,
  writeText,
  exists: (p) => existsSync(p),
};

/** Read a UTF-8 text file with errors a user can act on. */
export function readText(path: string): string {
  if (!existsSync(path)) {
    throw new DwError('FILE_NOT_FOUND', `The file '${path}' does not exist.`, 'Check the path (it is relative to the current folder).', { file: path });
  }
  if (statSync(path).isDirectory()) {
    throw new DwError('FILE_UNREADABLE', `'${path}' is a folder, not a file.`, 'Give the path of a CSV file.', { file: path });
  }
  try {
    return readFileSync(path, 'utf8');
  } catch (err) {
    throw new DwError('FILE_UNREADABLE', `The file '${path}' cannot be read (${(err as NodeJS.ErrnoException).code ?? 'error'}).`,
      'Check its permissions.', { file: path });
  }
}

/** Create a file; with force false an existing file is never touched. */
export function writeText(path: string, text: string, force: boolean): void {
  if (existsSync(path) && !force) {
    throw new DwError('FILE_EXISTS', `The file '${path}' already exists and was left as it is.`,
      'Choose another name, or add --force to replace it.', { file: path });
  }
  try {
    mkdirSync(dirname(path), { recursive: true });
    if (!force) {
      // 'wx' fails if the file appeared in the meantime: never overwrite by accident
      const fd = openSync(path, 'wx');
      closeSync(fd);
    }
    writeFileSync(path, text, 'utf8');
  } catch (err) {
    if (err instanceof DwError) throw err;
    const code = (err as NodeJS.ErrnoException).code;
    if (code === 'EEXIST') {
      throw new DwError('FILE_EXISTS', `The file '${path}' already exists and was left as it is.`, 'Choose another name, or add --force.', { file: path });
    }
    throw new DwError('FILE_UNREADABLE', `The file '${path}' cannot be written (${code ?? 'error'}).`, 'Check the folder exists and is writable.', { file: path });
  }
}
