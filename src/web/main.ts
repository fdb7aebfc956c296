/**
 * The page: takes the data (file, drop, paste or the bundled demo), offers the columns, sends the
 * choices to the computing worker and shows what comes back. All computation happens in the worker
 * (worker.ts) with the library's own functions; this module only moves data and draws.
 */
import demoCsv from '../../docs/demo/apiary.csv?raw';
import DwWorker from './worker.ts?worker&inline';
import { VERSION } from '../version.js';
import type { Alternative } from '../inference/dw-test.js';
import type { MethodChoice } from '../core/types.js';
import { capabilities } from './adapter.js';
import { byId, h, showError } from './dom.js';
import { renderResult } from './render.js';
import type { DataSource, ModelChoice, PlainError, ReadOptions, Reply, Request, TableSummary } from './protocol.js';

/** Largest file the page reads (the exact test itself is limited far earlier by n). */
const MAX_FILE_BYTES = 50 * 1024 * 1024;
/** A computation shorter than this shows no progress indicator, to avoid a flicker. */
const PROGRESS_DELAY_MS = 200;

const el = {
  file: byId<HTMLInputElement>('file'),
  drop: byId('drop'),
  demo: byId<HTMLButtonElement>('demo'),
  paste: byId<HTMLTextAreaElement>('paste'),
  usePaste: byId<HTMLButtonElement>('use-paste'),
  delimiter: byId<HTMLSelectElement>('delimiter'),
  decimal: byId<HTMLSelectElement>('decimal'),
  dataError: byId('data-error'),
  dataSummary: byId('data-summary'),
  dataStatus: byId('data-status'),
  preview: byId<HTMLTableElement>('preview'),
  modelStep: byId('model-step'),
  modelTitle: byId('model-title'),
  form: byId<HTMLFormElement>('model-form'),
  yChoices: byId('y-choices'),
  xChoices: byId('x-choices'),
  xAll: byId<HTMLButtonElement>('x-all'),
  xNone: byId<HTMLButtonElement>('x-none'),
  intercept: byId<HTMLInputElement>('intercept'),
  time: byId<HTMLSelectElement>('time'),
  dropMissing: byId<HTMLInputElement>('drop-missing'),
  lag: byId<HTMLInputElement>('lag'),
  alpha: byId<HTMLInputElement>('alpha'),
  rho: byId<HTMLInputElement>('rho'),
  rhoField: byId('rho-field'),
  method: byId<HTMLSelectElement>('method'),
  stale: byId('stale'),
  results: byId('results'),
  resultsTitle: byId('results-title'),
  progress: byId('progress'),
  progressBar: byId<HTMLProgressElement>('progress-bar'),
  progressText: byId('progress-text'),
  progressTime: byId('progress-time'),
  cancel: byId<HTMLButtonElement>('cancel'),
  resultError: byId('result-error'),
  resultBody: byId('result-body'),
};

let worker: Worker | null = null;
let nextId = 1;
let pending: { id: number; kind: Request['kind']; started: number; timer: number; rho: number | null } | null = null;
let data: DataSource | null = null;
let hasResult = false;

// ---------------------------------------------------------------- the worker

function startWorker(): void {
  try {
    worker = new DwWorker({ name: 'exact-dw' });
  } catch (err) {
    worker = null;
    workerFailed(err instanceof Error ? err.message : String(err));
    return;
  }
  worker.addEventListener('message', (event: MessageEvent<Reply>) => onReply(event.data));
  worker.addEventListener('error', (event) => {
    event.preventDefault();
    workerFailed(event.message || 'the browser did not say why');
  });
}

function workerFailed(why: string): void {
  const error: PlainError = {
    code: 'INTERNAL',
    message: `The computing part of this page could not start in this browser (${why.replace(/[.\s]+$/, '')}).`,
    hint: 'Use a current version of Firefox, Chromium, Edge or Safari, with JavaScript allowed for this page.',
  };
  const box = pending?.kind === 'compute' ? el.resultError : el.dataError;
  finish();
  showError(box, error);
}

function send(request: Request, rho: number | null = null): void {
  if (pending) cancel(false);
  if (!worker) startWorker();
  if (!worker) return;
  const started = performance.now();
  const timer = window.setInterval(() => tick(started), 100);
  pending = { id: request.id, kind: request.kind, started, timer, rho };
  if (request.kind === 'compute') el.results.setAttribute('aria-busy', 'true');
  worker.postMessage(request);
}

function tick(started: number): void {
  const elapsed = performance.now() - started;
  if (elapsed < PROGRESS_DELAY_MS) return;
  el.progress.hidden = false;
  el.progressTime.textContent = `${(elapsed / 1000).toFixed(1)} s`;
}

function finish(): void {
  if (pending) window.clearInterval(pending.timer);
  pending = null;
  el.progress.hidden = true;
  el.progressBar.removeAttribute('value');
  el.results.setAttribute('aria-busy', 'false');
}

/** End the running computation by ending its worker; a fresh worker takes the next request. */
function cancel(report: boolean): void {
  const kind = pending?.kind;
  worker?.terminate();
  worker = null;
  finish();
  if (report) {
    showError(kind === 'inspect' ? el.dataError : el.resultError, {
      code: 'CANCELLED', message: 'The computation was cancelled.', hint: 'Change the choices, or compute again.',
    });
  }
}

function onReply(reply: Reply): void {
  if (!pending || reply.id !== pending.id) return; // a reply to a request that was replaced
  switch (reply.kind) {
    case 'progress':
      el.progressBar.value = reply.steps > 0 ? reply.step / reply.steps : 0;
      el.progressText.textContent = `${reply.stage}\u2026`;
      return;
    case 'inspected':
      finish();
      showTable(reply.table);
      return;
    case 'result': {
      const rho = pending.rho;
      finish();
      showError(el.resultError, null);
      el.resultBody.replaceChildren(renderResult(reply.result, reply.extras, rho, reply.failures));
      el.resultBody.hidden = false;
      el.stale.hidden = true;
      hasResult = true;
      el.resultsTitle.focus();
      return;
    }
    case 'error': {
      const kind = pending.kind;
      finish();
      if (kind === 'inspect') {
        showError(el.dataError, reply.error);
        el.dataSummary.hidden = true;
        el.modelStep.hidden = true;
        el.results.hidden = true;
        el.dataError.focus();
      } else {
        showError(el.resultError, reply.error);
        el.resultBody.hidden = true;
        hasResult = false;
      }
    }
  }
}

// ---------------------------------------------------------------- reading the data

function readOptions(): ReadOptions {
  const d = el.delimiter.value;
  return {
    delimiter: d === 'tab' ? '\t' : d === ',' || d === ';' ? d : 'auto',
    decimal: el.decimal.value === 'point' || el.decimal.value === 'comma' ? el.decimal.value : 'auto',
  };
}

function loadText(text: string, source: string, digest?: { sha256?: string; bytes?: number }): void {
  data = { text, source, ...readOptions(), ...(digest ?? {}) };
  showError(el.dataError, null);
  send({ kind: 'inspect', id: nextId++, data });
}

async function readFile(file: File): Promise<void> {
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

function showTable(t: TableSummary): void {
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
  hasResult = false;
  el.modelTitle.focus();
}

// ---------------------------------------------------------------- choosing the model

function columnLabel(name: string, numeric: boolean): (Node | string)[] {
  return numeric ? [` ${name}`] : [` ${name} `, h('span', { class: 'note' }, '(not all numbers)')];
}

function buildPickers(t: TableSummary): void {
  el.yChoices.replaceChildren();
  el.xChoices.replaceChildren();
  el.time.replaceChildren(h('option', { value: '' }, 'none: rows are consecutive'));
  for (const c of t.columns) {
    const y = h('input', { type: 'radio', name: 'y', value: c.name, checked: c.name === t.guess.y });
    el.yChoices.append(h('label', { class: 'check' }, y, ...columnLabel(c.name, c.numeric)));
    const x = h('input', { type: 'checkbox', name: 'x', value: c.name, checked: t.guess.x.includes(c.name) });
    el.xChoices.append(h('label', { class: 'check' }, x, ...columnLabel(c.name, c.numeric)));
    if (c.numeric || c.timeLike) {
      el.time.append(h('option', { value: c.name, selected: c.name === t.guess.time },
        c.timeLike ? c.name : `${c.name} (not increasing time labels)`));
    }
  }
  syncPickers();
}

function yInputs(): HTMLInputElement[] {
  return Array.from(el.yChoices.querySelectorAll<HTMLInputElement>('input[name="y"]'));
}

function xInputs(): HTMLInputElement[] {
  return Array.from(el.xChoices.querySelectorAll<HTMLInputElement>('input[name="x"]'));
}

/** A column cannot be y, a regressor and the time column at once. */
function syncPickers(): void {
  const time = el.time.value;
  for (const r of yInputs()) {
    r.disabled = r.value === time && time !== '';
    if (r.disabled) r.checked = false;
  }
  const y = yInputs().find((r) => r.checked)?.value ?? null;
  for (const x of xInputs()) {
    x.disabled = x.value === y || (x.value === time && time !== '');
    if (x.disabled) x.checked = false;
  }
}

function fieldNumber(input: HTMLInputElement): number | 'empty' | 'bad' {
  if (input.validity.badInput) return 'bad';
  const text = input.value.trim();
  if (text === '') return 'empty';
  const v = Number(text);
  return Number.isFinite(v) ? v : 'bad';
}

/** The choices of the form, or the first thing wrong with them in plain words. */
function readModel(): ModelChoice | PlainError {
  const y = yInputs().find((r) => r.checked)?.value;
  if (!y) {
    return { code: 'OPTION_MISSING', message: 'No dependent variable is chosen.', hint: 'Choose the column y under "Dependent variable y".' };
  }
  const lag = fieldNumber(el.lag);
  if (typeof lag !== 'number') {
    return { code: 'LAG_INVALID', message: lag === 'empty' ? 'The lag is empty.' : 'The lag is not a number.', hint: 'Give a whole number of at least 1: 1 for annual data, 4 for quarterly.' };
  }
  const alpha = fieldNumber(el.alpha);
  if (typeof alpha !== 'number') {
    return { code: 'ALPHA_OUT_OF_RANGE', message: alpha === 'empty' ? 'The significance level is empty.' : 'The significance level is not a number.', hint: 'Use a level such as 0.05 or 0.01.' };
  }
  let rho: number | null = null;
  if (capabilities.power) {
    const r = fieldNumber(el.rho);
    if (r === 'bad') return { code: 'RHO_OUT_OF_RANGE', message: 'The value of \u03c1 for the power is not a number.', hint: 'Give a number between -1 and 1, such as 0.5, or leave it empty.' };
    rho = r === 'empty' ? null : r;
  }
  const alternative = (el.form.querySelector<HTMLInputElement>('input[name="alternative"]:checked')?.value ?? 'positive') as Alternative;
  return {
    y,
    x: xInputs().filter((x) => x.checked).map((x) => x.value),
    time: el.time.value === '' ? null : el.time.value,
    dropMissing: el.dropMissing.checked,
    lag,
    intercept: el.intercept.checked,
    alternative,
    alpha,
    rho,
    method: el.method.value as MethodChoice,
  };
}

function compute(): void {
  if (!data) return;
  el.results.hidden = false;
  const model = readModel();
  if ('message' in model) {
    showError(el.resultError, model);
    el.resultBody.hidden = true;
    el.resultError.focus();
    return;
  }
  showError(el.resultError, null);
  send({ kind: 'compute', id: nextId++, data, model }, model.rho);
}

// ---------------------------------------------------------------- wiring

function hasFiles(event: DragEvent): boolean {
  return Array.from(event.dataTransfer?.types ?? []).includes('Files');
}

function wire(): void {
  byId('version').textContent = `version ${VERSION}`;
  if (!capabilities.power) el.rhoField.hidden = true;
  for (const box of [el.dataError, el.resultError]) box.tabIndex = -1;

  el.file.addEventListener('change', () => {
    const f = el.file.files?.[0];
    if (f) void readFile(f).finally(() => { el.file.value = ''; });
  });
  el.demo.addEventListener('click', () => loadText(demoCsv, 'the demo data (apiary.csv)'));
  el.usePaste.addEventListener('click', () => {
    if (el.paste.value.trim() === '') {
      showError(el.dataError, { code: 'CSV_EMPTY', message: 'There is no pasted text.', hint: 'Paste the CSV text (a header row, then the data) into the box first.' });
      return;
    }
    loadText(el.paste.value, 'the pasted text');
  });
  for (const s of [el.delimiter, el.decimal]) {
    s.addEventListener('change', () => { if (data) loadText(data.text, data.source, { sha256: data.sha256, bytes: data.bytes }); });
  }

  document.addEventListener('dragover', (e) => {
    if (!hasFiles(e)) return;
    e.preventDefault();
    if (e.dataTransfer) e.dataTransfer.dropEffect = 'copy';
    el.drop.classList.add('over');
  });
  document.addEventListener('dragleave', (e) => { if (e.relatedTarget === null) el.drop.classList.remove('over'); });
  document.addEventListener('drop', (e) => {
    el.drop.classList.remove('over');
    const f = e.dataTransfer?.files?.[0];
    if (!f) return;
    e.preventDefault();
    void readFile(f);
  });

  el.yChoices.addEventListener('change', syncPickers);
  el.time.addEventListener('change', syncPickers);
  el.xAll.addEventListener('click', () => { for (const x of xInputs()) if (!x.disabled) x.checked = true; markStale(); });
  el.xNone.addEventListener('click', () => { for (const x of xInputs()) x.checked = false; markStale(); });
  el.form.addEventListener('input', markStale);
  el.form.addEventListener('change', markStale);
  el.form.addEventListener('submit', (e) => { e.preventDefault(); compute(); });
  el.cancel.addEventListener('click', () => cancel(true));
}

function markStale(): void {
  if (hasResult) el.stale.hidden = false;
}

wire();
startWorker();
