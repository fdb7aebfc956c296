/**
 * The page: takes the data (file, drop, paste or the bundled demo), offers the columns, sends the
 * choices to the computing worker and shows what comes back. All computation happens in the worker
 * (worker.ts) with the library's own functions; this module only moves data and draws.
 *
 * This file wires the page's events (keyboard and pointer alike: every control is a labelled form
 * element) to its parts: the elements and state (elements.ts), the worker (worker-client.ts),
 * reading the data (data-loading.ts) and choosing the model (model-form.ts), with one test or one
 * test per group of rows.
 */
import demoCsv from '../../docs/demo/apiary.csv?raw';
import { VERSION } from '../version.js';
import { capabilities } from './adapter.js';
import { byId, showError } from './dom.js';
import { el, page } from './elements.js';
import { cancel, connectWorker } from './worker-client.js';
import { loadText, readFile, showTable } from './data-loading.js';
import { changeGrouping, compute, markStale, syncPickers, xInputs } from './model-form.js';

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
    s.addEventListener('change', () => { const data = page.data; if (data) loadText(data.text, data.source, { sha256: data.sha256, bytes: data.bytes }); });
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
  el.by.addEventListener('change', changeGrouping);
  el.xAll.addEventListener('click', () => { for (const x of xInputs()) if (!x.disabled) x.checked = true; markStale(); });
  el.xNone.addEventListener('click', () => { for (const x of xInputs()) x.checked = false; markStale(); });
  el.form.addEventListener('input', markStale);
  el.form.addEventListener('change', markStale);
  el.form.addEventListener('submit', (e) => { e.preventDefault(); compute(); });
  el.cancel.addEventListener('click', () => cancel(true));
}


wire();
connectWorker(showTable);
