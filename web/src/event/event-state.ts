import type { EventPlan } from '../../../src/event/event-file.js';
import type { Issue } from '../../../src/scenario/types.js';
import { Cell } from './cell.js';
import type { EventRun } from './event-run.js';

/** The event view's state: the plan opened, its run, and whether the map shows it. */
export interface EventState {
  plan: EventPlan | null;
  fileName: string;
  /** A plan that was opened and refused, with its problems (the previous plan stays). */
  refused: { fileName: string; issues: Issue[] } | null;
  phase: 'idle' | 'running' | 'analysing' | 'finished' | 'cancelled' | 'failed';
  done: number;
  total: number;
  rate: number;
  message: string;
  run: EventRun | null;
  computedAt: string | null;
  /** The map shows the event (its site, zones and risk lines) instead of the scenario. */
  onMap: boolean;
}

export const IDLE_EVENT: EventState = { plan: null, fileName: '', refused: null, phase: 'idle', done: 0, total: 0, rate: 0, message: '', run: null, computedAt: null, onMap: false };

export type EventCell = Cell<EventState>;

export function eventCell(): EventCell {
  return new Cell<EventState>(IDLE_EVENT);
}
