/**
 * Running the computation in the worker (worker.ts): start it, send one request at a time (a new
 * request or a cancel ends the running one by ending the worker; a fresh worker takes the next),
 * show the progress after a short delay, and hand each reply to the page. The page states what
 * the worker answers; the worker computes with the library's own functions.
 */
import DwWorker from './worker.ts?worker&inline';
import { showError } from './dom.js';
import { renderResult } from './render.js';
import { renderBatchResult } from './render-batch.js';
import type { PlainError, Reply, Request, TableSummary } from './protocol.js';
import { el, page } from './elements.js';

/** A computation shorter than this shows no progress indicator, to avoid a flicker. */
const PROGRESS_DELAY_MS = 200;

let worker: Worker | null = null;
let nextId = 1;
let pending: { id: number; kind: Request['kind']; started: number; timer: number; rho: number | null } | null = null;
let onTable: (t: TableSummary) => void = () => {};

/** A fresh request id. */
export function newId(): number {
  return nextId++;
}

/** Start the worker; `showTable` receives the summary of each table the worker has read. */
export function connectWorker(showTable: (t: TableSummary) => void): void {
  onTable = showTable;
  startWorker();
}

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

export function send(request: Request, rho: number | null = null): void {
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
export function cancel(report: boolean): void {
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

/** Show a computed result (one test or a batch) in place of the previous one. */
function showResults(body: Node): void {
  showError(el.resultError, null);
  el.resultBody.replaceChildren(body);
  el.resultBody.hidden = false;
  el.stale.hidden = true;
  page.hasResult = true;
  el.resultsTitle.focus();
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
      onTable(reply.table);
      return;
    case 'result': {
      const rho = pending.rho;
      finish();
      showResults(renderResult(reply.result, reply.extras, rho, reply.failures));
      return;
    }
    case 'batch-result': {
      finish();
      showResults(renderBatchResult(reply.batch, reply.downloads));
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
        page.hasResult = false;
      }
    }
  }
}
