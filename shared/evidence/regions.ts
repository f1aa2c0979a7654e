/**
 * Regions marked on a micrograph, in image pixels with the origin at the top-left corner: a
 * dragged box, or tapped points each covering a disc. A pixel belongs to a region when its centre
 * (x + ½, y + ½) lies inside the box or within `radiusPx` of a tapped point. Everything is clamped
 * to the image; overlapping discs count each pixel once.
 */
import { type Region } from '../schemas/evidence-analysis';

export type { Region };

/** Pixel rectangle, x0 ≤ x < x1 and y0 ≤ y < y1. */
export interface PixelRect {
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
}

/** First pixel whose centre is at or after `edge`. */
const firstFrom = (edge: number) => Math.ceil(edge - 0.5);

function clampRect(rect: PixelRect, width: number, height: number): PixelRect | null {
  const x0 = Math.max(0, rect.x0);
  const y0 = Math.max(0, rect.y0);
  const x1 = Math.min(width, rect.x1);
  const y1 = Math.min(height, rect.y1);
  return x1 > x0 && y1 > y0 ? { x0, y0, x1, y1 } : null;
}

function discRect(point: { x: number; y: number }, radius: number): PixelRect {
  return {
    x0: firstFrom(point.x - radius),
    y0: firstFrom(point.y - radius),
    x1: Math.floor(point.x + radius - 0.5) + 1,
    y1: Math.floor(point.y + radius - 0.5) + 1,
  };
}

/** The smallest pixel rectangle holding the region inside the image, or null when it misses the image. */
export function regionBounds(region: Region, width: number, height: number): PixelRect | null {
  if (region.shape === 'box') {
    return clampRect(
      {
        x0: firstFrom(region.x),
        y0: firstFrom(region.y),
        x1: firstFrom(region.x + region.width),
        y1: firstFrom(region.y + region.height),
      },
      width,
      height,
    );
  }
  const rects = region.points.map((point) => discRect(point, region.radiusPx));
  return clampRect(
    {
      x0: Math.min(...rects.map((rect) => rect.x0)),
      y0: Math.min(...rects.map((rect) => rect.y0)),
      x1: Math.max(...rects.map((rect) => rect.x1)),
      y1: Math.max(...rects.map((rect) => rect.y1)),
    },
    width,
    height,
  );
}

/** Calls `visit` once for every pixel of the region inside the image, row by row; returns how many. */
export function forEachRegionPixel(region: Region, width: number, height: number, visit: (x: number, y: number) => void): number {
  const bounds = regionBounds(region, width, height);
  if (!bounds) return 0;
  const { x0, y0, x1, y1 } = bounds;
  if (region.shape === 'box') {
    for (let y = y0; y < y1; y += 1) for (let x = x0; x < x1; x += 1) visit(x, y);
    return (x1 - x0) * (y1 - y0);
  }
  // Mark the discs on a bitmap of the bounds first so overlapping discs count a pixel once.
  const boundsWidth = x1 - x0;
  const marked = new Uint8Array(boundsWidth * (y1 - y0));
  const radius2 = region.radiusPx * region.radiusPx;
  for (const point of region.points) {
    const disc = clampRect(discRect(point, region.radiusPx), width, height);
    if (!disc) continue;
    for (let y = disc.y0; y < disc.y1; y += 1) {
      const dy = y + 0.5 - point.y;
      for (let x = disc.x0; x < disc.x1; x += 1) {
        const dx = x + 0.5 - point.x;
        if (dx * dx + dy * dy <= radius2) marked[(y - y0) * boundsWidth + (x - x0)] = 1;
      }
    }
  }
  let count = 0;
  for (let y = y0; y < y1; y += 1) {
    for (let x = x0; x < x1; x += 1) {
      if (marked[(y - y0) * boundsWidth + (x - x0)]) {
        visit(x, y);
        count += 1;
      }
    }
  }
  return count;
}

export function regionPixelCount(region: Region, width: number, height: number): number {
  return forEachRegionPixel(region, width, height, () => undefined);
}

/** True when some pixel belongs to both regions. */
export function regionsOverlap(a: Region, b: Region, width: number, height: number): boolean {
  const boundsA = regionBounds(a, width, height);
  const boundsB = regionBounds(b, width, height);
  if (!boundsA || !boundsB) return false;
  const overlap = clampRect(
    {
      x0: Math.max(boundsA.x0, boundsB.x0),
      y0: Math.max(boundsA.y0, boundsB.y0),
      x1: Math.min(boundsA.x1, boundsB.x1),
      y1: Math.min(boundsA.y1, boundsB.y1),
    },
    width,
    height,
  );
  if (!overlap) return false;
  const overlapWidth = overlap.x1 - overlap.x0;
  const inA = new Uint8Array(overlapWidth * (overlap.y1 - overlap.y0));
  const index = (x: number, y: number) => (y - overlap.y0) * overlapWidth + (x - overlap.x0);
  const inside = (x: number, y: number) => x >= overlap.x0 && x < overlap.x1 && y >= overlap.y0 && y < overlap.y1;
  forEachRegionPixel(a, width, height, (x, y) => {
    if (inside(x, y)) inA[index(x, y)] = 1;
  });
  let shared = false;
  forEachRegionPixel(b, width, height, (x, y) => {
    if (inside(x, y) && inA[index(x, y)]) shared = true;
  });
  return shared;
}
