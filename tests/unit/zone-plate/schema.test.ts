import { ZonePlateDesignInput } from '../../../shared/schemas/zone-plate';

// The limits and messages are Flakeline's own (common practice, no source); the first-zone and
// zone-count figures are recomputed here from the exact radii r_n = √(nλf + (nλ/2)²) (Attwood,
// Soft X-Rays and Extreme Ultraviolet Radiation, ch. 9).

const issues = (input: unknown) =>
  (ZonePlateDesignInput.safeParse(input).error?.issues ?? []).map((issue) => [issue.path.join('.'), issue.message]);

const HE_NE = { wavelengthNm: 632.8, focalLengthUm: 1000 };
const diameter = (n: number, lambdaUm = 0.6328, f = 1000) => 2 * Math.sqrt(n * lambdaUm * f + ((n * lambdaUm) / 2) ** 2);

describe('ZonePlateDesignInput', () => {
  it('accepts an aperture, fills in the lithography limit and the etched zones', () => {
    expect(ZonePlateDesignInput.parse({ ...HE_NE, apertureDiameterUm: 500 })).toEqual({
      ...HE_NE,
      apertureDiameterUm: 500,
      minFeatureNm: 100,
      etchedZones: 'odd',
    });
    expect(ZonePlateDesignInput.safeParse({ ...HE_NE, zoneCount: 97, minFeatureNm: 50, etchedZones: 'even' }).success).toBe(true);
  });

  it.each([0, -632.8])('refuses a wavelength of %p nm', (wavelengthNm) => {
    expect(issues({ wavelengthNm, focalLengthUm: 1000, apertureDiameterUm: 500 })).toEqual([
      ['wavelengthNm', 'Wavelength must be above zero.'],
    ]);
  });

  it.each([0, -1000])('refuses a focal length of %p µm', (focalLengthUm) => {
    expect(issues({ wavelengthNm: 632.8, focalLengthUm, apertureDiameterUm: 500 })).toEqual([
      ['focalLengthUm', 'Focal length must be above zero.'],
    ]);
  });

  it('reports each bad field once and skips the geometry it would need', () => {
    expect(issues({ wavelengthNm: -1, focalLengthUm: 0 })).toEqual([
      ['wavelengthNm', 'Wavelength must be above zero.'],
      ['focalLengthUm', 'Focal length must be above zero.'],
    ]);
    expect(issues({ wavelengthNm: '632.8', focalLengthUm: 1000, zoneCount: 2.5 })).toEqual([
      ['wavelengthNm', 'Wavelength must be a number of nanometres.'],
      ['zoneCount', 'The number of zones is a whole number.'],
    ]);
  });

  it('needs the aperture or the zone count', () => {
    expect(issues(HE_NE)).toEqual([['apertureDiameterUm', 'Give the aperture diameter or the number of zones.']]);
  });

  it('refuses an aperture too small for the central zone and says what it needs', () => {
    // 2 r_1 = 2√(0.6328 · 1000 + 0.3164²) = 50.315 µm.
    expect(diameter(1)).toBeCloseTo(50.315, 3);
    expect(issues({ ...HE_NE, apertureDiameterUm: 40 })).toEqual([
      ['apertureDiameterUm', 'Aperture too small for one zone: the first zone needs 50.32 µm.'],
    ]);
    expect(issues({ ...HE_NE, apertureDiameterUm: 50.32 })).toEqual([]);
  });

  it('refuses more zones than the given aperture holds', () => {
    // 2 r_120 = 556.3 µm > 500 µm, which holds 97 (see the realistic case in design.test.ts).
    expect(diameter(120)).toBeCloseTo(556.34, 2);
    expect(issues({ ...HE_NE, apertureDiameterUm: 500, zoneCount: 120 })).toEqual([
      ['zoneCount', '120 zones need an aperture of 556.3 µm; the 500 µm aperture holds 97 zones.'],
    ]);
    expect(issues({ ...HE_NE, apertureDiameterUm: 500, zoneCount: 97 })).toEqual([]);
    expect(issues({ ...HE_NE, apertureDiameterUm: 500, zoneCount: 98 })[0][0]).toBe('zoneCount');
  });

  it('refuses a zone count whose aperture would be absurd', () => {
    // 100 000 zones at f = 1 m: 2√(1e5 · 0.6328 · 1e6 + 31 640²) µm = 507.1 mm.
    expect(diameter(100_000, 0.6328, 1e6) / 1000).toBeCloseTo(507.1, 1);
    expect(issues({ wavelengthNm: 632.8, focalLengthUm: 1e6, zoneCount: 100_000 })).toEqual([
      [
        'zoneCount',
        '100000 zones need an aperture of 507.1 mm at this wavelength and focal length; Flakeline designs lenses up to 100 mm across.',
      ],
    ]);
  });

  it('refuses apertures beyond 100 mm and zone counts beyond the limit', () => {
    expect(issues({ ...HE_NE, apertureDiameterUm: 100_001 })).toEqual([
      ['apertureDiameterUm', 'The aperture can be at most 100 mm across.'],
    ]);
    expect(issues({ ...HE_NE, zoneCount: 100_001 })).toEqual([['zoneCount', 'Flakeline designs at most 100000 zones.']]);
    expect(issues({ ...HE_NE, zoneCount: 0 })).toEqual([['zoneCount', 'Use at least one zone.']]);
  });

  it('refuses an aperture that holds more zones than Flakeline designs', () => {
    // 13.5 nm, f = 1 mm, 5 mm across: N = 2R²/((√(f² + R²) + f)λ) ≈ 250 752.
    expect(issues({ wavelengthNm: 13.5, focalLengthUm: 1000, apertureDiameterUm: 5000 })).toEqual([
      [
        'apertureDiameterUm',
        'This aperture holds 250752 zones; Flakeline designs at most 100000. Give a smaller aperture or the number of zones.',
      ],
    ]);
    expect(issues({ wavelengthNm: 1e-300, focalLengthUm: 1, apertureDiameterUm: 100 })).toEqual([
      [
        'apertureDiameterUm',
        'This aperture holds over 10¹² zones; Flakeline designs at most 100000. Give a smaller aperture or the number of zones.',
      ],
    ]);
    // Giving a zone count that fits makes it a valid design again.
    expect(issues({ wavelengthNm: 13.5, focalLengthUm: 1000, apertureDiameterUm: 5000, zoneCount: 1000 })).toEqual([]);
  });

  it('refuses a non-positive lithography limit and an unknown etch choice', () => {
    expect(issues({ ...HE_NE, zoneCount: 10, minFeatureNm: 0 })).toEqual([
      ['minFeatureNm', 'The smallest feature your lithography writes must be above zero.'],
    ]);
    expect(issues({ ...HE_NE, zoneCount: 10, etchedZones: 'all' })).toEqual([
      ['etchedZones', 'Choose odd or even zones to etch.'],
    ]);
  });
});
