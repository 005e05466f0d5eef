import { studyIsCurrent, type AppState, type Store } from '../app/store.js';
import { grouped } from '../units/format.js';
import type { Actions } from './actions.js';
import { el } from './dom.js';
import { DEMOS } from '../scenario/demos.js';

/**
 * The run controls, always in view above the tabs: what will run, the run and cancel buttons,
 * progress and flights per second. Flights happen in workers, so the page stays usable.
 */
export function runPanel(store: Store, actions: Actions): HTMLElement {
  const what = el('p', { class: 'run-what', data: { test: 'run-what' } });
  const runButton = el('button', { class: 'primary', text: 'Run', attrs: { type: 'button' }, data: { test: 'run' } });
  const cancelButton = el('button', { text: 'Cancel', attrs: { type: 'button' }, data: { test: 'cancel' } });
  const progress = el('progress', { attrs: { max: '1', value: '0', 'aria-label': 'Run progress' } });
  const status = el('p', { class: 'run-status', attrs: { role: 'status', 'aria-live': 'polite' }, data: { test: 'run-status' } });
  const warningLine = el('p', { class: 'run-warnings', data: { test: 'run-warnings' } });
  const intro = el('p', { class: 'demo-intro', data: { test: 'demo-intro' } });
  runButton.addEventListener('click', () => actions.run());
  cancelButton.addEventListener('click', () => actions.cancel());

  const render = (state: AppState) => {
    const { scenario } = state.accepted;
    const busy = state.run.phase === 'running' || state.run.phase === 'analysing';
    what.textContent = `${grouped(scenario.run.samples)} samples, seed ${scenario.run.seed}`;
    runButton.disabled = busy || state.draftIssues.length > 0;
    runButton.title = state.draftIssues.length > 0 ? 'Fix the marked fields first' : '';
    cancelButton.disabled = !busy;
    const { done, total, rate } = state.run;
    progress.max = Math.max(1, total);
    progress.value = state.run.phase === 'idle' ? 0 : done;
    status.dataset.phase = state.run.phase;
    status.textContent = statusText(state, done, total, rate);
    // A demo says what it shows and what to try, above everything else, until the reader's own file opens.
    const demo = DEMOS.find((d) => d.fileName === state.accepted.document.fileName);
    intro.hidden = demo === undefined;
    intro.textContent = demo?.intro ?? '';
    // The run's warnings in the summary line itself, not only at the end of a tab.
    const n = state.study ? state.study.summary.warnings.length + state.study.summary.scenarioWarnings.length : 0;
    warningLine.hidden = n === 0 || state.run.phase === 'running' || state.run.phase === 'analysing';
    warningLine.textContent = n === 1 ? '⚠ 1 warning: read it at the top of Findings.' : `⚠ ${n} warnings: read them at the top of Findings.`;
  };
  store.subscribe((state, previous) => {
    if (state.run !== previous.run || state.accepted !== previous.accepted || state.draftIssues !== previous.draftIssues || state.study !== previous.study) render(state);
  });
  render(store.get());

  return el('section', { class: 'run-panel', attrs: { 'aria-label': 'Run' } }, el('div', { class: 'row' }, runButton, cancelButton, what), progress, status, warningLine, intro);
}

function statusText(state: AppState, done: number, total: number, rate: number): string {
  switch (state.run.phase) {
    case 'idle':
      return state.draftIssues.length > 0 ? 'Fix the marked fields, then run.' : 'Ready.';
    case 'running':
      return `${grouped(done)} of ${grouped(total)} flights · ${grouped(rate)} flights/s`;
    case 'analysing':
      return `${grouped(total)} flights done · analysing…`;
    case 'finished':
      return `Finished: ${grouped(total)} flights at ${grouped(rate)} flights/s.${studyIsCurrent(state) ? '' : ' The scenario has changed since; run again to update.'}`;
    case 'cancelled':
      return `Cancelled after ${grouped(done)} of ${grouped(total)} flights.${state.study ? ' The results shown are from the previous run.' : ''}`;
    case 'failed':
      return `The run failed: ${state.run.message}`;
  }
}
