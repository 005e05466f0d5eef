/**
 * Every file of an event's results folder, by name: per item the usual results in its own
 * sub-folder (items/NN-name/), and for the event event.json, event-zones.geojson (each item's
 * keep-out zone and their union), event-risk.geojson (individual-risk lines over the event),
 * event-areas.csv, event-sheet.pdf and event-map.svg. Used by the command line and the page.
 */
import { buildResultFiles, type FileContent } from '../report/result-files.js';
import { CAUTION } from '../report/caution.js';
import { csvCell } from './csv.js';
import type { EventTotals, ItemOutcome } from './combine.js';
import type { EventPlan } from './event-file.js';
import { buildEventSheet } from './event-sheet.js';

export interface EventSummary {
  strewnEvent: 1;
  name: string;
  version: string;
  computedAt: string;
  flights: number;
  items: (EventTotals['items'][number] & { scenarioHash: string; seed: string })[];
  areas: EventTotals['areas'];
  total: EventTotals['total'];
  zone: { area_m2: number | null; maxDistance_m: number | null };
  individualRisk: { max: number; lines: { level: number; area_m2: number }[] };
  harmModel: string | null;
  caution: string;
}

export function eventSummary(plan: EventPlan, totals: EventTotals, version: string, computedAt: string): EventSummary {
  return {
    strewnEvent: 1,
    name: plan.name,
    version,
    computedAt,
    flights: totals.flights,
    items: totals.items.map((row, i) => ({ ...row, scenarioHash: plan.items[i].hash, seed: plan.items[i].scenario.run.seed })),
    areas: totals.areas,
    total: totals.total,
    zone: { area_m2: totals.unionArea_m2, maxDistance_m: totals.unionReach_m },
    individualRisk: { max: totals.individualRisk.max, lines: totals.individualRisk.lines.map((l) => ({ level: l.level, area_m2: l.area_m2 })) },
    harmModel: totals.harmModel,
    caution: CAUTION,
  };
}

export function buildEventFiles(plan: EventPlan, outcomes: ItemOutcome[], totals: EventTotals, version: string, computedAt: Date): [string, FileContent][] {
  const files: [string, FileContent][] = [];
  const iso = computedAt.toISOString().replace(/\.\d{3}Z$/, 'Z');
  const summary = eventSummary(plan, totals, version, iso);
  files.push(['event.json', JSON.stringify(summary, null, 2) + '\n']);
  const zoneFeatures = [
    ...totals.zones.map((z) => ({ type: 'Feature', properties: { kind: 'item keep-out zone', item: z.name }, geometry: z.zone.geometry })),
    ...(totals.union ? [{ type: 'Feature', properties: { kind: 'event keep-out zone', area_m2: totals.unionArea_m2, maxDistance_m: totals.unionReach_m }, geometry: totals.union.geometry }] : []),
  ];
  files.push(['event-zones.geojson', JSON.stringify({ type: 'FeatureCollection', features: zoneFeatures }) + '\n']);
  files.push([
    'event-risk.geojson',
    JSON.stringify({
      type: 'FeatureCollection',
      features: totals.individualRisk.lines.map((l) => ({ type: 'Feature', properties: { individualRiskPerEvent: l.level, area_m2: l.area_m2 }, geometry: l.geometry })),
    }) + '\n',
  ]);
  const csv = ['area,kind,people,expected_landings,chance_of_any_landing,expected_casualties'];
  for (const a of totals.areas) {
    csv.push([csvCell(a.name), a.kind, a.people ?? '', a.expectedLandings, a.chanceOfAnyLanding, a.expectedCasualties ?? ''].join(','));
  }
  files.push(['event-areas.csv', csv.join('\n') + '\n']);
  const sheet = buildEventSheet({ totals, site: plan.site, pads: plan.items.map((it) => it.scenario.site.pad), launches: plan.items.map((it) => it.scenario.launch), computedAt: iso, version });
  files.push(['event-sheet.pdf', sheet.pdf], ['event-map.svg', sheet.svg]);
  outcomes.forEach((o, i) => {
    const folder = totals.items[i].folder;
    for (const [name, content] of buildResultFiles(o.item.scenario, o.set, o.analysis, o.summary, { computedAt })) files.push([`${folder}/${name}`, content]);
  });
  return files;
}
