/**
 * The CLI's contact with the outside world, behind an interface so that tests can run commands
 * in-process: output streams, reading files, and writing files without ever replacing one the
 * user already has (unless they ask with --force), and without leaving a half-written file behind.
 */
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, renameSync, statSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { DwError } from '../errors.js';

/** What a command may do. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  readText(path: string): string;
  /** The raw bytes of a file (for its SHA-256); the text was read by readText first. */
  readBytes?(path: string): Uint8Array;
  /** Write a new file; refuses to replace an existing one unless `force`. */
  writeText(path: string, text: string, force: boolean): void;
  exists(path: string): boolean;
  /** True when stderr is a terminal (progress lines may then be redrawn in place). */
  errIsTerminal?: boolean;
}

/** The real file system and process streams. */
export const processIo: CliIo = {
  out: (t) => { process.stdout.write(t); },
  err: (t) => { process.stderr.write(t); },
  readText,
  readBytes: (p) => readFileSync(p),
  writeText,
  exists: (p) => existsSync(p),
  errIsTerminal: process.stderr.isTTY === true,
};

/**
 * Read a text file with errors a user can act on. UTF-8 is expected (a byte-order mark is
 * allowed); a file that is not valid UTF-8 is read as Windows-1252 (Latin-1), the encoding of
 * older spreadsheet exports, so that its names survive; UTF-16 and binary files are refused.
 *
 * @throws DwError FILE_NOT_FOUND (no such file, or no such folder on the way to it),
 *   FILE_UNREADABLE (a folder, or no permission), CSV_MALFORMED (UTF-16 or binary content)
 * @example
 * ```ts
 * const text = readText('data.csv');
 * ```
 */
export function readText(path: string): string {
  if (!existsSync(path)) {
    const folder = dirname(path);
    if (folder !== '.' && !existsSync(folder)) {
      throw new DwError('FILE_NOT_FOUND', `The file '${path}' does not exist (there is no folder '${folder}').`,
        'Check the path (it is relative to the current folder).', { file: path });
    }
    throw new DwError('FILE_NOT_FOUND', `The file '${path}' does not exist.`, 'Check the path (it is relative to the current folder).', { file: path });
  }
  let bytes: Buffer;
  try {
    if (statSync(path).isDirectory()) {
      throw new DwError('FILE_UNREADABLE', `'${path}' is a folder, not a file.`, 'Give the path of a CSV file.', { file: path });
    }
    bytes = readFileSync(path);
  } catch (err) {
    if (err instanceof DwError) throw err;
    throw new DwError('FILE_UNREADABLE', `The file '${path}' cannot be read (${(err as NodeJS.ErrnoException).code ?? 'error'}).`,
      'Check its permissions.', { file: path });
  }
  return decodeText(bytes, path);
}

/**
 * Bytes to text: UTF-8 (BOM kept for the parser to drop), else Windows-1252; UTF-16 is refused.
 *
 * @example
 * ```ts
 * decodeText(new TextEncoder().encode('a,b\n1,2\n'));        // "a,b\n1,2\n"
 * decodeText(Uint8Array.from([0x63, 0x61, 0x66, 0xe9]));     // "café" (Windows-1252)
 * decodeText(Uint8Array.from([0xff, 0xfe, 0x61, 0]), 'x.csv'); // throws CSV_MALFORMED (UTF-16)
 * ```
 */
export function decodeText(bytes: Uint8Array, path = 'the input'): string {
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) {
    throw new DwError('CSV_MALFORMED', `'${path}' is UTF-16 text, not UTF-8.`,
      "Save it again as 'CSV UTF-8' (or convert it, for example with iconv -f UTF-16 -t UTF-8).", { file: path });
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/**
 * Create a file with `text`. With `force` false an existing file is never touched (the check and
 * the creation are one atomic step, and a failed write removes only the file it created); with
 * `force` true the new content is written beside the target and renamed over it, so the old file
 * is replaced whole or not at all.
 *
 * @throws DwError FILE_EXISTS (the file is there and `force` is false), FILE_UNWRITABLE (the
 *   folder cannot be written, or the path is a folder)
 * @example
 * ```ts
 * writeText('report.md', text, false); // refuses if report.md exists
 * ```
 */
export function writeText(path: string, text: string, force: boolean): void {
  const exists = () => new DwError('FILE_EXISTS', `The file '${path}' already exists and was left as it is.`,
    'Choose another name, or add --force to replace it.', { file: path });
  if (existsSync(path) && !force) throw exists();
  if (existsSync(path) && statSync(path).isDirectory()) {
    throw new DwError('FILE_UNWRITABLE', `'${path}' is a folder; a file cannot be written there.`, 'Give a file name.', { file: path });
  }
  const cannot = (err: unknown) => new DwError('FILE_UNWRITABLE', `The file '${path}' cannot be written (${(err as NodeJS.ErrnoException).code ?? 'error'}).`,
    'Check that the folder exists and is writable.', { file: path });
  try {
    mkdirSync(dirname(path), { recursive: true });
  } catch (err) {
    throw cannot(err);
  }
  if (!force) {
    let fd: number;
    try {
      fd = openSync(path, 'wx'); // fails if the file appeared in the meantime
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'EEXIST') throw exists();
      throw cannot(err);
    }
    try {
      const data = Buffer.from(text, 'utf8');
      let done = 0;
      while (done < data.length) done += writeSync(fd, data, done, data.length - done);
      closeSync(fd);
    } catch (err) {
      try { closeSync(fd); } catch { /* already closed */ }
      try { unlinkSync(path); } catch { /* nothing more to undo */ }
      throw cannot(err);
    }
    return;
  }
  const temp = join(dirname(path), `.${basename(path)}.${process.pid}.partial`);
  try {
    writeFileSync(temp, text, 'utf8');
    renameSync(temp, path);
  } catch (err) {
    try { unlinkSync(temp); } catch { /* nothing more to undo */ }
    throw cannot(err);
  }
}
