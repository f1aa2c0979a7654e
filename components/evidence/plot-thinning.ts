export interface XY {
  readonly x: number;
  readonly y: number;
}

/** Points drawn per horizontal pixel at most; denser data is thinned to each column's lowest and highest value. */
const POINTS_PER_PIXEL = 2;

/**
 * Keeps the shape of a long spectrum while drawing only a few points per pixel: in each column,
 * the lowest and the highest value, in their order along x (noise and narrow peaks both survive).
 */
export function thinForDrawing<T extends XY>(points: readonly T[], columns: number): T[] {
  if (points.length <= columns * POINTS_PER_PIXEL || columns < 1) return [...points];
  const from = points[0].x;
  const span = points[points.length - 1].x - from || 1;
  const kept: T[] = [];
  let column = -1;
  let low: T | null = null;
  let high: T | null = null;
  const flush = () => {
    if (!low || !high) return;
    if (low === high) kept.push(low);
    else if (low.x < high.x) kept.push(low, high);
    else kept.push(high, low);
  };
  for (const point of points) {
    const at = Math.min(columns - 1, Math.floor(((point.x - from) / span) * columns));
    if (at !== column) {
      flush();
      column = at;
      low = point;
      high = point;
    } else {
      if (low && point.y < low.y) low = point;
      if (high && point.y > high.y) high = point;
    }
  }
  flush();
  return kept;
}
