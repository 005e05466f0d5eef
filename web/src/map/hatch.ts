/**
 * The keep-out zone's fill: diagonal hatching, so the zone reads as "no entry" without colour.
 * Made here as pixels (an image, not a file), so the style still needs nothing from outside.
 */
export function hatchImage(color: string, size = 12, lineWidth = 2): { width: number; height: number; data: Uint8Array } {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(color.slice(i, i + 2), 16)) as [number, number, number];
  const data = new Uint8Array(size * size * 4);
  for (let y = 0; y < size; y++) {
    for (let x = 0; x < size; x++) {
      // Lines run from bottom-left to top-right and wrap at the tile edge, so tiles join seamlessly.
      const on = (x + y) % size < lineWidth;
      const k = (y * size + x) * 4;
      data[k] = r;
      data[k + 1] = g;
      data[k + 2] = b;
      data[k + 3] = on ? 255 : 0;
    }
  }
  return { width: size, height: size, data };
}
