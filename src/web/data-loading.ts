/**
 * Reading the data on the page: a chosen or dropped file (size and text checks, its SHA-256 for
 * the reproducibility record), pasted text or the demo, read by the worker with the chosen
 * delimiter and decimal mark; then the preview of the table that the worker returns.
 */
import { h, showError } from './dom.js';
import type { DataSource, ReadOptions, TableSummary } from './protocol.js';
import { el, page } from './elements.js';
import { newId, send } from './worker-client.js';
import { buildPickers } from './model-form.js';

/** Largest file the page reads (the exact test itself is limited far earlier by n). */
const MAX_FILE_BYTES = 50 * 1024 * 1024;

function readOptions(): ReadOptions {
  const d = el.delimiter.value;
  return {
    delimiter: d === 'tab' ? '\t' : d === ',' || d === ';' ? d : 'auto',
    decimal: el.decimal.value === 'point' || el.decimal.value === 'comma' ? el.decimal.value : 'auto',
  };
}

export function loadText(text: string, source: string, digest?: { sha256?: string; bytes?: number }): void {
  const data: DataSource = { text, source, ...readOptions(), ...(digest ?? {}) };
  page.data = data;
  showError(el.dataError, null);
  send({ kind: 'inspect', id: newId(), data });
}

export async function readFile(file: File): Promise<void> {
  const name = `'${file.name}'`;
  if (file.size > MAX_FILE_BYTES) {
    showError(el.dataError, {
      code: 'SIZE_LIMIT',
      message: `The file ${name} has ${(file.size / 1048576).toFixed(0)} MB; the page reads files up to ${MAX_FILE_BYTES / 1048576} MB.`,
      hint: 'Keep only the columns and rows of the model in the file.',
    });
    return;
  }
  let text: string;
  try {
    text = await file.text();
  } catch {
    showError(el.dataError, { code: 'FILE_UNREADABLE', message: `The browser could not read the file ${name}.`, hint: 'Check that the file is still there and readable, then choose it again.' });
    return;
  }
  if (text.includes('\u0000')) {
    showError(el.dataError, {
      code: 'FILE_UNREADABLE', message: `The file ${name} is not a text file.`,
      hint: 'Save the sheet as CSV (comma- or semicolon-separated values) and choose that file.',
    });
    return;
  }
  loadText(text, name, await digestOf(file));
}

/** SHA-256 of a file's bytes with the browser's SubtleCrypto (offline), or only the size when it is unavailable. */
async function digestOf(file: File): Promise<{ sha256?: string; bytes: number }> {
  try {
    const bytes = await file.arrayBuffer();
    if (!globalThis.crypto?.subtle) return { bytes: bytes.byteLength };
    const hash = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes));
    return { sha256: Array.from(hash, (b) => b.toString(16).padStart(2, '0')).join(''), bytes: bytes.byteLength };
  } catch {
    return { bytes: file.size };
  }
}

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

export function showTable(t: TableSummary): void {
  el.dataStatus.textContent = `${t.source}: ${t.rows} rows and ${t.columns.length} columns, `
    + `${DELIMITER_NAMES[t.delimiter] ?? t.delimiter}-separated, decimal ${t.decimal}.`;
  const head = el.preview.tHead ?? el.preview.createTHead();
  head.replaceChildren(h('tr', {}, ...t.columns.map((c) => h('th', { scope: 'col' }, c.name))));
  el.preview.tBodies[0].replaceChildren(...t.preview.map((row) => h('tr', {}, ...row.map((cell) => h('td', {}, cell)))));
  el.preview.caption!.textContent = t.rows > t.preview.length ? `The first ${t.preview.length} of ${t.rows} rows` : `All ${t.rows} rows`;
  el.dataSummary.hidden = false;
  buildPickers(t);
  el.modelStep.hidden = false;
  el.results.hidden = true;
  el.resultBody.replaceChildren();
  page.hasResult = false;
  el.modelTitle.focus();
}
