import type { Issue } from '../../../src/scenario/types.js';
import type { ScenarioDocument } from '../scenario/document.js';
import type { AcceptedScenario } from '../scenario/validate.js';
import type { Study } from '../study/compose.js';
import type { EnvelopeState } from '../study/envelope.js';
import type { UnitSystem } from '../units/systems.js';

/** Where the current run is. */
export interface RunState {
  phase: 'idle' | 'running' | 'analysing' | 'finished' | 'cancelled' | 'failed';
  done: number;
  total: number;
  /** Flights per second so far. */
  rate: number;
  message: string;
}

export interface AppState {
  /** What the fields show, mistakes included. */
  draft: ScenarioDocument;
  /** Problems of the draft, by field path; empty when the draft is the accepted scenario. */
  draftIssues: Issue[];
  /** The last scenario that passed validation: what the map shows and what runs. */
  accepted: AcceptedScenario;
  /** A file that was opened and refused, with its problems (the previous scenario stays). */
  refused: { fileName: string; issues: Issue[] } | null;
  /** Bumped when a whole new document arrives (file, demo), so the fields are rebuilt. */
  documentVersion: number;
  units: UnitSystem;
  run: RunState;
  study: Study | null;
  /** The wind-limits computation of the "Wind limits" tab and its last result. */
  envelope: EnvelopeState;
}

export type Listener = (state: AppState, previous: AppState) => void;

/** A small state container: one object, replaced on each change, listeners told after. */
export class Store {
  private state: AppState;
  private readonly listeners = new Set<Listener>();

  constructor(initial: AppState) {
    this.state = initial;
  }

  get(): AppState {
    return this.state;
  }

  update(patch: Partial<AppState>): void {
    const previous = this.state;
    this.state = { ...previous, ...patch };
    for (const listener of this.listeners) listener(this.state, previous);
  }

  subscribe(listener: Listener): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }
}

/** Whether the results on show were computed from the scenario that is accepted now. */
export function studyIsCurrent(state: AppState): boolean {
  return state.study !== null && state.study.accepted.hash === state.accepted.hash;
}
