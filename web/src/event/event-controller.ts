import { isoSeconds } from '../../../src/report/sheet/review-facts.js';
import { VERSION } from '../../../src/version.js';
import { download } from '../exports/download.js';
import { isCancellation } from '../study/engine.js';
import type { UnitSystem } from '../units/systems.js';
import { EVENT_DEMOS } from './event-demos.js';
import { eventJson, eventSheetPdf, runEventInPage } from './event-run.js';
import type { EventCell } from './event-state.js';
import { openEventFiles, openEventText, type EventOpening } from './open-event.js';

/** What the Event tab asks for: open a plan, run it, cancel, download its sheet. */
export class EventController {
  private running: AbortController | null = null;

  constructor(private readonly cell: EventCell) {}

  private take(opening: EventOpening): void {
    if (!opening.ok) {
      this.cell.update({ refused: { fileName: opening.fileName, issues: opening.issues } });
      return;
    }
    this.running?.abort();
    const total = opening.plan.items.reduce((s, it) => s + it.scenario.run.samples, 0);
    this.cell.update({ plan: opening.plan, fileName: opening.fileName, refused: null, phase: 'idle', done: 0, total, rate: 0, message: '', run: null, computedAt: null, onMap: true });
  }

  async openFiles(files: readonly File[]): Promise<void> {
    this.take(await openEventFiles(files));
  }

  openDemo(id: string): void {
    const demo = EVENT_DEMOS.find((d) => d.id === id);
    if (demo) this.take(openEventText(demo.text, demo.fileName, demo.files));
  }

  dismissRefused(): void {
    this.cell.update({ refused: null });
  }

  showOnMap(onMap: boolean): void {
    this.cell.update({ onMap });
  }

  async run(): Promise<void> {
    const { plan } = this.cell.get();
    if (!plan || this.running) return;
    const controller = new AbortController();
    this.running = controller;
    const total = plan.items.reduce((s, it) => s + it.scenario.run.samples, 0);
    this.cell.update({ phase: 'running', done: 0, total, rate: 0, message: '', onMap: true });
    try {
      const run = await runEventInPage(plan, {
        signal: controller.signal,
        onProgress: (p) => this.cell.update({ phase: p.done === p.total ? 'analysing' : 'running', done: p.done, total: p.total, rate: p.rate }),
      });
      if (controller.signal.aborted || this.cell.get().plan !== plan) return;
      this.cell.update({ phase: 'finished', done: total, run, computedAt: isoSeconds(new Date()) });
    } catch (error) {
      if (this.cell.get().plan !== plan) return;
      if (isCancellation(error) || controller.signal.aborted) this.cell.update({ phase: 'cancelled' });
      else this.cell.update({ phase: 'failed', message: error instanceof Error ? error.message : String(error) });
    } finally {
      if (this.running === controller) this.running = null;
    }
  }

  cancel(): void {
    this.running?.abort(Object.assign(new Error('cancelled'), { name: 'AbortError' }));
  }

  async downloadSheet(paper: 'a4' | 'letter', units: UnitSystem): Promise<void> {
    const { plan, run, computedAt } = this.cell.get();
    if (!plan || !run || !computedAt) return;
    download(`event-sheet-${units}-${paper}.pdf`, await eventSheetPdf(plan, run, computedAt, VERSION, paper, units));
  }

  async downloadSummary(): Promise<void> {
    const { plan, run, computedAt } = this.cell.get();
    if (!plan || !run || !computedAt) return;
    download('event.json', await eventJson(plan, run, computedAt, VERSION));
  }
}
