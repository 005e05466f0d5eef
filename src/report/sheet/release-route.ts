/**
 * A drone operation's route or area on a sheet map (the review sheet and the event sheet): the
 * `path` a released object may fail anywhere along, or the `area` it may fail anywhere over, in
 * the shared symbol set (SYMBOLS.releasePath / releaseArea), so the page's map draws the same.
 *
 * @example
 *   const route = releaseRoute(frame, scenario.launch);
 *   if (route) inside.push(...routeShapes(view, route));
 */
import type { LocalFrame } from '../../analysis/geodesy.js';
import type { Launch } from '../../scenario/types.js';
import { SYMBOLS, WORDS } from '../symbols.js';
import type { Shape } from './display-list.js';
import type { LegendEntry } from './legend.js';
import { linesPath, polygonsInMetres, polygonsPath, type Metres } from './map-layers.js';
import type { MapView } from './map-view.js';

/** The route or area in metres east/north of the frame's origin (the map's pad). */
export type ReleaseRoute = { kind: 'path'; line: Metres[] } | { kind: 'area'; polygons: Metres[][][] };

/** The launch's route or area, or null when it has neither (a rocket, a shell, a single release point). */
export function releaseRoute(frame: LocalFrame, launch: Launch): ReleaseRoute | null {
  if (launch.kind !== 'release') return null;
  if (launch.path) return { kind: 'path', line: launch.path.coordinates.map(([lon, lat]) => frame.toEastNorth(lon!, lat!) as Metres) };
  if (launch.area) return { kind: 'area', polygons: polygonsInMetres(frame, launch.area) };
  return null;
}

/** Every vertex, for framing the map around the route. */
export function routePoints(route: ReleaseRoute): Metres[] {
  return route.kind === 'path' ? route.line : route.polygons.flat(2);
}

export function routeShapes(view: MapView, route: ReleaseRoute, data: Record<string, string> = {}): Shape[] {
  if (route.kind === 'path') {
    return [{ kind: 'path', className: 'release-path', data, d: linesPath(view, [route.line]), stroke: SYMBOLS.releasePath }];
  }
  return [{ kind: 'path', className: 'release-area', data, d: polygonsPath(view, route.polygons), fill: SYMBOLS.releaseArea.fill, stroke: SYMBOLS.releaseArea.line, evenOdd: true }];
}

export function routeLegend(kind: ReleaseRoute['kind']): LegendEntry {
  return kind === 'path'
    ? { swatch: { kind: 'line', stroke: SYMBOLS.releasePath }, text: WORDS.releasePath }
    : { swatch: { kind: 'area', fill: SYMBOLS.releaseArea.fill, stroke: SYMBOLS.releaseArea.line }, text: WORDS.releaseArea };
}
