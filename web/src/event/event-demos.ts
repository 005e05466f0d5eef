import type { AttachedFiles } from '../scenario/document.js';

/**
 * The demo event plans in scenarios/ (*.event.json), bundled at build time with every scenario
 * and motor curve beside them, under the names the plans write ("club-rocket.json") and the
 * scenarios write ("motors/<name>.csv"), so a demo event opens with no file access.
 */
export interface EventDemo {
  id: string;
  label: string;
  fileName: string;
  text: string;
  files: AttachedFiles;
}

const EVENT_TEXTS = import.meta.glob('../../../scenarios/*.event.json', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;
const SCENARIO_TEXTS = import.meta.glob(['../../../scenarios/*.json', '!../../../scenarios/*.event.json'], { query: '?raw', import: 'default', eager: true }) as Record<string, string>;
const MOTOR_TEXTS = import.meta.glob('../../../scenarios/motors/*.csv', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

const fileNameOf = (path: string) => path.split('/').pop()!;

const LABELS: Record<string, string> = {
  'club-day': 'Club launch day (34 flights, 3 items)',
  'bonfire-show': 'Bonfire display (200 shells, 2 calibres)',
};

const FILES: AttachedFiles = {
  ...Object.fromEntries(Object.entries(SCENARIO_TEXTS).map(([path, text]) => [fileNameOf(path), text])),
  ...Object.fromEntries(Object.entries(MOTOR_TEXTS).map(([path, text]) => [`motors/${fileNameOf(path)}`, text])),
};

export const EVENT_DEMOS: readonly EventDemo[] = Object.entries(EVENT_TEXTS)
  .map(([path, text]) => {
    const fileName = fileNameOf(path);
    const id = fileName.replace(/\.event\.json$/, '');
    return { id, label: LABELS[id] ?? fileName, fileName, text, files: FILES };
  })
  .sort((a, b) => (a.id === 'club-day' ? -1 : b.id === 'club-day' ? 1 : a.id.localeCompare(b.id)));
