/**
 * Choosing the model on the page: the pickers for y, the regressors and the time column (one
 * column in one role only), the lag, the level, the alternative, the engine and the power's rho;
 * the choices read back as plain data, or the first thing wrong with them in words, and sent to
 * the worker.
 *
 * With a grouping column the page tests each group separately (the library's exactDwBatch): the
 * adjustment of the p-values appears, the time column may be left to the time-index rule group by
 * group, rows with missing values may be dropped in each group, and the option a batch does not have (the power at rho) is switched off
 * * with the reason beside it.
 */
import type { Adjustment } from '../batch/adjust.js';
import type { TimeFrequency } from '../data/time-index.js';
import type { Alternative } from '../inference/dw-test.js';
import type { MethodChoice } from '../core/types.js';
import { capabilities } from './adapter.js';
import { h, showError } from './dom.js';
import type { ColumnInfo, ModelChoice, PlainError, TableSummary } from './protocol.js';
import { el, page } from './elements.js';
import { newId, send } from './worker-client.js';

function columnLabel(name: string, numeric: boolean): (Node | string)[] {
  return numeric ? [` ${name}`] : [` ${name} `, h('span', { class: 'note' }, '(not all numbers)')];
}

export function buildPickers(t: TableSummary): void {
  page.table = t;
  el.yChoices.replaceChildren();
  el.xChoices.replaceChildren();
  for (const c of t.columns) {
    const y = h('input', { type: 'radio', name: 'y', value: c.name, checked: c.name === t.guess.y });
    el.yChoices.append(h('label', { class: 'check' }, y, ...columnLabel(c.name, c.numeric)));
    const x = h('input', { type: 'checkbox', name: 'x', value: c.name, checked: t.guess.x.includes(c.name) });
    el.xChoices.append(h('label', { class: 'check' }, x, ...columnLabel(c.name, c.numeric)));
  }
  el.by.replaceChildren(h('option', { value: '' }, 'no: one test of all rows'),
    ...t.columns.map((c) => h('option', { value: c.name }, `${c.name} (${groupCount(c)})`)));
  el.by.value = '';
  el.adjust.value = '';
  singleTime = t.guess.time ?? '';
  batchMode = false;
  fillTimeOptions(t, false, singleTime);
  showMode();
  syncPickers();
}

function groupCount(c: ColumnInfo): string {
  const n = c.distinct ?? 0;
  return `${n} group${n === 1 ? '' : 's'}`;
}

/** The page tests each group separately (a grouping column is chosen). */
let batchMode = false;
/** The time column chosen for the single test, given back when the grouping is set to none again. */
let singleTime = '';

/** Marks the time choice "by the time-index rule, group by group" (its value is empty, like "none"). */
const RULE = 'rule';

/**
 * The choices of the time column: for the single test the columns that can be a time index of the
 * whole table; for groups also the time-index rule applied group by group, and every column of
 * numbers or time labels (stacked series repeat their periods, so the whole column need not increase).
 */
function fillTimeOptions(t: TableSummary, batch: boolean, selected: string | null): void {
  const options: HTMLOptionElement[] = [];
  if (batch) {
    options.push(h('option', { value: '', 'data-role': RULE, selected: selected === null }, 'by the rule, per group'));
    options.push(h('option', { value: '', selected: selected === '' }, "none: each group's rows are consecutive"));
    for (const c of t.columns) {
      if (c.numeric || c.timeLike || c.timeLabels) options.push(h('option', { value: c.name, selected: c.name === selected }, c.name));
    }
  } else {
    options.push(h('option', { value: '' }, 'none: rows are consecutive'));
    for (const c of t.columns) {
      if (c.numeric || c.timeLike) {
        options.push(h('option', { value: c.name, selected: c.name === selected },
          c.timeLike ? c.name : `${c.name} (not increasing time labels)`));
      }
    }
  }
  el.time.replaceChildren(...options);
  if (!options.some((o) => o.selected)) options[0].selected = true;
}

/** The time-index rule is chosen for the time column (batch mode only). */
function timeRuleChosen(): boolean {
  return batchMode && el.time.selectedOptions[0]?.dataset.role === RULE;
}

/** Show the controls of the chosen mode (one test, or one test per group), with the reasons for those switched off. */
function showMode(): void {
  el.adjustField.hidden = !batchMode;
  el.rho.disabled = batchMode;
  el.rhoOff.hidden = !batchMode;
  el.timeBatchNote.hidden = !batchMode;
  el.computeButton.textContent = batchMode ? 'Compute the exact test of every group' : 'Compute the exact test';
}

/** After a change of the grouping column: switch between one test and one test per group. */
export function changeGrouping(): void {
  const t = page.table;
  const batch = el.by.value !== '';
  if (!t || batch === batchMode) { syncPickers(); return; }
  if (batch) {
    singleTime = el.time.value;
    fillTimeOptions(t, true, singleTime === '' ? null : singleTime);
  } else {
    fillTimeOptions(t, false, singleTime);
  }
  batchMode = batch;
  showMode();
  syncPickers();
}

function yInputs(): HTMLInputElement[] {
  return Array.from(el.yChoices.querySelectorAll<HTMLInputElement>('input[name="y"]'));
}

export function xInputs(): HTMLInputElement[] {
  return Array.from(el.xChoices.querySelectorAll<HTMLInputElement>('input[name="x"]'));
}

/** A column cannot be the grouping column, y, a regressor and the time column at once. */
export function syncPickers(): void {
  const by = el.by.value;
  for (const o of Array.from(el.time.options)) o.disabled = o.value !== '' && o.value === by;
  if (el.time.selectedOptions[0]?.disabled) el.time.selectedIndex = 0;
  const time = el.time.value;
  const taken = (name: string): boolean => (name === time && time !== '') || (name === by && by !== '');
  for (const r of yInputs()) {
    r.disabled = taken(r.value);
    if (r.disabled) r.checked = false;
  }
  const y = yInputs().find((r) => r.checked)?.value ?? null;
  for (const x of xInputs()) {
    x.disabled = x.value === y || taken(x.value);
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
  if (capabilities.power && !batchMode) {
    const r = fieldNumber(el.rho);
    if (r === 'bad') return { code: 'RHO_OUT_OF_RANGE', message: 'The value of \u03c1 for the power is not a number.', hint: 'Give a number between -1 and 1, such as 0.5, or leave it empty.' };
    rho = r === 'empty' ? null : r;
  }
  const alternative = (el.form.querySelector<HTMLInputElement>('input[name="alternative"]:checked')?.value ?? 'positive') as Alternative;
  const adjust = el.adjust.value;
  return {
    by: batchMode ? el.by.value : null,
    adjust: batchMode && (adjust === 'holm' || adjust === 'bh') ? adjust as Adjustment : null,
    y,
    x: xInputs().filter((x) => x.checked).map((x) => x.value),
    time: el.time.value === '' ? null : el.time.value,
    timeRule: timeRuleChosen(),
    dropMissing: el.dropMissing.checked,
    frequency: el.frequency.value === '' ? null : el.frequency.value as TimeFrequency,
    lag,
    intercept: el.intercept.checked,
    alternative,
    alpha,
    rho,
    method: el.method.value as MethodChoice,
  };
}

export function compute(): void {
  const data = page.data;
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
  send({ kind: 'compute', id: newId(), data, model }, model.rho);
}

/** After a change of the choices, say that the result on show is of the earlier ones. */
export function markStale(): void {
  if (page.hasResult) el.stale.hidden = false;
}
