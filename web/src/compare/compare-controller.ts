import { comparisonFiles } from '../../../src/compare/compare.js';
import { runDate } from '../../../src/report/sheet/review-facts.js';
import { VERSION } from '../../../src/version.js';
import type { Store } from '../app/store.js';
import { download } from '../exports/download.js';
import type { Study } from '../study/compose.js';
import { compareWithCurrent, currentSide, readSavedRun, type CompareCell } from './saved-run.js';

/** Loads a saved run, keeps the comparison in step with the current run, offers compare.pdf. */
export class CompareController {
  constructor(private readonly cell: CompareCell, private readonly store: Store) {
    store.subscribe((state, previous) => {
      if (state.study !== previous.study) void this.refresh(state.study);
    });
  }

  async openFiles(files: readonly File[]): Promise<void> {
    const read = await readSavedRun(files);
    if (!read.ok) {
      this.cell.update({ problem: read.problem });
      return;
    }
    this.cell.update({ saved: read.saved, savedLabel: read.label, problem: null, onMap: true });
    await this.refresh(this.store.get().study, true);
  }

  /** The comparison against `study` (none without a current run). */
  private async refresh(study: Study | null, force = false): Promise<void> {
    const { saved, study: had } = this.cell.get();
    if (!force && study === had) return;
    if (!saved || !study) {
      this.cell.update({ comparison: null, current: null, study });
      return;
    }
    try {
      const current = await currentSide(study);
      if (this.store.get().study !== study) return;
      this.cell.update({ comparison: compareWithCurrent(saved, current), current, study, problem: null });
    } catch (error) {
      this.cell.update({ comparison: null, current: null, study, problem: `The current run's files cannot be compared: ${error instanceof Error ? error.message : String(error)}` });
    }
  }

  clear(): void {
    this.cell.update({ saved: null, savedLabel: '', comparison: null, current: null, problem: null });
  }

  showOnMap(onMap: boolean): void {
    this.cell.update({ onMap });
  }

  /** compare.pdf as `strewn compare SAVED CURRENT --out` writes it. */
  async downloadPdf(): Promise<void> {
    const { comparison, saved, current } = this.cell.get();
    if (!comparison || !saved || !current) return;
    await import('../exports/pdf-fonts.js');
    const pdf = comparisonFiles(comparison, saved, current, VERSION, runDate()).find(([name]) => name === 'compare.pdf');
    if (pdf) download('compare.pdf', pdf[1]);
  }
}
