import type { AttachedFiles } from './document.js';

/**
 * The demo scenarios in scenarios/, bundled at build time so the page needs no network and no
 * file access. A demo carries the motor curves of scenarios/motors/ it names, under the paths the
 * scenario files write ("motors/<name>.csv").
 */
export interface Demo {
  id: string;
  label: string;
  fileName: string;
  text: string;
  files: AttachedFiles;
  /** One line: what this demo shows and what to try first. */
  intro: string;
}

// Event plans (*.event.json) are not scenarios: the Event tab opens them (web/src/event/event-demos.ts).
const SCENARIO_TEXTS = import.meta.glob(['../../../scenarios/*.json', '!../../../scenarios/*.event.json'], { query: '?raw', import: 'default', eager: true }) as Record<string, string>;
const MOTOR_TEXTS = import.meta.glob('../../../scenarios/motors/*.csv', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

const fileNameOf = (path: string) => path.split('/').pop()!;

const MOTORS: AttachedFiles = Object.fromEntries(Object.entries(MOTOR_TEXTS).map(([path, text]) => [`motors/${fileNameOf(path)}`, text]));

/** Short labels for the picker; a demo without one is listed by its file name. */
const LABELS: Record<string, string> = {
  'club-rocket': 'Club rocket (dual deploy)',
  'display-shell': 'Display shell that fails to burst',
  'display-shell-burst': 'Display shell bursting into casing pieces',
  'drone-power-loss': 'Camera drone losing power',
};

/**
 * What each demo shows, in one line. The club rocket's problems are there on purpose, so a new
 * reader does not take them for a fault of the program, and learns where such problems are shown.
 */
const INTROS: Record<string, string> = {
  'club-rocket': 'Demo with problems on purpose: its keep-out zone overlaps the spectators and its forecast wind is outside its wind limits. Try Run, then Wind limits, then drag the pad.',
  'display-shell': 'Demo: a display shell that sometimes fails to burst. Press Run and see where unburst shells land beside the spectators.',
  'drone-power-loss': 'Demo: a camera drone losing power on its path. Press Run and see where it can come down.',
  'display-shell-burst': 'Demo: a display shell that bursts into casing pieces, sometimes low, sometimes not at all. Press Run and read Parts in Findings: every piece is a landing.',
};

/** The order of the picker: the club rocket first (the page opens with it), then by name. */
const ORDER = ['club-rocket', 'display-shell', 'display-shell-burst', 'drone-power-loss'];

export const DEMOS: readonly Demo[] = Object.entries(SCENARIO_TEXTS)
  .map(([path, text]) => {
    const fileName = fileNameOf(path);
    const id = fileName.replace(/\.json$/, '');
    // Only the curves the scenario names travel with it (and are offered for saving beside it).
    const files = Object.fromEntries(Object.entries(MOTORS).filter(([motorPath]) => text.includes(`"${motorPath}"`)));
    return { id, label: LABELS[id] ?? fileName, fileName, text, files, intro: INTROS[id] ?? 'A demo scenario: press Run to fly it.' };
  })
  .sort((a, b) => rank(a.id) - rank(b.id) || a.id.localeCompare(b.id));

function rank(id: string): number {
  const i = ORDER.indexOf(id);
  return i === -1 ? ORDER.length : i;
}

if (DEMOS.length === 0) throw new Error('no demo scenarios were bundled (scenarios/*.json)');

/** The scenario the page opens with when nothing was kept from an earlier visit. */
export const FIRST_DEMO: Demo = DEMOS[0]!;
