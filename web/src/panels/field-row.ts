import type { AppState } from '../app/store.js';
import { valueAt } from '../scenario/document.js';
import type { DayField } from '../scenario/day-fields.js';
import { shownValue, writtenValue } from '../scenario/field-values.js';
import type { Unit } from '../units/systems.js';
import { el, uniqueId } from './dom.js';
import { issueConcerns } from './issues.js';

/**
 * One labelled box of the Setup tab bound to a place in the scenario document: it shows the
 * draft's value in the page's units, writes what is typed back on every input event, and shows
 * the validator's messages for its path under it. A 'choice' field is a drop-down of the values
 * the format allows.
 */
export interface FieldRow {
  element: HTMLElement;
  update(state: AppState): void;
}

/**
 * @param read the value shown, from the draft (default: the value at the field's path).
 * @param commit writes a value typed or chosen (undefined removes an optional field) into the draft.
 * @example
 *   const row = fieldRow(field, store.get(), (v) => actions.editField(field.path, v));
 *   box.appendChild(row.element);
 */
export function fieldRow(field: DayField, state: AppState, commit: (value: unknown) => void, read: (json: unknown) => unknown = (json) => valueAt(json, field.path)): FieldRow {
  const id = uniqueId('field');
  const messageId = `${id}-message`;
  const input: HTMLInputElement | HTMLSelectElement =
    field.kind === 'choice'
      ? el('select', { attrs: { id, 'aria-describedby': messageId }, data: { path: field.issuePath } }, ...(field.choices ?? []).map((c) => el('option', { text: c.label, attrs: { value: String(c.value) } })))
      : el('input', {
          attrs: { id, type: 'text', autocomplete: 'off', spellcheck: 'false', 'aria-describedby': messageId, inputmode: field.kind === 'text' ? 'text' : 'decimal' },
          data: { path: field.issuePath },
        });
  if (field.placeholder && input instanceof HTMLInputElement) input.placeholder = field.placeholder;
  const unitLabel = el('span', { class: 'unit', attrs: { 'aria-hidden': 'true' } });
  const message = el('p', { class: 'field-message', attrs: { id: messageId }, data: { messageFor: field.issuePath } });
  let unit: Unit | null = null;
  /** What the box held when last written into the draft (or shown from it). */
  let written = '';

  const showValue = (s: AppState) => {
    const raw = read(s.draft.json);
    if (input instanceof HTMLSelectElement) {
      // A value the format does not allow stays visible as an extra entry, so its message makes sense.
      const text = raw === undefined ? '' : String(raw);
      if (![...input.options].some((o) => o.value === text)) input.appendChild(el('option', { text: text === '' ? '(none)' : text, attrs: { value: text } }));
      input.value = text;
      written = text;
      input.setAttribute('aria-label', field.label);
      return;
    }
    const shown = shownValue(field, raw, s.units);
    unit = shown.unit;
    input.value = shown.text;
    written = shown.text;
    unitLabel.textContent = shown.unit?.label ?? '';
    input.setAttribute('aria-label', shown.unit ? `${field.label} (${shown.unit.label})` : field.label);
  };
  showValue(state);

  // Validated on every input event, not only when the box loses focus: after Ctrl+Z (or any edit)
  // the message and the Run button follow the value in the box at once.
  const edit = () => {
    if (input.value === written) return;
    written = input.value;
    commit(writtenValue(field, input.value, unit));
  };
  input.addEventListener('input', edit);
  input.addEventListener('change', edit);

  const update = (s: AppState) => {
    const issues = s.draftIssues.filter((issue) => issueConcerns(issue, field.issuePath));
    message.textContent = issues.map((issue) => (issue.path === field.issuePath ? issue.message : `${issue.path}: ${issue.message}`)).join(' · ');
    input.setAttribute('aria-invalid', issues.length > 0 ? 'true' : 'false');
    // Never overwrite what the user is typing, nor a value the validator refused (it explains it).
    if (document.activeElement !== input && issues.length === 0) showValue(s);
  };
  update(state);

  const label = el('label', { text: field.label, attrs: { for: id } });
  return { element: el('div', { class: 'field' }, label, el('div', { class: 'input-with-unit' }, input, unitLabel), message), update };
}
