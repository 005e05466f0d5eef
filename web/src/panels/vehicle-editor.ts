import '../styles/setup.css';
import type { AppState } from '../app/store.js';
import { valueAt } from '../scenario/document.js';
import { vehicleFieldGroups, type DragWay, type VehicleField, type VehicleGroup } from '../scenario/vehicle-fields.js';
import { addFinSet, addStage, addStartingShape, addTransition, moveEntry, removeEntry, removeShape, renameStage, setDragWay, setThrustFile, setTrigger } from '../scenario/vehicle-edits.js';
import { MotorModel } from '../../../src/physics/motor.js';
import { unitFormatter } from '../../../src/report/format-number.js';
import { WORDS } from '../../../src/report/symbols.js';
import { POINT_MASS_ROCKET_WARNING } from '../../../src/scenario/warnings.js';
import type { Actions } from './actions.js';
import { el, replaceChildren } from './dom.js';
import { fieldRow, type FieldRow } from './field-row.js';
import { issueList } from './issues.js';
import { rocketFigures } from './rocket-figures.js';
import { sideViewSvg } from './side-view.js';

/**
 * The "what flies" part of the Setup tab: the nominal figures (stability from the shape, rail
 * exit, apogee point), the side view to scale, and boxes for the shape, the motor and the
 * recovery stages. Every box writes into the scenario document where the format puts the value
 * and is validated on every input event like the day's fields; the figures and the view follow
 * the last valid scenario, so they change as you type.
 */
export interface VehicleEditor {
  element: HTMLElement;
  render(state: AppState): void;
  /** Field paths this editor shows messages for (the rest go to the panel's general box). */
  paths(): string[];
}

export function vehicleEditor(getState: () => AppState, actions: Actions): VehicleEditor {
  const figuresBox = el('div', { class: 'rocket-summary', data: { test: 'rocket-summary' } });
  const pointMassBox = el('div', { class: 'warnings point-mass', data: { test: 'point-mass' } });
  const viewBox = el('figure', { class: 'side-view', data: { test: 'side-view' } });
  // Warnings about what flies (a margin under 1 calibre, a Mach 0.8 flight) beside the figures too,
  // so they are seen while the shape is edited; they also stay in the list at the top of the tab.
  const vehicleWarnings = el('div', { class: 'warnings', data: { test: 'vehicle-warnings' } });
  const staleNote = el('p', { class: 'note', data: { test: 'figures-stale' }, text: 'The figures and the side view are those of the last valid scenario; fix the marked fields to update them.' });
  const groupsBox = el('div', { class: 'field-groups vehicle-groups' });
  const rows = new Map<string, FieldRow>();
  const legends = new Map<string, HTMLLegendElement>();
  let builtFor = '';
  let lastState: AppState | null = null;

  const thrustInput = el('input', { class: 'visually-hidden', attrs: { type: 'file', accept: '.csv,.txt,text/csv,text/plain', tabindex: '-1', 'aria-label': 'Thrust curve file (CSV)' } });
  thrustInput.addEventListener('change', () => {
    const file = thrustInput.files?.[0];
    thrustInput.value = '';
    if (file) void file.text().then((text) => actions.editDraft((doc) => setThrustFile(doc, file.name, text)));
  });

  const button = (text: string, test: string, onClick: () => void, disabled = false) => {
    const b = el('button', { text, attrs: { type: 'button' }, data: { test } });
    b.disabled = disabled;
    b.addEventListener('click', onClick);
    return b;
  };

  /** What a box's value does when it changes: most write their own place, some rewrite more. */
  const commitFor = (field: VehicleField, group: VehicleGroup) => (value: unknown) => {
    const i = group.index ?? 0;
    if (field.structural === 'trigger') actions.editDraft((doc) => setTrigger(doc, i, value));
    else if (field.structural === 'dragWay') actions.editDraft((doc) => setDragWay(doc, i, value as DragWay, getState().accepted.scenario, getState().units));
    else if (group.kind === 'stage' && field.path[field.path.length - 1] === 'name') actions.editDraft((doc) => renameStage(doc, i, value));
    else actions.editField(field.path, value);
  };

  const groupButtons = (group: VehicleGroup, state: AppState, count: number): HTMLElement | null => {
    const i = group.index ?? 0;
    const accepted = state.accepted.scenario.vehicle;
    const shape = accepted.shape;
    const d = accepted.diameter;
    switch (group.kind) {
      case 'motor':
        return el(
          'div',
          { class: 'row group-actions' },
          button('Use another thrust curve (CSV)\u2026', 'thrust-file', () => thrustInput.click()),
          thrustInput,
        );
      case 'shape':
        return el(
          'div',
          { class: 'row group-actions' },
          shape && d !== undefined ? button('Add a transition', 'add-transition', () => actions.editDraft((doc) => addTransition(doc, shape, d, getState().units))) : null,
          shape && d !== undefined ? button('Add a fin set', 'add-fins', () => actions.editDraft((doc) => addFinSet(doc, shape, d, getState().units))) : null,
          button('Remove the shape', 'remove-shape', () => actions.editDraft(removeShape)),
        );
      case 'transition':
        return el('div', { class: 'row group-actions' }, button('Remove this transition', 'remove-transition', () => actions.editDraft((doc) => removeEntry(doc, ['vehicle', 'shape', 'transitions'], i, true))));
      case 'fins':
        // The format needs at least one fin set.
        return count > 1 ? el('div', { class: 'row group-actions' }, button('Remove this fin set', 'remove-fins', () => actions.editDraft((doc) => removeEntry(doc, ['vehicle', 'shape', 'fins'], i, false)))) : null;
      case 'stage':
        return el(
          'div',
          { class: 'row group-actions' },
          button('Move up', 'stage-up', () => actions.editDraft((doc) => moveEntry(doc, ['recovery'], i, -1)), i === 0),
          button('Move down', 'stage-down', () => actions.editDraft((doc) => moveEntry(doc, ['recovery'], i, 1)), i === count - 1),
          button('Remove this stage', 'remove-stage', () => actions.editDraft((doc) => removeEntry(doc, ['recovery'], i, true))),
        );
      default:
        return null;
    }
  };

  const motorSlot = el('p', { class: 'note', data: { test: 'motor-curve' } });
  const showMotor = (state: AppState) => {
    const motor = state.accepted.scenario.vehicle.motor;
    if (!motor) return;
    const model = new MotorModel(motor);
    const u = unitFormatter(state.units);
    const thrust = valueAt(state.draft.json, ['vehicle', 'motor', 'thrust']);
    const source = typeof thrust === 'string' && !thrust.includes('\n') ? thrust : 'a table in the scenario';
    replaceChildren(motorSlot, 'Thrust curve: ', el('code', { text: source }), ` \u2014 total impulse ${u.impulse(model.totalImpulse)} over ${model.burnTime.toFixed(2)} s.`);
  };

  const rebuild = (state: AppState) => {
    const focused = document.activeElement instanceof HTMLElement ? document.activeElement.dataset.path ?? document.activeElement.dataset.test : undefined;
    const groups = vehicleFieldGroups(state.draft.json);
    rows.clear();
    legends.clear();
    const counts = { transition: 0, fins: 0, stage: 0 } as Record<string, number>;
    for (const g of groups) counts[g.kind] = (counts[g.kind] ?? 0) + 1;
    const kind = valueAt(state.draft.json, ['vehicle', 'kind']);
    const fieldsets = groups.map((group) => {
      const legend = el('legend', { text: group.title });
      legends.set(group.id, legend);
      const fieldset = el('fieldset', { class: `field-group vehicle-group group-${group.kind}`, data: { group: group.id } }, legend, group.note ? el('p', { class: 'note', text: group.note }) : null);
      if (group.kind === 'motor') fieldset.appendChild(motorSlot);
      for (const field of group.fields) {
        const row = fieldRow(field, state, commitFor(field, group), field.read);
        rows.set(field.issuePath, row);
        fieldset.appendChild(row.element);
      }
      const actionsRow = groupButtons(group, state, counts[group.kind] ?? 0);
      if (actionsRow) fieldset.appendChild(actionsRow);
      return fieldset;
    });
    const addStageButton = kind === 'rocket' || kind === 'release' ? el('div', { class: 'row group-actions' }, button('Add a recovery stage', 'add-stage', () => actions.editDraft((doc) => addStage(doc, getState().units)))) : null;
    replaceChildren(groupsBox, ...fieldsets, addStageButton);
    builtFor = signature(state);
    // A box that changed the set of boxes (a trigger, a drag way) keeps the keyboard focus.
    if (focused) groupsBox.querySelector<HTMLElement>(`[data-path="${CSS.escape(focused)}"], [data-test="${CSS.escape(focused)}"]`)?.focus();
  };

  const drawView = (state: AppState) => {
    const v = state.accepted.scenario.vehicle;
    const s = state.accepted.figures.stability;
    if (v.kind !== 'rocket' || !v.shape || v.diameter === undefined || !s) {
      viewBox.hidden = true;
      return;
    }
    viewBox.hidden = false;
    const width = Math.max(240, Math.floor(viewBox.clientWidth || figuresBox.clientWidth || 320));
    const u = unitFormatter(state.units);
    replaceChildren(
      viewBox,
      sideViewSvg(v.shape, v.diameter, { cg: s.cg_m, cp: s.cp_m, cgBurnout: s.cgBurnout_m }, width, u),
      el('figcaption', { class: 'note', text: WORDS.sideViewCaption(s.margin_cal.toFixed(2)) }),
    );
    viewBox.dataset.width = String(width);
  };

  const render = (state: AppState) => {
    lastState = state;
    const previous = figuresBox.dataset.for;
    const key = `${state.accepted.hash}|${state.units}`;
    if (previous !== key) {
      replaceChildren(figuresBox, el('p', { class: 'rocket-figures-title', text: figureTitle(state) }), rocketFigures(state.accepted.figures, unitFormatter(state.units)));
      figuresBox.dataset.for = key;
      drawView(state);
    }
    staleNote.hidden = state.draftIssues.length === 0;
    const nearby = state.accepted.warnings.filter((w) => (w.path.startsWith('vehicle.') || w.path.startsWith('recovery') || w.path === 'launch.rail') && w.message !== POINT_MASS_ROCKET_WARNING);
    replaceChildren(vehicleWarnings, ...(nearby.length > 0 ? [issueList(nearby)] : []));
    vehicleWarnings.hidden = nearby.length === 0;
    showMotor(state);

    const v = state.accepted.scenario.vehicle;
    const draftHasShape = valueAt(state.draft.json, ['vehicle', 'shape']) !== undefined;
    if (v.kind === 'rocket' && !v.shape && !draftHasShape) {
      replaceChildren(
        pointMassBox,
        el('p', { class: 'warnings-title', text: 'This rocket has no shape' }),
        el('p', { text: POINT_MASS_ROCKET_WARNING.charAt(0).toUpperCase() + POINT_MASS_ROCKET_WARNING.slice(1) + '.' }),
        el(
          'div',
          { class: 'row' },
          button('Add a starting shape', 'add-shape', () => actions.editDraft((doc) => addStartingShape(doc, getState().accepted.scenario, getState().units))),
          el('span', { class: 'note', text: 'Every number in it is a placeholder: replace each with your rocket\u2019s own, the balance point above all.' }),
        ),
      );
      pointMassBox.hidden = false;
    } else pointMassBox.hidden = true;

    if (signature(state) !== builtFor) rebuild(state);
    else for (const row of rows.values()) row.update(state);
    for (const group of vehicleFieldGroups(state.draft.json)) {
      const legend = legends.get(group.id);
      if (legend && legend.textContent !== group.title) legend.textContent = group.title;
    }
  };

  // Redrawn at the width it is shown at: when the panel is resized or the tab first shown.
  let lastWidth = 0;
  new ResizeObserver(() => {
    const w = Math.floor(viewBox.clientWidth);
    if (lastState && w > 0 && Math.abs(w - lastWidth) > 2) {
      lastWidth = w;
      drawView(lastState);
    }
  }).observe(viewBox);

  const element = el('section', { class: 'vehicle-editor', attrs: { 'aria-label': 'What flies' } }, el('h2', { class: 'section-title', text: 'What flies' }), pointMassBox, viewBox, figuresBox, vehicleWarnings, staleNote, groupsBox);
  return { element, render, paths: () => [...rows.keys()] };
}

function figureTitle(state: AppState): string {
  const v = state.accepted.scenario.vehicle;
  if (v.kind === 'rocket' && v.shape) return 'Nominal flight and stability (Barrowman, subsonic; positions from the nose tip):';
  return 'Nominal flight:';
}

/** Rebuilt when a new document arrives, the units change, or the set of boxes differs. */
function signature(state: AppState): string {
  const paths = vehicleFieldGroups(state.draft.json).flatMap((g) => [g.id, ...g.fields.map((f) => f.issuePath)]);
  return `${state.documentVersion}|${state.units}|${paths.join(',')}`;
}
