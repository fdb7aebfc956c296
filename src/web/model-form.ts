/**
 * Choosing the model on the page: the pickers for y, the regressors and the time column (one
 * column in one role only), the lag, the level, the alternative, the engine and the power's rho;
 * the choices read back as plain data, or the first thing wrong with them in words, and sent to
 * the worker.
 */
import type { TimeFrequency } from '../data/time-index.js';
import type { Alternative } from '../inference/dw-test.js';
import type { MethodChoice } from '../core/types.js';
import { capabilities } from './adapter.js';
import { h, showError } from './dom.js';
import type { ModelChoice, PlainError, TableSummary } from './protocol.js';
import { el, page } from './elements.js';
import { newId, send } from './worker-client.js';

function columnLabel(name: string, numeric: boolean): (Node | string)[] {
  return numeric ? [` ${name}`] : [` ${name} `, h('span', { class: 'note' }, '(not all numbers)')];
}

export function buildPickers(t: TableSummary): void {
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

export function xInputs(): HTMLInputElement[] {
  return Array.from(el.xChoices.querySelectorAll<HTMLInputElement>('input[name="x"]'));
}

/** A column cannot be y, a regressor and the time column at once. */
export function syncPickers(): void {
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
