/**
 * Fresnel zone-plate optics: the formulas behind a flat diffractive lens patterned from a flake.
 *
 * Sources (cited beside each formula):
 * - [Attwood] D. Attwood, Soft X-Rays and Extreme Ultraviolet Radiation (Cambridge UP, 1999),
 *   ch. 9, the zone-plate sections. Relations are cited by content; equation numbers are from
 *   memory and were not checked against the book, so none is quoted.
 * - [Hecht] E. Hecht, Optics, the "Fresnel zone plate" part of the Fresnel-diffraction chapter
 *   (section number differs between editions).
 * - [Kirz] J. Kirz, "Phase zone plates for x rays and the extreme uv", J. Opt. Soc. Am. 64,
 *   301–309 (1974) — cited from memory.
 *
 * Units: wavelengths in nanometres, every other length in micrometres, as the names say. A zone
 * plate is described by `{ wavelengthNm, focalLengthUm }` (a `ZonePlateLens`) plus its number of
 * zones N. Zone n (1…N) is the ring between r_{n-1} and r_n, with r_0 = 0, so zone 1 is the
 * central disc.
 *
 * Everything here is scalar diffraction theory for a plane wave at normal incidence on a thin
 * plate. The efficiencies are ideal upper bounds: a monolayer is neither opaque nor a π phase
 * shifter (graphene absorbs about 2.3 % = πα of visible light — R. R. Nair et al., Science 320,
 * 1308 (2008), from memory), so a real monolayer lens focuses far less light than these numbers.
 */

/** What fixes the zone radii: the design wavelength and the first-order focal length. */
export interface ZonePlateLens {
  wavelengthNm: number;
  focalLengthUm: number;
}

const NM_PER_UM = 1000;
/** Zone counts above this are not checked radius by radius (see `zoneCountForAperture`). */
const UNCHECKED_ZONE_COUNT = 2 ** 50;

/** Ideal first-order efficiency of a binary amplitude plate, 1/π² ≈ 10.1 % ([Kirz]; [Attwood]). */
export const AMPLITUDE_PLATE_FIRST_ORDER_EFFICIENCY = 1 / Math.PI ** 2;

/**
 * Ideal first-order efficiency of a binary phase plate with a π step and no absorption,
 * 4/π² ≈ 40.5 % ([Kirz]; [Attwood]). Four times the amplitude plate because the reversed zones
 * add field instead of blocking it, doubling the focused amplitude ([Hecht], phase-reversal
 * zone plate).
 */
export const PHASE_PLATE_FIRST_ORDER_EFFICIENCY = 4 / Math.PI ** 2;

/** Rayleigh resolution in units of the outermost zone width: 1.22 Δr ([Attwood]; 0.61 λ/NA with NA = λ/(2Δr)). */
export const RAYLEIGH_FACTOR = 1.22;

function requirePositive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${name} must be a positive finite number, got ${value}.`);
  }
}

function requireZoneNumber(name: string, value: number, minimum: number): void {
  if (!Number.isSafeInteger(value) || value < minimum) {
    throw new RangeError(`${name} must be a whole number of at least ${minimum}, got ${value}.`);
  }
}

function requireLens(lens: ZonePlateLens): void {
  requirePositive('wavelengthNm', lens.wavelengthNm);
  requirePositive('focalLengthUm', lens.focalLengthUm);
}

const wavelengthUm = (lens: ZonePlateLens) => lens.wavelengthNm / NM_PER_UM;

/** Squared exact radius, r_n² = nλf + (nλ/2)²; zone 0 gives 0. */
function exactRadiusSquaredUm2(lens: ZonePlateLens, zone: number): number {
  const lambda = wavelengthUm(lens);
  return zone * lambda * lens.focalLengthUm + ((zone * lambda) / 2) ** 2;
}

/**
 * Outer radius of zone n, exact: r_n = √(nλf + (nλ/2)²).
 * Why: light from radius r_n must travel exactly nλ/2 further to the focus than light from the
 * centre, √(f² + r_n²) = f + nλ/2; squaring gives the formula ([Attwood], zone-plate radii).
 * `zone` 0 gives 0, the inner edge of the central disc.
 */
export function exactZoneRadiusUm(lens: ZonePlateLens, zone: number): number {
  requireLens(lens);
  requireZoneNumber('zone', zone, 0);
  return Math.sqrt(exactRadiusSquaredUm2(lens, zone));
}

/**
 * Outer radius of zone n in the thin (paraxial) approximation, r_n ≈ √(nλf), valid when
 * f ≫ nλ ([Attwood]; [Hecht] gives R_m² = m r₀ λ for plane-wave illumination, from memory).
 */
export function thinZoneRadiusUm(lens: ZonePlateLens, zone: number): number {
  requireLens(lens);
  requireZoneNumber('zone', zone, 0);
  return Math.sqrt(zone * wavelengthUm(lens) * lens.focalLengthUm);
}

/**
 * Width of zone n, r_n − r_{n−1} with exact radii. Computed as (r_n² − r_{n−1}²)/(r_n + r_{n−1})
 * = (λf + (2n−1)λ²/4)/(r_n + r_{n−1}), which is the same number without subtracting two nearly
 * equal radii when n is large.
 */
export function zoneWidthUm(lens: ZonePlateLens, zone: number): number {
  requireLens(lens);
  requireZoneNumber('zone', zone, 1);
  const lambda = wavelengthUm(lens);
  const outer = Math.sqrt(exactRadiusSquaredUm2(lens, zone));
  const inner = Math.sqrt(exactRadiusSquaredUm2(lens, zone - 1));
  return (lambda * lens.focalLengthUm + ((2 * zone - 1) * lambda ** 2) / 4) / (outer + inner);
}

/** One zone of the table, with how far the thin approximation would put its outer edge. */
export interface ZoneRadius {
  /** 1…N from the centre; zone 1 is the central disc. */
  zone: number;
  innerRadiusUm: number;
  /** Exact r_n. */
  outerRadiusUm: number;
  widthUm: number;
  /** √(nλf). */
  thinOuterRadiusUm: number;
  /**
   * exact − thin (≥ 0: the thin approximation puts every edge too far in). Computed as
   * (nλ/2)²/(r_exact + r_thin), since r_exact² − r_thin² = (nλ/2)² exactly.
   */
  thinDifferenceUm: number;
  /** (exact − thin)/exact ≈ nλ/(8f) for f ≫ nλ (expand √(1 + nλ/4f)). */
  thinRelativeDifference: number;
  /**
   * (exact − thin)/width of this zone. This is what matters for lithography: the path to the
   * focus changes by λ/2 across one zone, so an edge misplaced by half a zone width is off by
   * λ/4, Rayleigh's quarter-wave limit (from memory). A relative error that looks small can be
   * more than a whole zone width near the rim.
   */
  thinDifferenceInZoneWidths: number;
}

/** Exact and thin radii of zones 1…N with their differences ([Attwood], zone-plate radii). */
export function zoneRadii(lens: ZonePlateLens, zoneCount: number): ZoneRadius[] {
  requireLens(lens);
  requireZoneNumber('zoneCount', zoneCount, 1);
  const lambda = wavelengthUm(lens);
  const zones: ZoneRadius[] = [];
  let innerRadiusUm = 0;
  for (let zone = 1; zone <= zoneCount; zone += 1) {
    const outerRadiusUm = Math.sqrt(exactRadiusSquaredUm2(lens, zone));
    const thinOuterRadiusUm = Math.sqrt(zone * lambda * lens.focalLengthUm);
    const thinDifferenceUm = ((zone * lambda) / 2) ** 2 / (outerRadiusUm + thinOuterRadiusUm);
    const widthUm = (lambda * lens.focalLengthUm + ((2 * zone - 1) * lambda ** 2) / 4) / (outerRadiusUm + innerRadiusUm);
    zones.push({
      zone,
      innerRadiusUm,
      outerRadiusUm,
      widthUm,
      thinOuterRadiusUm,
      thinDifferenceUm,
      thinRelativeDifference: thinDifferenceUm / outerRadiusUm,
      thinDifferenceInZoneWidths: thinDifferenceUm / widthUm,
    });
    innerRadiusUm = outerRadiusUm;
  }
  return zones;
}

/**
 * Largest N with 2 r_N ≤ D (0 when not even the central disc fits).
 * From √(f² + R²) = f + Nλ/2 at R = D/2: N = 2(√(f² + R²) − f)/λ, written as
 * 2R²/((√(f² + R²) + f)λ) to avoid subtracting nearly equal numbers when f ≫ R. The floor is
 * then checked against the radii themselves so that an aperture of exactly 2 r_N holds N zones
 * despite rounding.
 */
export function zoneCountForAperture(lens: ZonePlateLens, apertureDiameterUm: number): number {
  requireLens(lens);
  requirePositive('apertureDiameterUm', apertureDiameterUm);
  const radius = apertureDiameterUm / 2;
  const f = lens.focalLengthUm;
  const estimate = (2 * radius ** 2) / ((Math.sqrt(f ** 2 + radius ** 2) + f) * wavelengthUm(lens));
  // Beyond 2^50 zones one zone is below the rounding of the estimate and the check below could
  // not step; such counts only ever meet "too many zones", so the estimate is good enough.
  if (!(estimate <= UNCHECKED_ZONE_COUNT)) return Number.isFinite(estimate) ? Math.floor(estimate) : Number.MAX_VALUE;
  let count = Math.floor(estimate);
  const fits = (zone: number) => 2 * Math.sqrt(exactRadiusSquaredUm2(lens, zone)) <= apertureDiameterUm;
  while (fits(count + 1)) count += 1;
  while (count > 0 && !fits(count)) count -= 1;
  return count;
}

/** Aperture diameter a plate of N zones needs: D = 2 r_N with the exact radius ([Attwood]). */
export function apertureDiameterForZoneCountUm(lens: ZonePlateLens, zoneCount: number): number {
  requireLens(lens);
  requireZoneNumber('zoneCount', zoneCount, 1);
  return 2 * Math.sqrt(exactRadiusSquaredUm2(lens, zoneCount));
}

/**
 * Outermost zone width Δr = r_N − r_{N−1} (exact radii). It sets resolution, NA and depth of
 * focus, and it is the finest line the lithography has to write ([Attwood]).
 * For many zones and small NA, Δr ≈ λf/(2 r_N) ([Attwood]); with exact radii the better
 * estimate is Δr ≈ λ/(2 sin θ), sin θ = r_N/√(f² + r_N²), which differs from λf/(2r_N) by the
 * factor √(1 + (r_N/f)²) — about 3 % at NA 0.24.
 */
export function outermostZoneWidthUm(lens: ZonePlateLens, zoneCount: number): number {
  return zoneWidthUm(lens, zoneCount);
}

/** The estimate Δr ≈ λf/(2 r_N) ([Attwood]; from r_n² ≈ nλf, so Δr ≈ r_N/(2N)). */
export function paraxialOutermostZoneWidthUm(lens: ZonePlateLens, zoneCount: number): number {
  requireLens(lens);
  requireZoneNumber('zoneCount', zoneCount, 1);
  return (wavelengthUm(lens) * lens.focalLengthUm) / Math.sqrt(exactRadiusSquaredUm2(lens, zoneCount)) / 2;
}

/**
 * Numerical aperture from the geometry: NA = sin(atan(r_N/f)) = r_N/√(f² + r_N²), the sine of the
 * half-angle of the cone from the rim to the focus (definition of NA in air; [Attwood]).
 */
export function numericalAperture(lens: ZonePlateLens, zoneCount: number): number {
  requireLens(lens);
  requireZoneNumber('zoneCount', zoneCount, 1);
  const rSquared = exactRadiusSquaredUm2(lens, zoneCount);
  return Math.sqrt(rSquared / (rSquared + lens.focalLengthUm ** 2));
}

/**
 * Small-angle numerical aperture NA ≈ λ/(2Δr): the outermost zones act as a grating of period
 * 2Δr that deflects the first order by sin θ = λ/(2Δr) ([Attwood], NA of a zone plate).
 * With exact radii it agrees with `numericalAperture` to about 1/(4N).
 */
export function smallAngleNumericalAperture(wavelengthNm: number, outermostZoneWidthUm: number): number {
  requirePositive('wavelengthNm', wavelengthNm);
  requirePositive('outermostZoneWidthUm', outermostZoneWidthUm);
  return wavelengthNm / NM_PER_UM / (2 * outermostZoneWidthUm);
}

/**
 * Rayleigh resolution 1.22 Δr/m in diffraction order m (first order: 1.22 Δr), i.e. 0.61 λ/NA
 * with NA = mλ/(2Δr) ([Attwood], zone-plate resolution; the 1/m for higher orders from memory).
 */
export function rayleighResolutionUm(outermostZoneWidthUm: number, order = 1): number {
  requirePositive('outermostZoneWidthUm', outermostZoneWidthUm);
  requireZoneNumber('order', order, 1);
  return (RAYLEIGH_FACTOR * outermostZoneWidthUm) / order;
}

/**
 * Depth of focus, the ± half-range about the focus: 2(Δr)²/λ ([Attwood], DOF = ±λ/(2 NA²)
 * = ±2(Δr)²/λ). The Δr form is used because Δr is what the lithography fixes; it equals the NA
 * form when NA = λ/(2Δr).
 */
export function depthOfFocusPlusMinusUm(wavelengthNm: number, outermostZoneWidthUm: number): number {
  requirePositive('wavelengthNm', wavelengthNm);
  requirePositive('outermostZoneWidthUm', outermostZoneWidthUm);
  return (2 * outermostZoneWidthUm ** 2) / (wavelengthNm / NM_PER_UM);
}

/**
 * First-order focal length at another wavelength: f(λ′) = f λ/λ′, since r_n² ≈ nλf fixes the
 * product λf ([Attwood], chromatic dispersion of zone plates; [Hecht]). Paraxial: with exact
 * radii each zone focuses λ′ at a slightly different distance.
 */
export function focalLengthAtWavelengthUm(lens: ZonePlateLens, otherWavelengthNm: number): number {
  requireLens(lens);
  requirePositive('otherWavelengthNm', otherWavelengthNm);
  return (lens.focalLengthUm * lens.wavelengthNm) / otherWavelengthNm;
}

/**
 * Focal length in diffraction order m: f/m ([Attwood]; [Hecht] lists the foci f/3, f/5, f/7…).
 * A binary plate with equal zone areas (50 % duty cycle) puts no light into even orders, so
 * only odd m are real foci (see the efficiencies below); negative orders diverge from virtual
 * foci at −f/m. Paraxial, like the chromatic scaling.
 */
export function focalLengthInOrderUm(focalLengthUm: number, order: number): number {
  requirePositive('focalLengthUm', focalLengthUm);
  requireZoneNumber('order', order, 1);
  return focalLengthUm / order;
}

/**
 * Ideal efficiency of a binary amplitude plate in order m ([Kirz]; [Attwood]):
 * 1/4 in order 0, 1/(m²π²) for odd m, 0 for even m ≠ 0 (the other half is absorbed).
 */
export function amplitudePlateEfficiency(order: number): number {
  requireZoneNumber('order', Math.abs(order), 0);
  if (order === 0) return 1 / 4;
  return order % 2 === 0 ? 0 : 1 / (order ** 2 * Math.PI ** 2);
}

/**
 * Ideal efficiency of a binary π-phase plate without absorption in order m ([Kirz]; [Attwood]):
 * 0 in order 0, 4/(m²π²) for odd m, 0 for even m ≠ 0.
 */
export function phasePlateEfficiency(order: number): number {
  requireZoneNumber('order', Math.abs(order), 0);
  if (order === 0) return 0;
  return order % 2 === 0 ? 0 : 4 / (order ** 2 * Math.PI ** 2);
}

/**
 * Widest relative bandwidth Δλ/λ the plate tolerates without blurring the focus: 1/N
 * ([Attwood], spectral bandwidth of a zone plate). A laser line is far narrower; an LED or a
 * filtered lamp may not be.
 */
export function maxRelativeBandwidth(zoneCount: number): number {
  requireZoneNumber('zoneCount', zoneCount, 1);
  return 1 / zoneCount;
}

/**
 * Most zones whose outermost zone is still at least `minFeatureUm` wide (0 if not even the
 * central disc is). Zone widths shrink monotonically outwards (Δr_n ≈ λ/(2 sin θ_n) and θ_n
 * grows with n), so a binary search over 1…`upTo` finds it.
 */
export function largestZoneCountForMinFeature(lens: ZonePlateLens, minFeatureUm: number, upTo: number): number {
  requireLens(lens);
  requirePositive('minFeatureUm', minFeatureUm);
  requireZoneNumber('upTo', upTo, 1);
  if (zoneWidthUm(lens, 1) < minFeatureUm) return 0;
  if (zoneWidthUm(lens, upTo) >= minFeatureUm) return upTo;
  // Invariant: zone `wide` is wide enough, zone `narrow` is not.
  let wide = 1;
  let narrow = upTo;
  while (narrow - wide > 1) {
    const middle = Math.floor((wide + narrow) / 2);
    if (zoneWidthUm(lens, middle) >= minFeatureUm) wide = middle;
    else narrow = middle;
  }
  return wide;
}

/** One diffraction order of a binary plate with its focus, ideal efficiencies and resolution. */
export interface DiffractionOrder {
  order: number;
  focalLengthUm: number;
  amplitudePlateEfficiency: number;
  phasePlateEfficiency: number;
  resolutionUm: number;
}

/** The real foci m = 1, 3, 5… up to `maxOrder`; even orders are left out because they vanish. */
export function diffractionOrders(lens: ZonePlateLens, outermostZoneWidthUm: number, maxOrder: number): DiffractionOrder[] {
  requireLens(lens);
  requireZoneNumber('maxOrder', maxOrder, 1);
  const orders: DiffractionOrder[] = [];
  for (let order = 1; order <= maxOrder; order += 2) {
    orders.push({
      order,
      focalLengthUm: focalLengthInOrderUm(lens.focalLengthUm, order),
      amplitudePlateEfficiency: amplitudePlateEfficiency(order),
      phasePlateEfficiency: phasePlateEfficiency(order),
      resolutionUm: rayleighResolutionUm(outermostZoneWidthUm, order),
    });
  }
  return orders;
}
