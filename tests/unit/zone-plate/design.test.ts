import { ZonePlateDesignSummary } from '../../../shared/schemas/zone-plate';
import { designZonePlate, summarizeZonePlateDesign } from '../../../shared/zone-plate/design';

// Sources: [Attwood] D. Attwood, Soft X-Rays and Extreme Ultraviolet Radiation (Cambridge UP,
// 1999), ch. 9; [Kirz] J. Kirz, J. Opt. Soc. Am. 64, 301 (1974), from memory. Expected values are
// recomputed here from the formulas, not taken from the module.

const lambdaUm = 0.6328;
const f = 1000;
const r = (n: number) => Math.sqrt(n * lambdaUm * f + ((n * lambdaUm) / 2) ** 2); // [Attwood] exact radii

// A realistic case (common practice, no source): a monolayer lens about 0.5 mm across, f = 1 mm,
// designed for the red He-Ne line (632.8 nm).
describe('a 0.5 mm monolayer lens for 632.8 nm with f = 1 mm', () => {
  const design = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: f, apertureDiameterUm: 500 });

  it('holds 97 zones', () => {
    // Largest N with 2 r_N ≤ D, counted zone by zone; by hand 2(√(1000² + 250²) − 1000)/0.6328 = 97.3.
    let n = 0;
    while (2 * r(n + 1) <= 500) n += 1;
    expect(n).toBe(97);
    expect(design.zoneCount).toBe(97);
    expect(design.lensDiameterUm).toBeCloseTo(2 * r(97), 9);
    expect(design.lensDiameterUm).toBeLessThanOrEqual(500);
    expect(design.zones).toHaveLength(97);
    expect(design.etchedZoneCount).toBe(49); // odd zones 1, 3, … 97
  });

  it('has an outermost zone of about 1.31 µm; the paraxial λf/(2 r_N) says 1.27 µm', () => {
    const deltaR = r(97) - r(96);
    expect(design.outermostZoneWidthUm).toBeCloseTo(deltaR, 9);
    expect(deltaR).toBeCloseTo(1.31, 2);
    // [Attwood] Δr ≈ λf/(2 r_N) = 1.267 µm is the small-NA estimate; at r_N/f = 0.25 the exact radii
    // give λ/(2 sin θ), larger by about √(1 + 0.25²) ≈ 1.03.
    expect(design.paraxialOutermostZoneWidthUm).toBeCloseTo((lambdaUm * f) / (2 * r(97)), 9);
    expect(design.paraxialOutermostZoneWidthUm).toBeCloseTo(1.27, 2);
    expect(deltaR / design.paraxialOutermostZoneWidthUm).toBeCloseTo(Math.sqrt(1 + (r(97) / f) ** 2), 2);
  });

  it('has NA ≈ 0.24 both from the geometry and from λ/(2Δr)', () => {
    const exact = Math.sin(Math.atan(r(97) / f)); // NA = sin(atan(r_N/f))
    expect(design.numericalAperture).toBeCloseTo(exact, 12);
    expect(exact).toBeCloseTo(0.242, 3);
    const smallAngle = lambdaUm / (2 * (r(97) - r(96))); // [Attwood] NA ≈ λ/(2Δr)
    expect(design.smallAngleNumericalAperture).toBeCloseTo(smallAngle, 9);
    expect(Math.abs(smallAngle / exact - 1)).toBeLessThan(0.01);
  });

  it('resolves 1.22 Δr ≈ 1.6 µm with a depth of focus of ±2(Δr)²/λ ≈ ±5.4 µm', () => {
    const deltaR = r(97) - r(96);
    expect(design.resolutionUm).toBeCloseTo(1.22 * deltaR, 9); // [Attwood] Rayleigh
    expect(design.resolutionUm).toBeCloseTo(1.6, 1);
    expect(design.depthOfFocusPlusMinusUm).toBeCloseTo((2 * deltaR ** 2) / lambdaUm, 9); // [Attwood]
    expect(design.depthOfFocusPlusMinusUm).toBeCloseTo(5.42, 2);
    expect(design.maxRelativeBandwidth).toBeCloseTo(1 / 97, 12); // [Attwood] Δλ/λ ≤ 1/N
  });

  it('would be misplaced by the thin approximation by under 1 % of the radius — yet over one zone width', () => {
    const thin = Math.sqrt(97 * lambdaUm * f);
    const rim = design.thinApproximationAtRim;
    expect(rim.differenceUm).toBeCloseTo(r(97) - thin, 9);
    expect(rim.relativeDifference).toBeLessThan(0.01); // small as a fraction of r_N (≈ Nλ/(8f) = 0.77 %)
    expect(rim.relativeDifference).toBeCloseTo((97 * lambdaUm) / (8 * f), 3);
    // …but ≈ 1.9 µm, more than the 1.31 µm outermost zone: a pattern from √(nλf) would be wrong
    // at the rim, which is why the table uses exact radii.
    expect(rim.differenceInZoneWidths).toBeGreaterThan(1);
    expect(rim.differenceInZoneWidths).toBeCloseTo((r(97) - thin) / (r(97) - r(96)), 9);
  });

  it('lists the odd orders with their foci and ideal efficiencies', () => {
    // [Attwood] f/m; [Kirz] 1/(m²π²) and 4/(m²π²).
    expect(design.orders.map((order) => order.order)).toEqual([1, 3, 5]);
    expect(design.orders[1].focalLengthUm).toBeCloseTo(1000 / 3, 9);
    expect(design.orders[1].amplitudePlateEfficiency).toBeCloseTo(1 / (9 * Math.PI ** 2), 12);
    expect(design.idealFirstOrderEfficiency.amplitudePlate).toBeCloseTo(0.10132, 5);
    expect(design.idealFirstOrderEfficiency.phasePlate).toBeCloseTo(0.40528, 5);
  });

  it('has nothing to warn about with 100 nm lithography', () => {
    expect(design.minFeatureNm).toBe(100);
    expect(design.etchedZones).toBe('odd');
    expect(design.warnings).toEqual([]);
  });

  it('gives the same lens when asked for 97 zones instead of a 0.5 mm aperture', () => {
    const byCount = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: f, zoneCount: 97 });
    expect(byCount.apertureDiameterUm).toBeNull();
    expect(byCount.lensDiameterUm).toBe(design.lensDiameterUm);
    expect(byCount.outermostZoneWidthUm).toBe(design.outermostZoneWidthUm);
  });

  it('uses the zone count when both are given and it fits', () => {
    const smaller = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: f, apertureDiameterUm: 500, zoneCount: 50 });
    expect(smaller.zoneCount).toBe(50);
    expect(smaller.apertureDiameterUm).toBe(500);
    expect(smaller.lensDiameterUm).toBeCloseTo(2 * r(50), 9);
  });

  it('stores as a summary the schema accepts and JSON keeps unchanged', () => {
    const summary = summarizeZonePlateDesign(design);
    expect(ZonePlateDesignSummary.parse(summary)).toEqual(summary);
    expect(JSON.parse(JSON.stringify(summary))).toEqual(summary);
    expect(summary).toMatchObject({
      kind: 'fresnel-zone-plate',
      version: 1,
      radii: 'exact',
      zoneCount: 97,
      apertureDiameterUm: 500,
      etchedZones: 'odd',
      warnings: [],
    });
    expect(summary.thinApproximationErrorAtRimUm).toBeCloseTo(r(97) - Math.sqrt(97 * lambdaUm * f), 9);
  });
});

describe('warnings', () => {
  // Extreme ultraviolet (13.5 nm), f = 1 mm, 0.5 mm aperture: Δr ≈ λf/(2 r_N) ≈ 27 nm [Attwood],
  // below the 100 nm default lithography limit.
  it('says when the outermost zone is narrower than the lithography writes, and how many zones would fit', () => {
    const design = designZonePlate({ wavelengthNm: 13.5, focalLengthUm: 1000, apertureDiameterUm: 500 });
    expect(design.outermostZoneWidthUm * 1000).toBeCloseTo(27.8, 1);
    expect(design.warnings).toHaveLength(1);
    const [warning] = design.warnings;
    expect(warning.code).toBe('zone-narrower-than-lithography');
    expect(warning.message).toMatch(/^The outermost zone is 27\.83 nm wide; your lithography writes 100 nm\./);
    // The advice names the most zones whose outermost zone is still ≥ 100 nm, found here zone by zone.
    const rr = (n: number) => Math.sqrt(n * 0.0135 * 1000 + ((n * 0.0135) / 2) ** 2);
    let writable = 1;
    while (rr(writable + 1) - rr(writable) >= 0.1) writable += 1;
    expect(warning.message).toContain(`Up to ${writable} zones`);
  });

  it('says when zones are narrower than the wavelength (scalar theory no longer reliable)', () => {
    // f = 100 µm and 0.5 mm across at 632.8 nm: NA ≈ 0.93, Δr ≈ 341 nm < λ.
    const design = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: 100, apertureDiameterUm: 500, minFeatureNm: 400 });
    expect(design.warnings.map((warning) => warning.code)).toEqual([
      'zone-narrower-than-lithography',
      'zone-narrower-than-wavelength',
    ]);
    expect(design.warnings[0].message).toMatch(/^The outermost zone is 340\.9 nm wide; your lithography writes 400 nm\./);
    expect(design.warnings[1].message).toMatch(/^The outermost zone \(340\.9 nm\) is narrower than the wavelength \(632\.8 nm\)/);
    expect(ZonePlateDesignSummary.safeParse(summarizeZonePlateDesign(design)).success).toBe(true);
  });

  it('counts the even zones when even zones are etched', () => {
    const design = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: 1000, zoneCount: 97, etchedZones: 'even' });
    expect(design.etchedZoneCount).toBe(48);
  });
});

describe('designZonePlate with input the schema would refuse', () => {
  it('throws a RangeError carrying the schema messages', () => {
    expect(() => designZonePlate({ wavelengthNm: -1, focalLengthUm: 1000, zoneCount: 3 })).toThrow(
      'wavelengthNm: Wavelength must be above zero.',
    );
    expect(() => designZonePlate({ wavelengthNm: 632.8, focalLengthUm: 1000 })).toThrow(RangeError);
    expect(() => designZonePlate({ wavelengthNm: 632.8, focalLengthUm: 1000, apertureDiameterUm: 10 })).toThrow(
      /Aperture too small for one zone/,
    );
  });
});
