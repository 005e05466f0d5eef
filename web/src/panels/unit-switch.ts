import type { Store } from '../app/store.js';
import { UNIT_SYSTEMS, type UnitSystem } from '../units/systems.js';
import type { Actions } from './actions.js';
import { el } from './dom.js';

const LABELS: Record<UnitSystem, string> = { metric: 'Metric', imperial: 'Imperial' };

/** Metric / imperial, as a radio group in the top bar: every figure, field and label follows it. */
export function unitSwitch(store: Store, actions: Actions): HTMLElement {
  const group = el('fieldset', { class: 'unit-switch', data: { test: 'units' } }, el('legend', { class: 'visually-hidden', text: 'Units' }));
  for (const system of UNIT_SYSTEMS) {
    const id = `units-${system}`;
    const input = el('input', { attrs: { type: 'radio', name: 'units', id, value: system } });
    input.checked = store.get().units === system;
    input.addEventListener('change', () => input.checked && actions.setUnits(system));
    group.append(input, el('label', { text: LABELS[system], attrs: { for: id } }));
    // Opening a scenario that names its units (run.units) changes them too.
    store.subscribe((state, previous) => state.units !== previous.units && (input.checked = state.units === system));
  }
  return group;
}
