import type { Region } from '@/shared/schemas/evidence-analysis';

/** A position on the shown micrograph, in display pixels from its top-left corner. */
export interface Point {
  x: number;
  y: number;
}

/** A box in image pixels from two corners in display pixels, clamped to the image and rounded to whole pixels. */
export function boxFromDrag(start: Point, end: Point, scale: number, widthPx: number, heightPx: number): Region | null {
  const clampX = (value: number) => Math.min(widthPx, Math.max(0, Math.round(value / scale)));
  const clampY = (value: number) => Math.min(heightPx, Math.max(0, Math.round(value / scale)));
  const x0 = clampX(Math.min(start.x, end.x));
  const x1 = clampX(Math.max(start.x, end.x));
  const y0 = clampY(Math.min(start.y, end.y));
  const y1 = clampY(Math.max(start.y, end.y));
  if (x1 - x0 < 1 || y1 - y0 < 1) return null;
  return { shape: 'box', x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}
