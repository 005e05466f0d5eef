import type { EnvelopeResult } from './envelope.js';
import { escapeXml } from '../analysis/kml.js';

export interface ChartOptions {
  units: 'metric' | 'imperial';
  caution: string;
}

const MPH = 0.44704;

/**
 * envelope.svg: a polar chart of the wind limits. Direction is where the wind blows from, north
 * up and clockwise as on a compass; the distance from the centre is the mean wind speed. The shaded
 * shape holds the winds this vehicle can fly in on this field; the forecast wind is the marked dot.
 * Shapes differ by outline and fill pattern as well as by colour, so the chart reads in greyscale.
 */
export function envelopeChart(e: EnvelopeResult, options: ChartOptions): string {
  const imperial = options.units === 'imperial';
  const unit = imperial ? 'mph' : 'm/s';
  const toUnit = (v: number) => (imperial ? v / MPH : v);
  const W = 640;
  const H = 800;
  const cx = W / 2;
  const cy = 392;
  const R = 250;
  const top = Math.max(toUnit(e.speeds[e.speeds.length - 1]), toUnit(e.forecast.speed), 1);
  const ringStep = niceStep(top / 5);
  const rMax = Math.ceil(top / ringStep) * ringStep;
  const radius = (v: number) => (toUnit(v) / rMax) * R;
  const point = (from: number, v: number): [number, number] => {
    const a = (from * Math.PI) / 180;
    const r = radius(v);
    return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
  };
  const f = (x: number) => x.toFixed(1);
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="Helvetica, Arial, sans-serif">`);
  out.push(`<defs><pattern id="hatch" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><rect width="8" height="8" fill="#dce9f2"/><line x1="0" y1="0" x2="0" y2="8" stroke="#7ea6c4" stroke-width="2"/></pattern></defs>`);
  out.push(`<rect width="${W}" height="${H}" fill="#ffffff"/>`);
  out.push(`<text x="${cx}" y="34" text-anchor="middle" font-size="18" font-weight="bold">${escapeXml('Wind limits: ' + e.name)}</text>`);
  wrap(`Highest mean wind (${unit}, at the reference height) at which the keep-out zone stays inside the site and clear of protected areas`, 90).forEach((line, i) =>
    out.push(`<text x="${cx}" y="${56 + i * 15}" text-anchor="middle" font-size="12" fill="#333">${escapeXml(line)}</text>`),
  );
  // Speed rings and their labels.
  for (let v = ringStep; v <= rMax + 1e-9; v += ringStep) {
    const r = (v / rMax) * R;
    out.push(`<circle class="ring" cx="${cx}" cy="${cy}" r="${f(r)}" fill="none" stroke="#9a9a9a" stroke-width="0.8" stroke-dasharray="2 3"/>`);
  }
  // Spokes at the grid directions, compass labels outside.
  for (const d of e.directions) {
    const [x, y] = pointAt(cx, cy, d, R);
    out.push(`<line x1="${cx}" y1="${cy}" x2="${f(x)}" y2="${f(y)}" stroke="#c8c8c8" stroke-width="0.6"/>`);
    const [lx, ly] = pointAt(cx, cy, d, R + 22);
    out.push(`<text x="${f(lx)}" y="${f(ly + 4)}" text-anchor="middle" font-size="11" fill="#222">${compass(d)}</text>`);
  }
  // The envelope: limit speed by direction.
  const pts = e.limits.map((d) => point(d.from, d.limit ?? 0));
  out.push(`<polygon id="envelope" points="${pts.map(([x, y]) => `${f(x)},${f(y)}`).join(' ')}" fill="url(#hatch)" fill-opacity="0.85" stroke="#1f4e79" stroke-width="2.5" stroke-linejoin="round"/>`);
  for (const d of e.limits) {
    const [x, y] = point(d.from, d.limit ?? 0);
    if (d.aboveGrid) out.push(`<path class="above-grid" d="M${f(x - 5)},${f(y)} L${f(x)},${f(y - 6)} L${f(x + 5)},${f(y)} Z" fill="#1f4e79"/>`);
    else out.push(`<circle class="limit" cx="${f(x)}" cy="${f(y)}" r="3" fill="#1f4e79"/>`);
  }
  // Ring labels above the envelope, with a white halo so they read on the hatching.
  for (let v = ringStep; v <= rMax + 1e-9; v += ringStep) {
    const r = (v / rMax) * R;
    out.push(`<text x="${f(cx + 4)}" y="${f(cy - r - 3)}" font-size="10" fill="#333" stroke="#ffffff" stroke-width="3" paint-order="stroke">${formatNumber(v)} ${unit}</text>`);
  }
  // Forecast wind.
  const [fx, fy] = point(e.forecast.from, e.forecast.speed);
  out.push(`<g id="forecast"><circle cx="${f(fx)}" cy="${f(fy)}" r="7" fill="#ffffff" stroke="#b3541e" stroke-width="3"/><circle cx="${f(fx)}" cy="${f(fy)}" r="2.5" fill="#b3541e"/></g>`);
  // Legend.
  const ly = 700;
  out.push(`<rect x="40" y="${ly - 12}" width="22" height="14" fill="url(#hatch)" stroke="#1f4e79" stroke-width="2"/>`);
  out.push(`<text x="70" y="${ly}" font-size="12">winds that pass every test</text>`);
  out.push(`<circle cx="51" cy="${ly + 17}" r="6" fill="#ffffff" stroke="#b3541e" stroke-width="3"/>`);
  const verdict = forecastVerdict(e, (v) => `${toUnit(v).toFixed(1)} ${unit}`);
  out.push(`<text x="70" y="${ly + 21}" font-size="12">${escapeXml(`forecast: ${formatNumber(toUnit(e.forecast.speed))} ${unit} from ${Math.round(e.forecast.from)}°`)}</text>`);
  out.push(`<text id="verdict" x="${cx}" y="100" text-anchor="middle" font-size="13" font-weight="bold" fill="${verdict.inside ? '#1f4e79' : '#8a2f0a'}">${escapeXml(verdict.text)}</text>`);
  out.push(`<path d="M330,${ly} L335,${ly - 6} L340,${ly} Z" fill="#1f4e79"/><text x="348" y="${ly}" font-size="12">passes up to the top of the grid</text>`);
  out.push(`<text x="330" y="${ly + 21}" font-size="12">${escapeXml(`${e.samples.toLocaleString('en')} samples per point, seed ${e.seed}, ${e.method}`)}</text>`);
  // Caution, wrapped.
  wrap(options.caution, 100).forEach((line, i) => out.push(`<text x="${cx}" y="${752 + i * 13}" text-anchor="middle" font-size="10" fill="#333">${escapeXml(line)}</text>`));
  out.push('</svg>');
  return out.join('\n') + '\n';
}

/**
 * Whether the forecast wind lies inside the envelope, with the limit read at the forecast direction
 * by linear interpolation between the two nearest grid directions.
 */
export function forecastVerdict(
  e: EnvelopeResult,
  speedText: (metresPerSecond: number) => string = (v) => `${v.toFixed(1)} m/s`,
): { inside: boolean; limit: number | null; text: string } {
  const limit = limitAt(e, e.forecast.from);
  if (limit === null) return { inside: false, limit, text: 'Forecast direction lies outside the grid of directions' };
  const inside = e.forecast.speed <= limit + 1e-9;
  const text = inside
    ? `Forecast ${speedText(e.forecast.speed)} from ${Math.round(e.forecast.from)}° is inside the limits (about ${speedText(limit)} from there)`
    : `Forecast ${speedText(e.forecast.speed)} from ${Math.round(e.forecast.from)}° is OUTSIDE the limits (about ${speedText(limit)} from there)`;
  return { inside, limit, text };
}

/** Limit speed at any direction, interpolated between grid directions (wrapping round the compass). */
export function limitAt(e: EnvelopeResult, from: number): number | null {
  const ds = e.limits.map((d) => ({ from: d.from, limit: d.limit ?? 0 }));
  if (ds.length === 0) return null;
  if (ds.length === 1) return ds[0].limit;
  const x = ((from % 360) + 360) % 360;
  const full = ds[ds.length - 1].from - ds[0].from + (ds[1].from - ds[0].from) >= 360 - 1e-9;
  for (let i = 0; i < ds.length; i++) {
    const a = ds[i];
    const b = ds[(i + 1) % ds.length];
    const span = i + 1 < ds.length ? b.from - a.from : full ? b.from + 360 - a.from : NaN;
    if (!(span > 0)) continue;
    const t = (((x - a.from) % 360) + 360) % 360;
    if (t <= span + 1e-9) return a.limit + (t / span) * (b.limit - a.limit);
  }
  return null;
}

function pointAt(cx: number, cy: number, from: number, r: number): [number, number] {
  const a = (from * Math.PI) / 180;
  return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
}

const NAMES = ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'];

function compass(deg: number): string {
  const d = ((deg % 360) + 360) % 360;
  const k = d / 22.5;
  return Math.abs(k - Math.round(k)) < 1e-9 ? `${NAMES[Math.round(k) % 16]} ${Math.round(d)}°` : `${Math.round(d)}°`;
}

function niceStep(x: number): number {
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 2.5 ? 2.5 : m <= 5 ? 5 : 10) * p;
}

function formatNumber(v: number): string {
  return Math.abs(v - Math.round(v)) < 1e-9 ? String(Math.round(v)) : v.toFixed(1);
}

function wrap(text: string, width: number): string[] {
  const words = text.split(/\s+/);
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if ((line + ' ' + w).trim().length > width) {
      lines.push(line);
      line = w;
    } else line = (line + ' ' + w).trim();
  }
  if (line) lines.push(line);
  return lines;
}
