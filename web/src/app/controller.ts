import { baseName, documentText, withValue, type FieldPath, type ScenarioDocument } from '../scenario/document.js';
import { DEMOS } from '../scenario/demos.js';
import { keepWorkspace } from '../scenario/persist.js';
import { openScenarioFiles, openScenarioText, type OpenOutcome } from '../scenario/read-files.js';
import { validateDocument } from '../scenario/validate.js';
import { binaryReader, isBinaryFile, readBinaryFiles } from '../scenario/ground-files.js';
import { composeStudy } from '../study/compose.js';
import { redrawMapSvg, redrawReviewSheet } from '../study/review-sheet.js';
import { isCancellation, runEngine } from '../study/engine.js';
import { download } from '../exports/download.js';
import type { Background } from '../map/tiles.js';
import type { LayerGroup } from '../map/style.js';
import type { MapView } from '../map/view.js';
import type { Actions } from '../panels/actions.js';
import type { UnitSystem } from '../units/systems.js';
import type { Store } from './store.js';
import { keepUnits } from './preferences.js';
import { computeEnvelope, IDLE_ENVELOPE, limitsKey, type EnvelopeGrid } from '../study/envelope.js';
import { envelopeFile, type EnvelopeFileName } from '../study/envelope-files.js';
import { windCase } from '../../../src/envelope/wind-case.js';
import { isoSeconds } from '../../../src/report/sheet/review-facts.js';
import { VERSION } from '../../../src/version.js';

/** Carries out what the panels ask for, on the page's one store. */
export class Controller implements Actions {
  private running: AbortController | null = null;
  private computingEnvelope: AbortController | null = null;
  mapView: MapView | null = null;

  constructor(private readonly store: Store) {}

  /** Takes an edited draft: if it validates it becomes the scenario, otherwise its problems show. */
  private applyDraft(draft: ScenarioDocument): void {
    const validation = validateDocument(draft);
    if (validation.ok) this.store.update({ draft, accepted: validation.accepted, draftIssues: [] });
    else this.store.update({ draft, draftIssues: validation.issues });
    this.keep();
  }

  private keep(): void {
    const { draft, accepted } = this.store.get();
    keepWorkspace({ draft, accepted: accepted.document });
  }

  editField(path: FieldPath, value: unknown): void {
    this.applyDraft(withValue(this.store.get().draft, path, value));
  }

  editDraft(change: (draft: ScenarioDocument) => ScenarioDocument): void {
    this.applyDraft(change(this.store.get().draft));
  }

  /** Forecast and terrain files loaded for the scenario being edited (by name; see ground-files.ts). */
  async attachFiles(files: readonly File[]): Promise<void> {
    const binaries = await readBinaryFiles(files, this.store.get().draft.binaries);
    this.applyDraft({ ...this.store.get().draft, binaries });
  }

  /** A pad dragged on the map; 7 decimals of a degree is about a centimetre. */
  movePad(lon: number, lat: number): void {
    const round = (x: number) => Number(x.toFixed(7));
    const draft = withValue(withValue(this.store.get().draft, ['site', 'pad', 'lat'], round(lat)), ['site', 'pad', 'lon'], round(lon));
    this.applyDraft(draft);
  }

  private take(outcome: OpenOutcome): void {
    if (outcome.ok) {
      // Results of another scenario (perhaps another site) would only mislead next to this one.
      this.running?.abort();
      this.computingEnvelope?.abort();
      const state = this.store.get();
      const named = outcome.accepted.scenario.run.units;
      this.store.update({
        draft: outcome.accepted.document,
        accepted: outcome.accepted,
        draftIssues: [],
        refused: null,
        documentVersion: state.documentVersion + 1,
        study: null,
        run: { phase: 'idle', done: 0, total: 0, rate: 0, message: '' },
        envelope: IDLE_ENVELOPE,
        // A scenario that names its units is shown in them (as `strewn run` prints it without
        // --units); the switch at the top still changes them afterwards.
        units: named ?? state.units,
      });
      if (named !== undefined) keepUnits(named);
      this.keep();
    } else {
      this.store.update({ refused: { fileName: outcome.fileName, issues: outcome.issues } });
    }
  }

  async openFiles(files: readonly File[]): Promise<void> {
    // Only forecast or terrain files (dropped, say): they belong to the scenario already open.
    if (files.length > 0 && files.every((f) => isBinaryFile(f.name))) return this.attachFiles(files);
    this.take(await openScenarioFiles(files));
  }

  openDemo(id: string): void {
    const demo = DEMOS.find((d) => d.id === id);
    if (demo) this.take(openScenarioText(demo.text, demo.fileName, { ...demo.files }));
  }

  dismissRefused(): void {
    this.store.update({ refused: null });
  }

  saveScenario(): void {
    const { draft, draftIssues } = this.store.get();
    if (draftIssues.length === 0) download(draft.fileName, documentText(draft));
  }

  saveAttachedFile(path: string): void {
    const text = this.store.get().accepted.document.files[path];
    if (text !== undefined) download(baseName(path), text);
  }

  async run(): Promise<void> {
    const state = this.store.get();
    if (this.running || state.draftIssues.length > 0) return;
    const accepted = state.accepted;
    const { samples, seed } = accepted.scenario.run;
    const controller = new AbortController();
    this.running = controller;
    const started = performance.now();
    // Marks for the bench (test/bench/page.ts) and a performance trace; they cost nothing to keep.
    performance.mark('strewn:run');
    this.store.update({ run: { phase: 'running', done: 0, total: samples, rate: 0, message: '' } });
    try {
      const result = await runEngine(accepted.scenario, {
        samples,
        seed,
        signal: controller.signal,
        onProgress: (p) => this.store.update({ run: { phase: 'running', done: p.done, total: p.total, rate: p.rate, message: '' } }),
      });
      const flightTime = performance.now() - started;
      performance.mark('strewn:flown');
      const rate = samples / Math.max(1e-3, flightTime / 1000);
      this.store.update({ run: { phase: 'analysing', done: samples, total: samples, rate, message: '' } });
      // Let the page show "analysing" before the analysis takes this thread for a moment.
      await new Promise((resolve) => setTimeout(resolve, 30));
      const study = await composeStudy(accepted, result, flightTime);
      // Cancelled while analysing, or a new scenario was opened (which cancels the run): these
      // results are not wanted.
      if (controller.signal.aborted) {
        const run = this.store.get().run;
        if (run.phase === 'analysing') this.store.update({ run: { ...run, phase: 'cancelled' } });
        return;
      }
      performance.mark('strewn:composed');
      this.store.update({ study, run: { phase: 'finished', done: samples, total: samples, rate, message: '' } });
      performance.mark('strewn:shown');
    } catch (error) {
      const run = this.store.get().run;
      if (isCancellation(error)) {
        if (run.phase === 'running') this.store.update({ run: { ...run, phase: 'cancelled' } });
      } else this.store.update({ run: { ...run, phase: 'failed', message: error instanceof Error ? error.message : String(error) } });
    } finally {
      this.running = null;
    }
  }

  cancel(): void {
    this.running?.abort();
  }

  setUnits(units: UnitSystem): void {
    this.store.update({ units });
    keepUnits(units);
  }

  exportFile(name: string): void {
    const study = this.store.get().study;
    if (!study) return;
    if (name === 'scenario') {
      download(study.accepted.document.fileName, documentText(study.accepted.document));
      return;
    }
    const file = study.files.find((f) => f.name === name);
    if (file) download(file.name, file.blob);
  }

  /**
   * The review sheet in the page's units on the paper chosen (the CLI's own is metric A4), with the
   * wind-limits page when they were computed for the very scenario of the run (as `strewn sheet
   * --envelope` demands).
   */
  async exportReviewSheet(paper: 'a4' | 'letter'): Promise<void> {
    const { study, units, envelope } = this.store.get();
    if (!study) return;
    const outcome = envelope.outcome;
    const record = outcome && outcome.hash === study.accepted.hash ? { envelope: outcome.envelope, scenarioHash: outcome.hash, version: VERSION, computedAt: outcome.computedAt } : undefined;
    download(`sheet-${units}-${paper}.pdf`, await redrawReviewSheet(study, paper, units, record));
  }

  async exportMapSvg(paper: 'a4' | 'letter'): Promise<void> {
    const { study, units } = this.store.get();
    if (study) download(`map-${units}-${paper}.svg`, await redrawMapSvg(study, paper, units));
  }

  /** Computes the wind limits of the accepted scenario over `grid`, one grid point after another. */
  async computeEnvelope(grid: EnvelopeGrid): Promise<void> {
    const state = this.store.get();
    if (this.computingEnvelope || state.draftIssues.length > 0) return;
    const accepted = state.accepted;
    const controller = new AbortController();
    this.computingEnvelope = controller;
    const previous = state.envelope.outcome;
    this.store.update({ envelope: { phase: 'running', progress: 0, done: 0, planned: 0, message: '', outcome: previous } });
    try {
      const envelope = await computeEnvelope(accepted.scenario, grid, {
        signal: controller.signal,
        onProgress: (progress, done, planned) => this.store.update({ envelope: { ...this.store.get().envelope, progress, done, planned } }),
      });
      // The launch window, as `strewn envelope` draws it: the forecast's hours against the limits.
      const forecast = accepted.scenario.weather.forecast;
      if (forecast !== undefined) {
        // Loaded on demand, like the chart code it uses, to keep the page's first load small.
        const { launchWindow } = await import('../../../src/envelope/launch-window.js');
        try {
          envelope.window = launchWindow(envelope, binaryReader(state.draft.binaries)(forecast.file), accepted.scenario);
        } catch {
          // The forecast file is no longer loaded (a reload): the limits stand without the window.
        }
      }
      const outcome = { envelope, hash: accepted.hash, key: limitsKey(accepted.scenario), computedAt: isoSeconds(new Date()) };
      this.store.update({ envelope: { phase: 'finished', progress: 1, done: envelope.casesFlown, planned: envelope.casesFlown, message: '', outcome } });
    } catch (error) {
      const current = this.store.get().envelope;
      if (isCancellation(error)) this.store.update({ envelope: { ...current, phase: 'cancelled' } });
      else this.store.update({ envelope: { ...current, phase: 'failed', message: error instanceof Error ? error.message : String(error) } });
    } finally {
      this.computingEnvelope = null;
    }
  }

  cancelEnvelope(): void {
    this.computingEnvelope?.abort(Object.assign(new Error('cancelled'), { name: 'AbortError' }));
  }

  /**
   * Puts one grid point's wind into the scenario, as the envelope flew it: the mean wind's speed
   * and direction, the gust at the same ratio, a profile scaled and turned with it (src/envelope/
   * wind-case.ts). Written in SI numbers, which every unit system reads. The user then runs it.
   */
  loadWindCase(from: number, speed: number): void {
    const { accepted } = this.store.get();
    const wind = windCase(accepted.scenario, from, speed).weather.wind;
    let draft = withValue(withValue(this.store.get().draft, ['weather', 'wind', 'speed'], speed), ['weather', 'wind', 'from'], from);
    if (accepted.scenario.weather.wind.gust !== undefined && wind.gust !== undefined) draft = withValue(draft, ['weather', 'wind', 'gust'], round(wind.gust));
    if (wind.profile) draft = withValue(draft, ['weather', 'wind', 'profile'], wind.profile.map((row) => ({ altitude: round(row.altitude), speed: round(row.speed), from: round(row.from) })));
    const outcome = this.store.get().envelope.outcome;
    const fresh = outcome !== null && outcome.key === limitsKey(accepted.scenario);
    this.applyDraft(draft);
    // The grid point is one the limits were computed for: they still apply, although rounding the
    // gust and profile for the file may have moved the scenario's fingerprint by a last digit.
    const after = this.store.get();
    if (fresh && after.accepted !== accepted && after.envelope.outcome === outcome) {
      this.store.update({ envelope: { ...after.envelope, outcome: { ...outcome, key: limitsKey(after.accepted.scenario) } } });
    }
  }

  async exportEnvelopeFile(name: EnvelopeFileName): Promise<void> {
    const { envelope, units } = this.store.get();
    if (!envelope.outcome) return;
    download(name, await envelopeFile(name, envelope.outcome, units));
  }

  setBackground(background: Background): Promise<string> {
    if (!this.mapView) return Promise.reject(new Error('the map is not available in this browser'));
    return this.mapView.setBackground(background);
  }

  setLayerVisible(group: LayerGroup, visible: boolean): void {
    this.mapView?.setLayerVisible(group, visible);
  }
}

/** Six decimals: far below what a wind measurement resolves, and short in the saved file. */
function round(x: number): number {
  return Number(x.toFixed(6));
}
