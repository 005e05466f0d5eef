import type { FieldPath, ScenarioDocument } from '../scenario/document.js';
import type { LayerGroup } from '../map/style.js';
import type { UnitSystem } from '../units/systems.js';
import type { Background } from '../map/tiles.js';
import type { EnvelopeGrid } from '../study/envelope.js';
import type { EnvelopeFileName } from '../study/envelope-files.js';

/** What the panels can ask the page to do; app/controller.ts carries these out. */
export interface Actions {
  editField(path: FieldPath, value: unknown): void;
  /** A change of the draft's structure (a stage added, a list reordered), validated like a field. */
  editDraft(change: (draft: ScenarioDocument) => ScenarioDocument): void;
  openFiles(files: readonly File[]): Promise<void>;
  openDemo(id: string): void;
  dismissRefused(): void;
  saveScenario(): void;
  saveAttachedFile(path: string): void;
  run(): void;
  cancel(): void;
  setUnits(units: UnitSystem): void;
  exportFile(name: string): void;
  exportReviewSheet(paper: 'a4' | 'letter'): Promise<void>;
  setBackground(background: Background): Promise<string>;
  setLayerVisible(group: LayerGroup, visible: boolean): void;
  computeEnvelope(grid: EnvelopeGrid): Promise<void>;
  cancelEnvelope(): void;
  loadWindCase(from: number, speed: number): void;
  exportEnvelopeFile(name: EnvelopeFileName): Promise<void>;
}
