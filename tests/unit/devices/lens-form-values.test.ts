import {
  EMPTY_LENS_FORM,
  lensFormFromInput,
  parseLensForm,
  type LensFormValues,
} from '../../../components/devices/lens-form-values';

// 1 mm = 1000 µm (SI prefixes). The realistic case: a lens about half a millimetre across with a
// focal length of about a millimetre for red light (common practice, no source).
const form = (patch: Partial<LensFormValues>): LensFormValues => ({ ...EMPTY_LENS_FORM, ...patch });

describe('reading the lens designer form', () => {
  it('converts millimetres to the micrometres the design uses and sends only the chosen sizing', () => {
    const result = parseLensForm(
      form({ wavelengthNm: '632.8', focalLength: '1', focalUnit: 'mm', aperture: '0.5', apertureUnit: 'mm', zoneCount: '40' }),
      120,
    );
    expect(result).toEqual({
      ok: true,
      input: { wavelengthNm: 632.8, focalLengthUm: 1000, apertureDiameterUm: 500, minFeatureNm: 120, etchedZones: 'odd' },
    });
  });

  it('reads micrometres as typed, a decimal comma, and a zone count when sizing by zones', () => {
    const result = parseLensForm(
      form({ wavelengthNm: '633', focalLength: '2500,5', focalUnit: 'um', sizeBy: 'zones', zoneCount: '97' }),
    );
    expect(result.ok && result.input).toMatchObject({ focalLengthUm: 2500.5, zoneCount: 97 });
    expect(result.ok && result.input.apertureDiameterUm).toBeUndefined();
  });

  it('says blank when nothing is typed, and asks for the missing inputs', () => {
    const result = parseLensForm(EMPTY_LENS_FORM);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.blank).toBe(true);
    expect(result.errors.wavelengthNm).toEqual(['Give the design wavelength.']);
    expect(result.errors.focalLength).toEqual(['Give the focal length.']);
  });

  it('names text that is not a number without a second, unit-bound message', () => {
    const result = parseLensForm(form({ wavelengthNm: 'red', focalLength: '1', aperture: '0.5' }));
    expect(!result.ok && result.errors.wavelengthNm).toEqual(['Type the wavelength as a number of nanometres, e.g. 632.8.']);
  });

  it('puts the schema’s impossible-design messages on the fields that show them', () => {
    const zero = parseLensForm(form({ wavelengthNm: '0', focalLength: '1', aperture: '0.5' }));
    expect(!zero.ok && zero.errors.wavelengthNm).toEqual(['Wavelength must be above zero.']);
    // r₁ = √(λf + λ²/4) ≈ 25.2 µm for 632.8 nm and 1 mm, so a 40 µm aperture holds no zone.
    const tiny = parseLensForm(form({ wavelengthNm: '632.8', focalLength: '1', aperture: '40', apertureUnit: 'um' }));
    expect(!tiny.ok && tiny.errors.aperture?.[0]).toMatch(
      /^Aperture too small for one zone: the first zone needs 50\.3\d* µm\.$/,
    );
    const fraction = parseLensForm(form({ wavelengthNm: '632.8', focalLength: '1', sizeBy: 'zones', zoneCount: '12.5' }));
    expect(!fraction.ok && fraction.errors.zoneCount).toEqual(['The number of zones is a whole number.']);
  });

  it('moves "give the aperture or the zone count" to the zone field when sizing by zones', () => {
    const result = parseLensForm(form({ wavelengthNm: '632.8', focalLength: '1', sizeBy: 'zones' }));
    expect(!result.ok && result.errors.zoneCount).toEqual(['Give the aperture diameter or the number of zones.']);
    expect(!result.ok && result.errors.aperture).toBeUndefined();
  });

  it('fills the form back from a stored design in the unit a person would type', () => {
    const values = lensFormFromInput({
      wavelengthNm: 632.8,
      focalLengthUm: 1000,
      apertureDiameterUm: 500,
      zoneCount: null,
      etchedZones: 'even',
    });
    expect(values).toMatchObject({
      focalLength: '1',
      focalUnit: 'mm',
      aperture: '500',
      apertureUnit: 'um',
      sizeBy: 'aperture',
      etchedZones: 'even',
    });
    const parsed = parseLensForm(values);
    expect(parsed.ok && parsed.input).toMatchObject({ focalLengthUm: 1000, apertureDiameterUm: 500 });
    expect(lensFormFromInput({ wavelengthNm: 532, focalLengthUm: 800, apertureDiameterUm: null, zoneCount: 60 })).toMatchObject({
      sizeBy: 'zones',
      zoneCount: '60',
    });
  });
});
