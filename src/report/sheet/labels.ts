/**
 * Greedy label placement: labels are placed one by one in order of importance; each tries its
 * candidate positions in order of preference and takes the first whose box stays inside the map
 * and clear of everything placed before (labels and reserved boxes such as the scale bar). A
 * label that must appear and finds no clear spot takes the candidate with the least overlap.
 *
 * @example
 *   const placer = new LabelPlacer(frameBounds, measure);
 *   placer.reserve(scaleBarBox);
 *   placer.place([{ text: 'Pad', size: 8, font: 'bold' }], [{ x, y, alignX: 0, alignY: -0.5 }], { required: true });
 *   placer.shapes()  // backings and texts for the display list
 */
import type { Fill, FontName, Shape } from './display-list.js';
import type { TextMeasure } from './fonts.js';
import { CAP_HEIGHT, DESCENT } from './fonts.js';
import { INK, LABEL_BACKING } from './palette.js';
import { contains, overlapArea, overlaps, type Bounds } from './map-view.js';

export interface LabelLine {
  text: string;
  size: number;
  font: FontName;
  color?: string;
}

/**
 * Where a label may go: the box's position relative to (x, y) is given by alignX/alignY, the
 * fraction of the box's width/height to its left/above the point (0: box starts at the point,
 * 0.5: centred on it, 1: box ends at it).
 */
export interface Candidate {
  x: number;
  y: number;
  alignX: number;
  alignY: number;
  /** The labelled point when the label stands off it: a thin leader line joins them. */
  leaderFrom?: [number, number];
}

export interface PlaceOptions {
  /** Place the label even where it collides (at the least-overlapping candidate). */
  required?: boolean;
  /** The box behind the text (default: white, mostly opaque); false for none. */
  backing?: boolean | Fill;
  /** Regions this label (only) keeps clear of. */
  avoid?: Bounds[];
  id?: string;
  className?: string;
}

const PAD_X = 1.6;
const PAD_Y = 1.1;
const LEADING = 1.18;

export class LabelPlacer {
  private readonly taken: Bounds[] = [];
  private readonly out: Shape[] = [];
  /** Labels that had to be placed over something. */
  forced = 0;

  constructor(
    private readonly bounds: Bounds,
    private readonly measure: TextMeasure,
  ) {}

  /** Keeps labels off a region (map furniture, the pad symbol). */
  reserve(box: Bounds): void {
    this.taken.push(box);
  }

  /** Width and height of a label's box. */
  size(lines: LabelLine[]): { width: number; height: number } {
    const width = Math.max(...lines.map((l) => this.measure(l.text, l.size, l.font))) + 2 * PAD_X;
    const height = lines.reduce((h, l, i) => h + (i === 0 ? l.size * (CAP_HEIGHT + DESCENT) : l.size * LEADING), 0) + 2 * PAD_Y;
    return { width, height };
  }

  /** Places a label; returns its box, or null when it was left out. */
  place(lines: LabelLine[], candidates: Candidate[], options: PlaceOptions = {}): Bounds | null {
    const { width, height } = this.size(lines);
    const boxAt = (c: Candidate): Bounds => {
      const minX = c.x - c.alignX * width;
      const minY = c.y - c.alignY * height;
      return { minX, minY, maxX: minX + width, maxY: minY + height };
    };
    const obstacles = [...this.taken, ...(options.avoid ?? [])];
    let chosen: { box: Bounds; c: Candidate } | null = null;
    let fallback: { box: Bounds; c: Candidate } | null = null;
    let fallbackOverlap = Infinity;
    for (const c of candidates) {
      const box = boxAt(c);
      if (!contains(this.bounds, box)) continue;
      if (!obstacles.some((t) => overlaps(t, box))) {
        chosen = { box, c };
        break;
      }
      const clash = obstacles.reduce((sum, t) => sum + overlapArea(t, box), 0);
      if (clash < fallbackOverlap) {
        fallbackOverlap = clash;
        fallback = { box, c };
      }
    }
    if (chosen === null && options.required && fallback !== null) {
      chosen = fallback;
      this.forced++;
    }
    if (chosen === null) return null;
    this.taken.push(chosen.box);
    this.draw(lines, chosen.box, options, chosen.c.leaderFrom);
    return chosen.box;
  }

  private draw(lines: LabelLine[], box: Bounds, options: PlaceOptions, leaderFrom?: [number, number]): void {
    const shapes: Shape[] = [];
    if (leaderFrom) {
      // From the labelled point to the nearest point of the box.
      const [px, py] = leaderFrom;
      const qx = Math.min(Math.max(px, box.minX), box.maxX);
      const qy = Math.min(Math.max(py, box.minY), box.maxY);
      shapes.push({ kind: 'path', className: 'leader', d: [['M', px, py], ['L', qx, qy]], stroke: { color: INK, width: 0.6 } });
    }
    if (options.backing !== false) {
      const fill = options.backing === undefined || options.backing === true ? LABEL_BACKING : options.backing;
      shapes.push({ kind: 'rect', x: box.minX, y: box.minY, width: box.maxX - box.minX, height: box.maxY - box.minY, fill });
    }
    let y = box.minY + PAD_Y;
    lines.forEach((line, i) => {
      y += i === 0 ? line.size * CAP_HEIGHT : line.size * LEADING;
      shapes.push({ kind: 'text', x: (box.minX + box.maxX) / 2, y, text: line.text, size: line.size, font: line.font, anchor: 'middle', color: line.color ?? INK });
    });
    this.out.push({ kind: 'group', id: options.id, className: options.className ?? 'label', shapes });
  }

  /** Everything placed so far, in placing order. */
  shapes(): Shape[] {
    return this.out;
  }
}

/** The eight positions around a point (right first, then left, above, below, then diagonals). */
export function aroundPoint(x: number, y: number, gap: number): Candidate[] {
  return [
    { x: x + gap, y, alignX: 0, alignY: 0.5 },
    { x: x - gap, y, alignX: 1, alignY: 0.5 },
    { x, y: y - gap, alignX: 0.5, alignY: 1 },
    { x, y: y + gap, alignX: 0.5, alignY: 0 },
    { x: x + gap * 0.7, y: y - gap * 0.7, alignX: 0, alignY: 1 },
    { x: x - gap * 0.7, y: y - gap * 0.7, alignX: 1, alignY: 1 },
    { x: x + gap * 0.7, y: y + gap * 0.7, alignX: 0, alignY: 0 },
    { x: x - gap * 0.7, y: y + gap * 0.7, alignX: 1, alignY: 0 },
  ];
}
