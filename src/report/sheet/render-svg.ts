/**
 * A display-list page as a standalone SVG document (page size in points, so it prints at the same
 * scale as the PDF). Shapes keep their ids and classes; numbers are written to 0.01 pt.
 *
 * @example
 *   writeFileSync('map.svg', renderSvg(mapPage, 'Harrowmere club day'));
 */
import type { Fill, PathCommand, Shape, Stroke, Tagged, Page, MarkersShape } from './display-list.js';
import { markerOutline } from './display-list.js';
import { SVG_FONTS } from './fonts.js';
import { xmlCharacters } from '../../scenario/safe-text.js';

function n(x: number): string {
  const r = Math.round(x * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

export function escapeXml(text: string): string {
  return xmlCharacters(text).replace(/[<>&"']/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', '"': '&quot;', "'": '&apos;' })[c]!);
}

function pathData(d: PathCommand[]): string {
  return d.map((c) => (c[0] === 'Z' ? 'Z' : `${c[0]}${n(c[1])} ${n(c[2])}`)).join('');
}

function tagAttributes(t: Tagged): string {
  let out = '';
  if (t.id) out += ` id="${escapeXml(t.id)}"`;
  if (t.className) out += ` class="${escapeXml(t.className)}"`;
  for (const [key, value] of Object.entries(t.data ?? {})) out += ` data-${key}="${escapeXml(value)}"`;
  return out;
}

function paint(stroke?: Stroke, fill?: Fill): string {
  let out = fill ? ` fill="${fill.color}"` : ' fill="none"';
  if (fill?.opacity !== undefined && fill.opacity < 1) out += ` fill-opacity="${n(fill.opacity)}"`;
  if (stroke) {
    out += ` stroke="${stroke.color}" stroke-width="${n(stroke.width)}"`;
    if (stroke.dash) out += ` stroke-dasharray="${stroke.dash.map(n).join(' ')}"`;
    if (stroke.opacity !== undefined && stroke.opacity < 1) out += ` stroke-opacity="${n(stroke.opacity)}"`;
    if (stroke.cap) out += ` stroke-linecap="${stroke.cap}"`;
    if (stroke.join) out += ` stroke-linejoin="${stroke.join}"`;
  }
  return out;
}

function markersData(m: MarkersShape): string {
  let d = '';
  const s = m.size;
  for (let i = 0; i < m.points.length; i += 2) {
    const x = m.points[i];
    const y = m.points[i + 1];
    d += m.symbol === 'dot' ? `M${n(x - s)} ${n(y)}a${n(s)} ${n(s)} 0 1 0 ${n(2 * s)} 0a${n(s)} ${n(s)} 0 1 0 ${n(-2 * s)} 0Z` : pathData(markerOutline(m.symbol, x, y, s));
  }
  return d;
}

function shapeSvg(shape: Shape, clipIds: { next: number }, out: string[], indent: string): void {
  switch (shape.kind) {
    case 'path':
      out.push(`${indent}<path${tagAttributes(shape)} d="${pathData(shape.d)}"${paint(shape.stroke, shape.fill)}${shape.evenOdd ? ' fill-rule="evenodd"' : ''}/>`);
      return;
    case 'circle':
      out.push(`${indent}<circle${tagAttributes(shape)} cx="${n(shape.cx)}" cy="${n(shape.cy)}" r="${n(shape.r)}"${paint(shape.stroke, shape.fill)}/>`);
      return;
    case 'rect':
      out.push(`${indent}<rect${tagAttributes(shape)} x="${n(shape.x)}" y="${n(shape.y)}" width="${n(shape.width)}" height="${n(shape.height)}"${paint(shape.stroke, shape.fill)}/>`);
      return;
    case 'text': {
      const font = SVG_FONTS[shape.font];
      const anchor = shape.anchor === 'start' ? '' : ` text-anchor="${shape.anchor}"`;
      const style = `${font.weight ? ` font-weight="${font.weight}"` : ''}${font.style ? ` font-style="${font.style}"` : ''}`;
      out.push(`${indent}<text${tagAttributes(shape)} x="${n(shape.x)}" y="${n(shape.y)}" font-family="${escapeXml(font.family)}" font-size="${n(shape.size)}"${style}${anchor} fill="${shape.color}">${escapeXml(shape.text)}</text>`);
      return;
    }
    case 'markers': {
      const filled = shape.symbol !== 'cross';
      const colour = filled
        ? ` fill="${shape.color}" stroke="none"${shape.opacity !== undefined ? ` fill-opacity="${n(shape.opacity)}"` : ''}`
        : ` fill="none" stroke="${shape.color}" stroke-width="${n(Math.max(0.5, shape.size * 0.45))}"${shape.opacity !== undefined ? ` stroke-opacity="${n(shape.opacity)}"` : ''}`;
      out.push(`${indent}<path${tagAttributes(shape)} d="${markersData(shape)}"${colour}/>`);
      return;
    }
    case 'clip': {
      const id = `clip${clipIds.next++}`;
      out.push(`${indent}<clipPath id="${id}"><rect x="${n(shape.x)}" y="${n(shape.y)}" width="${n(shape.width)}" height="${n(shape.height)}"/></clipPath>`);
      out.push(`${indent}<g${tagAttributes(shape)} clip-path="url(#${id})">`);
      for (const s of shape.shapes) shapeSvg(s, clipIds, out, indent + '  ');
      out.push(`${indent}</g>`);
      return;
    }
    case 'group':
      out.push(`${indent}<g${tagAttributes(shape)}>`);
      for (const s of shape.shapes) shapeSvg(s, clipIds, out, indent + '  ');
      out.push(`${indent}</g>`);
      return;
  }
}

/** The page as SVG text; `title` becomes the document's <title>. */
export function renderSvg(page: Page, title: string): string {
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    // Spaces in labels are kept as written, as in the PDF.
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" xml:space="preserve" width="${n(page.width)}pt" height="${n(page.height)}pt" viewBox="0 0 ${n(page.width)} ${n(page.height)}">`,
    `  <title>${escapeXml(title)}</title>`,
    `  <rect x="0" y="0" width="${n(page.width)}" height="${n(page.height)}" fill="#ffffff"/>`,
  ];
  const clipIds = { next: 1 };
  for (const shape of page.shapes) shapeSvg(shape, clipIds, out, '  ');
  out.push('</svg>', '');
  return out.join('\n');
}
