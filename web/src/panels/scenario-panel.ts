import type { AppState, Store } from '../app/store.js';
import { baseName, valueAt } from '../scenario/document.js';
import { dayFieldGroups } from '../scenario/day-fields.js';
import { DEMOS } from '../scenario/demos.js';
import { spreadsAsFlown } from '../../../src/report/spread-text.js';
import { unitFormatter } from '../../../src/report/format-number.js';
import { inputWords } from '../../../src/report/sheet/input-names.js';
import type { Actions } from './actions.js';
import { el, replaceChildren } from './dom.js';
import { fieldRow, type FieldRow } from './field-row.js';
import { vehicleEditor } from './vehicle-editor.js';
import { issueConcerns, issueList } from './issues.js';

/**
 * The "Setup" tab: choose or open a scenario, edit the day's fields, save. Messages from the
 * validator appear under the field they name; a refused file lists its problems and changes
 * nothing else.
 */
export function scenarioPanel(store: Store, actions: Actions): HTMLElement {
  const title = el('p', { class: 'scenario-title', data: { test: 'scenario-title' } });
  const fileName = el('p', { class: 'muted', data: { test: 'scenario-file' } });

  const demoSelect = el('select', { attrs: { id: 'demo-select' } }, ...DEMOS.map((d) => el('option', { text: d.label, attrs: { value: d.id } })));
  const demoButton = el('button', { text: 'Open demo', attrs: { type: 'button' } });
  demoButton.addEventListener('click', () => actions.openDemo(demoSelect.value));

  const fileInput = el('input', { class: 'visually-hidden', attrs: { type: 'file', id: 'scenario-file-input', 'aria-label': 'Scenario file and the files it refers to', tabindex: '-1', accept: '.json,.csv,application/json,text/csv', multiple: '' } });
  fileInput.addEventListener('change', () => {
    const files = Array.from(fileInput.files ?? []);
    fileInput.value = '';
    if (files.length > 0) void actions.openFiles(files);
  });
  const openButton = el('button', { text: 'Open scenario file…', attrs: { type: 'button' } });
  openButton.addEventListener('click', () => fileInput.click());
  const saveButton = el('button', { text: 'Save scenario (JSON)', attrs: { type: 'button' } });
  saveButton.addEventListener('click', () => actions.saveScenario());
  const attachedRow = el('div', { class: 'attached' });

  const refusedBox = el('div', { class: 'alert', attrs: { role: 'alert' }, data: { test: 'refused' } });
  const otherIssuesBox = el('div', { class: 'alert', attrs: { role: 'alert' }, data: { test: 'draft-issues' } });
  const warningsBox = el('div', { class: 'warnings', data: { test: 'scenario-warnings' } });
  const groupsBox = el('div', { class: 'field-groups' });
  // What flies sits between the day's air and the spreads: where, weather, vehicle, spreads, run.
  const vehicle = vehicleEditor(() => store.get(), actions);
  const laterGroupsBox = el('div', { class: 'field-groups' });
  // Spread numbers are offsets added to the nominal: say what is flown, as the sheet and check do.
  const flownBox = el('div', { class: 'spreads-flown', data: { test: 'spreads-flown' } });

  const rows = new Map<string, FieldRow>();
  let builtFor = '';

  const rebuildFields = (state: AppState) => {
    const groups = dayFieldGroups(state.draft.json);
    rows.clear();
    const fieldsets = groups.map((group) => {
        const fieldset = el('fieldset', { class: `field-group group-${group.id}` }, el('legend', { text: group.title }), group.note ? el('p', { class: 'note', text: group.note }) : null);
        for (const f of group.fields) {
          const row = fieldRow(f, state, (value) => actions.editField(f.path, value));
          rows.set(f.issuePath, row);
          fieldset.appendChild(row.element);
        }
        return fieldset;
      });
    const first = (id: string) => id === 'pad' || id === 'wind';
    replaceChildren(groupsBox, ...fieldsets.filter((_f, i) => first(groups[i]!.id)));
    replaceChildren(laterGroupsBox, ...fieldsets.filter((_f, i) => !first(groups[i]!.id)));
    builtFor = signature(state);
  };

  const render = (state: AppState) => {
    title.textContent = state.accepted.scenario.name;
    fileName.textContent = `File: ${state.accepted.document.fileName}`;
    if (signature(state) !== builtFor) rebuildFields(state);
    else for (const row of rows.values()) row.update(state);
    vehicle.render(state);

    const placed = [...rows.keys(), ...vehicle.paths()];
    const unplaced = state.draftIssues.filter((issue) => !placed.some((path) => issueConcerns(issue, path)));
    if (unplaced.length > 0) {
      replaceChildren(otherIssuesBox, el('p', { class: 'alert-title', text: 'Your edits have problems the fields below do not show; the map keeps the last valid scenario:' }), issueList(unplaced));
      otherIssuesBox.hidden = false;
    } else otherIssuesBox.hidden = true;

    if (state.refused) {
      const dismiss = el('button', { text: 'Dismiss', attrs: { type: 'button' } });
      dismiss.addEventListener('click', () => actions.dismissRefused());
      const n = state.refused.issues.length;
      replaceChildren(
        refusedBox,
        el('p', { class: 'alert-title' }, el('strong', { text: state.refused.fileName }), ` was not opened (${n === 1 ? '1 problem' : `${n} problems`}). The scenario you had is kept.`),
        issueList(state.refused.issues),
        dismiss,
      );
      refusedBox.hidden = false;
    } else refusedBox.hidden = true;

    const warnings = state.accepted.warnings;
    if (warnings.length > 0) {
      replaceChildren(warningsBox, el('p', { class: 'warnings-title', text: 'Outside common practice (check the site\u2019s safety code):' }), issueList(warnings));
      warningsBox.hidden = false;
    } else warningsBox.hidden = true;

    const flown = spreadsAsFlown(state.accepted.scenario, unitFormatter(state.units));
    if (flown.length > 0) {
      replaceChildren(
        flownBox,
        el('p', { class: 'note', text: 'Spreads as flown (nominal value, offsets \u2192 values flown):' }),
        el('ul', {}, ...flown.map((f) => el('li', { text: `${inputWords(f.name)}: ${f.text}` }))),
      );
      flownBox.hidden = false;
    } else flownBox.hidden = true;

    saveButton.disabled = state.draftIssues.length > 0;
    saveButton.title = saveButton.disabled ? 'Fix the marked fields first' : '';
    // The files the scenario names (its thrust curve), among those opened with it.
    const thrust = valueAt(state.accepted.document.json, ['vehicle', 'motor', 'thrust']);
    const files = typeof thrust === 'string' ? Object.keys(state.accepted.document.files).filter((path) => baseName(path) === baseName(thrust)) : [];
    replaceChildren(
      attachedRow,
      ...files.map((path) => {
        const b = el('button', { class: 'link-button', text: `Save ${path}`, attrs: { type: 'button' } });
        b.addEventListener('click', () => actions.saveAttachedFile(path));
        return el('span', {}, 'Refers to ', el('code', { text: path }), ' — keep it beside the scenario. ', b);
      }),
    );
  };

  store.subscribe((state, previous) => {
    if (state.draft !== previous.draft || state.draftIssues !== previous.draftIssues || state.accepted !== previous.accepted || state.refused !== previous.refused || state.units !== previous.units || state.documentVersion !== previous.documentVersion) render(state);
  });
  render(store.get());

  return el(
    'section',
    { class: 'panel-section', attrs: { 'aria-label': 'Scenario' } },
    title,
    fileName,
    el('div', { class: 'row' }, el('label', { text: 'Demo', attrs: { for: 'demo-select' } }), demoSelect, demoButton),
    el('div', { class: 'row' }, openButton, fileInput, saveButton),
    el('p', { class: 'note', text: 'Or drop a scenario file (with its motor CSV) anywhere on the page.' }),
    attachedRow,
    refusedBox,
    otherIssuesBox,
    warningsBox,
    groupsBox,
    vehicle.element,
    laterGroupsBox,
    flownBox,
  );
}

/** The fields are rebuilt when a new document arrives, the units change, or the fields differ. */
function signature(state: AppState): string {
  const paths = dayFieldGroups(state.draft.json).flatMap((g) => g.fields.map((f) => `${f.issuePath}=${f.label}`));
  return `${state.documentVersion}|${state.units}|${paths.join(',')}`;
}
