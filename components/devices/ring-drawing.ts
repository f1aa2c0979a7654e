import type { Annulus, RingPattern } from '@/shared/zone-plate';

/**
 * A ring narrower than this on screen cannot be told from its neighbours, so drawing it costs
 * time and shows nothing (common practice, no source).
 */
export const MIN_DRAWN_RING_PX = 0.75;
/** Upper bound on drawn rings whatever the size, so a phone stays responsive (common practice, no source). */
export const MAX_DRAWN_RINGS = 400;

/** The outer part of a lens whose rings are too fine to draw one by one: shown as one grey band. */
export interface FineBand {
  innerRadiusUm: number;
  outerRadiusUm: number;
  /** Zones (etched and kept) inside the band. */
  zoneCount: number;
}

export interface RingDrawing {
  /** Etched rings drawn one by one, centre outwards. */
  rings: Annulus[];
  fineBand: FineBand | null;
}

/**
 * Which etched rings of a pattern to draw at a given radius on screen. Zones narrow outwards, so
 * the inner ones are drawn one by one until they get too fine (or too many); from there to the
 * rim the lens is drawn as a band of half tone, which is what the eye sees of rings that fine.
 */
export function planRingDrawing(pattern: RingPattern, zoneCount: number, radiusPx: number): RingDrawing {
  if (pattern.lensRadiusUm <= 0 || radiusPx <= 0) return { rings: [], fineBand: null };
  const pxPerUm = radiusPx / pattern.lensRadiusUm;
  const rings: Annulus[] = [];
  for (const annulus of pattern.annuli) {
    if (annulus.widthUm * pxPerUm < MIN_DRAWN_RING_PX || rings.length >= MAX_DRAWN_RINGS) {
      // The band starts right after the last ring drawn, so the kept zone beside it is inside too.
      const last = rings[rings.length - 1];
      return {
        rings,
        fineBand: {
          innerRadiusUm: last ? last.outerRadiusUm : 0,
          outerRadiusUm: pattern.lensRadiusUm,
          zoneCount: zoneCount - (last ? last.zone : 0),
        },
      };
    }
    rings.push(annulus);
  }
  return { rings, fineBand: null };
}
