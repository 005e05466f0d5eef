/**
 * risk.geojson (RFC 7946, WGS 84 lon/lat): one MultiPolygon per individual-risk level (the region
 * where the risk per flight is at or over it; its outline is the iso-risk line) and the
 * standing-distance ring as a Polygon.
 *
 * @example
 *   fs.writeFileSync('risk.geojson', writeRiskGeoJSON(analysis.risk, scenario.site.pad));
 */
import type { Feature } from 'geojson';
import { createLocalFrame } from '../analysis/geodesy.js';
import { roundGeometry, roundTo } from '../analysis/geojsonWriters.js';
import { polygonsToLonLat } from '../analysis/projectGeometry.js';
import { windPolygon, type Ring } from '../analysis/rings.js';
import type { RiskResult } from './index.js';

/** The lines and the ring as lon/lat features (also what the KML and the maps draw). */
export function riskFeatures(risk: RiskResult, pad: { lat: number; lon: number }): Feature[] {
  const frame = createLocalFrame(pad);
  const features: Feature[] = risk.lines.map((line) => ({
    type: 'Feature',
    properties: {
      kind: 'individual-risk',
      level: line.level,
      resolved: line.resolved,
      area_m2: roundTo(line.area_m2, 1),
      maxDistance_m: roundTo(line.maxDistance_m, 1),
      samplesNeeded: line.samplesNeeded,
    },
    geometry: roundGeometry({ type: 'MultiPolygon', coordinates: polygonsToLonLat(frame, line.polygons).map(windPolygon) }),
  }));
  if (risk.standingRing !== null) {
    const ring: Ring = risk.standingRing.map(([e, n]) => frame.toLonLat(e, n) as [number, number]);
    features.push({
      type: 'Feature',
      properties: { kind: 'standing-distance', level: risk.standingLevel, ...roundedOctants(risk.standingDistance_m) },
      geometry: roundGeometry({ type: 'Polygon', coordinates: [windPolygon([ring])[0]] }),
    });
  }
  return features;
}

function roundedOctants(d: RiskResult['standingDistance_m']): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [k, v] of Object.entries(d)) out[`${k}_m`] = roundTo(v, 1);
  return out;
}

export function writeRiskGeoJSON(risk: RiskResult, pad: { lat: number; lon: number }): string {
  return JSON.stringify({ type: 'FeatureCollection', features: riskFeatures(risk, pad) }) + '\n';
}
