/**
 * The page's elements, found once by id, and the little state the page keeps between events: the
 * data last read (and its table's summary) and whether a result is on show. No computation.
 */
import { byId } from './dom.js';
import type { DataSource, TableSummary } from './protocol.js';

/** The elements of the page (index.html), by role. */
export const el = {
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
  by: byId<HTMLSelectElement>('by'),
  adjust: byId<HTMLSelectElement>('adjust'),
  adjustField: byId('adjust-field'),
  time: byId<HTMLSelectElement>('time'),
  timeBatchNote: byId('time-batch-note'),
  dropMissing: byId<HTMLInputElement>('drop-missing'),
  frequency: byId<HTMLSelectElement>('frequency'),
  lag: byId<HTMLInputElement>('lag'),
  alpha: byId<HTMLInputElement>('alpha'),
  rho: byId<HTMLInputElement>('rho'),
  rhoField: byId('rho-field'),
  rhoOff: byId('rho-off'),
  method: byId<HTMLSelectElement>('method'),
  computeButton: byId<HTMLButtonElement>('compute'),
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

/** What the page remembers between events: the data last read, the summary of its table, whether a result is on show. */
export const page: { data: DataSource | null; table: TableSummary | null; hasResult: boolean } = { data: null, table: null, hasResult: false };
