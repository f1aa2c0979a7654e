/**
 * Bounds and defaults for zone-plate designs. None of these is physics: they keep the numbers a
 * lab types inside what e-beam lithography on a flake can make and what a phone can draw.
 */

/**
 * Smallest line a typical shared e-beam tool plus plasma etch writes reliably in a 2D flake
 * (common practice, no source). Labs override it with their own process's value.
 */
export const DEFAULT_MIN_FEATURE_NM = 100;

/** Largest lens Flakeline designs: 100 mm, beyond any e-beam write field or flake (common practice, no source). */
export const MAX_APERTURE_DIAMETER_UM = 100_000;

/**
 * Most zones in one design. The radii table grows with N and the ring preview draws N/2 rings;
 * e-beam zone plates rarely exceed a few thousand zones (common practice, no source).
 */
export const MAX_ZONE_COUNT = 100_000;

/** Sanity bound on the wavelength: 1 mm, the far-infrared/terahertz edge (common practice, no source). */
export const MAX_WAVELENGTH_NM = 1_000_000;

/** Sanity bound on the focal length: 1 m (common practice, no source). */
export const MAX_FOCAL_LENGTH_UM = 1_000_000;

/** Sanity bound on the lithography limit: 100 µm, far coarser than any e-beam process (common practice, no source). */
export const MAX_MIN_FEATURE_NM = 100_000;

/**
 * Which zones the lithography writes (and the etch removes). Zones are numbered from the centre,
 * zone 1 being the central disc. For a binary plate either choice focuses the same way and with
 * the same efficiency; only the sign of the focused field differs (Hecht, Optics, Fresnel
 * zone-plate section, from memory: blocking the odd or the even zones gives the same focus).
 * Odd is the default (common practice, no source): the central disc is etched away and the
 * flake keeps the even rings.
 */
export const ETCHED_ZONE_CHOICES = ['odd', 'even'] as const;
export type EtchedZones = (typeof ETCHED_ZONE_CHOICES)[number];
export const DEFAULT_ETCHED_ZONES: EtchedZones = 'odd';
