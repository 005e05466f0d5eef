import type { Feature, FeatureCollection, Geometry, Point } from 'geojson';
import type { EventTotals } from '../../../src/event/combine.js';
import type { EventPlan } from '../../../src/event/event-file.js';
import type { CompareSide } from '../../../src/compare/compare.js';
import type { Launch, Site } from '../../../src/scenario/types.js';
import { WORDS } from '../../../src/report/symbols.js';
import { percent, smallRate } from '../../../src/report/sheet/units.js';
import { EMPTY_COLLECTION, ringCentre } from './features.js';

/**
 * GeoJSON for what the page draws over the scenario's own layers: a drone operation's route or
 * area, an event (its site, each item's keep-out zone, their union, individual-risk lines, pads)
 * and two zones of a comparison. Pure: data in, features out; overlay.ts gives them to the map.
 */

type Props = Record<string, string | number | boolean>;

function fc(features: Feature<Geometry, Props>[]): FeatureCollection {
  return features.length === 0 ? EMPTY_COLLECTION : { type: 'FeatureCollection', features };
}

/** The route (`path`) or area of a release, or nothing for any other launch. */
export function routeFeatures(launches: readonly { launch: Launch; item?: string }[]): FeatureCollection {
  const out: Feature<Geometry, Props>[] = [];
  for (const { launch, item } of launches) {
    if (launch.kind !== 'release') continue;
    const props: Props = item === undefined ? {} : { item };
    if (launch.path) out.push({ type: 'Feature', geometry: launch.path as Geometry, properties: { ...props, kind: 'release-path' } });
    else if (launch.area) out.push({ type: 'Feature', geometry: launch.area as Geometry, properties: { ...props, kind: 'release-area' } });
  }
  return fc(out);
}

/** The event's site: its boundary and marked areas (kind drives the look, as for a scenario). */
export function eventSiteFeatures(site: Site): FeatureCollection {
  const out: Feature<Geometry, Props>[] = [];
  if (site.boundary) out.push({ type: 'Feature', geometry: site.boundary as Geometry, properties: { kind: 'boundary' } });
  site.areas.forEach((a, i) => out.push({ type: 'Feature', geometry: a.geometry as Geometry, properties: { kind: 'area', areaKind: a.kind, name: a.name, index: i } }));
  return fc(out);
}

/** One label per area: its name and, after a run, expected landings and chance of any landing over the event. */
export function eventAreaLabels(site: Site, totals: EventTotals | null): FeatureCollection {
  const out: Feature<Point, Props>[] = site.areas.map((a) => {
    const row = totals?.areas.find((r) => r.name === a.name);
    const ring = a.geometry.coordinates[0]!;
    // No landing among the samples is said in words: "0 %" would read as "cannot happen".
    const figures = !row ? '' : row.expectedLandings === 0 ? '\nno landing in the samples' : `\n${smallRate(row.expectedLandings)} landings expected · any ${percent(row.chanceOfAnyLanding)}${row.expectedCasualties !== undefined ? `\ncasualties ${smallRate(row.expectedCasualties)}` : ''}`;
    return { type: 'Feature', geometry: { type: 'Point', coordinates: ringCentre(ring) }, properties: { label: `${a.name}${figures}` } };
  });
  return fc(out);
}

/** Each item's zone (index for its line style), the union, the risk lines (index, highest first). */
export function eventResultFeatures(totals: EventTotals, site: Site): { zones: FeatureCollection; risk: FeatureCollection; labels: FeatureCollection } {
  const zones: Feature<Geometry, Props>[] = [];
  if (totals.union) zones.push({ type: 'Feature', geometry: totals.union.geometry, properties: { kind: 'union', label: WORDS.eventUnion } });
  totals.zones.forEach((z, i) => zones.push({ type: 'Feature', geometry: z.zone.geometry, properties: { kind: 'item', index: i, item: z.name } }));
  const risk = totals.individualRisk.lines.map((l, k) => ({ type: 'Feature' as const, geometry: l.geometry as Geometry, properties: { kind: 'event-risk', index: k, level: l.level } as Props }));
  const labels: Feature<Point, Props>[] = [];
  if (totals.union) {
    // Under the zone's southern or over its northern extreme, whichever lies farther from the
    // marked areas, so the zone's name does not hide an area's figures (centred on the point, it
    // is not cut off at the map's side as a label beside an east or west extreme can be).
    const polys = totals.union.geometry.type === 'Polygon' ? [totals.union.geometry.coordinates] : totals.union.geometry.coordinates;
    const outer = polys.flatMap((p) => p[0]!);
    const pick = (better: (a: number[], b: number[]) => boolean) => outer.reduce((best, v) => (better(v, best) ? v : best), outer[0]!);
    const extremes: { at: number[]; anchor: string }[] = [
      { at: pick((a, b) => a[1]! < b[1]!), anchor: 'top' },
      { at: pick((a, b) => a[1]! > b[1]!), anchor: 'bottom' },
    ];
    const centres = site.areas.map((a) => ringCentre(a.geometry.coordinates[0]!));
    const cosLat = Math.cos((site.pad.lat * Math.PI) / 180);
    const clearance = (p: number[]) => Math.min(Infinity, ...centres.map((c) => Math.hypot((c[0]! - p[0]!) * cosLat, c[1]! - p[1]!)));
    const best = extremes.reduce((b, e) => (clearance(e.at) > clearance(b.at) ? e : b), extremes[0]!);
    labels.push({ type: 'Feature', geometry: { type: 'Point', coordinates: best.at }, properties: { label: WORDS.eventUnion, anchor: best.anchor } });
  }
  return { zones: fc(zones), risk: fc(risk), labels: fc(labels) };
}

/** Every pad of the event (items may fly from other pads on the site), once each. */
export function eventPadFeatures(plan: EventPlan): FeatureCollection {
  const seen = new Set<string>();
  const out: Feature<Point, Props>[] = [];
  for (const pad of [plan.site.pad, ...plan.items.map((it) => it.scenario.site.pad)]) {
    const key = `${pad.lon},${pad.lat}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push({ type: 'Feature', geometry: { type: 'Point', coordinates: [pad.lon, pad.lat] }, properties: {} });
  }
  return fc(out);
}

/** The two zones of a comparison: A the saved run, B the current one (either may be missing). */
export function compareFeatures(saved: CompareSide | null, current: CompareSide | null): FeatureCollection {
  const out: Feature<Geometry, Props>[] = [];
  const a = saved?.keepOut?.features[0];
  const b = current?.keepOut?.features[0];
  if (a) out.push({ type: 'Feature', geometry: a.geometry, properties: { side: 'a' } });
  if (b) out.push({ type: 'Feature', geometry: b.geometry, properties: { side: 'b' } });
  return fc(out);
}
