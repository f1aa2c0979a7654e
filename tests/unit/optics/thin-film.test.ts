import {
  abs,
  add,
  type Complex,
  complex,
  div,
  exp,
  isClose,
  mul,
  ONE,
  refractiveIndex,
  scale,
  sub,
} from '../../../shared/optics/complex';
import { SILICON } from '../../../shared/optics/materials';
import {
  airySingleFilm,
  interfaceReflection,
  type Layer,
  stackReflectance,
  stackResponse,
} from '../../../shared/optics/thin-film';
import { seededRandom, uniform } from './seeded-random';

const AIR = complex(1);

describe('bare substrate (no layers)', () => {
  // Normal-incidence Fresnel reflectance R = ((n−1)² + k²)/((n+1)² + k²) (Born & Wolf ch. 1.5;
  // Hecht, Optics) evaluated with Green's tabulated silicon constants at 630 nm, n = 3.879,
  // k = 0.016444 (Green, Sol. Energy Mater. Sol. Cells 92, 1305, 2008; computed from published inputs).
  it('matches the Fresnel formula for silicon with Green 2008 constants', () => {
    const n = 3.879;
    const k = 0.016444;
    const expected = ((n - 1) ** 2 + k ** 2) / ((n + 1) ** 2 + k ** 2);
    expect(stackReflectance(630, [], refractiveIndex(n, k))).toBeCloseTo(expected, 14);
    expect(stackReflectance(630, [], SILICON.index(630))).toBeCloseTo(expected, 14);
  });

  // Same formula at the He-Ne line with Green's constants: R ≈ 0.35 (computed from published inputs).
  it('gives R ≈ 0.35 for bare silicon at 633 nm', () => {
    expect(stackReflectance(633, [], SILICON.index(633))).toBeCloseTo(0.348, 3);
  });

  it('is the same as the Fresnel amplitude coefficient, including its phase', () => {
    const si = SILICON.index(500);
    expect(isClose(stackResponse(500, [], si).r, interfaceReflection(AIR, si), 1e-15)).toBe(true);
  });
});

function randomIndex(random: () => number, lossy: boolean): Complex {
  return refractiveIndex(uniform(random, 1.2, 5), lossy ? uniform(random, 0, 3) : 0);
}

describe('characteristic matrix against the Airy single-film formula', () => {
  // The Airy sum r = (r01 + r12 e^{−2iδ}) / (1 + r01 r12 e^{−2iδ}) (Born & Wolf ch. 1.6; Hecht,
  // Optics) is derived independently of the matrix method; both must give the same complex r.
  it.each([
    ['lossless films on lossless substrates', false, 101],
    ['absorbing films on absorbing substrates', true, 202],
  ])('agrees to 1e-12 for 500 random %s', (_label, lossy, seed) => {
    const random = seededRandom(seed);
    for (let trial = 0; trial < 500; trial += 1) {
      const wavelengthNm = uniform(random, 300, 1000);
      const film: Layer = { index: randomIndex(random, lossy), thicknessNm: uniform(random, 0, 500) };
      const substrate = randomIndex(random, lossy);
      const fromMatrix = stackResponse(wavelengthNm, [film], substrate).r;
      const fromAiry = airySingleFilm(wavelengthNm, film, substrate);
      expect(abs(sub(fromMatrix, fromAiry))).toBeLessThan(1e-12);
    }
  });

  // Two layers by nesting the Airy formula: the lower film and substrate act as one interface of
  // reflection coefficient r' seen from inside the upper film (Born & Wolf ch. 1.6; Hecht, Optics).
  it('agrees with nested Airy formulas for random two-layer stacks', () => {
    const random = seededRandom(303);
    for (let trial = 0; trial < 300; trial += 1) {
      const wavelengthNm = uniform(random, 400, 750);
      const top: Layer = { index: randomIndex(random, true), thicknessNm: uniform(random, 0, 20) };
      const middle: Layer = { index: randomIndex(random, false), thicknessNm: uniform(random, 0, 400) };
      const substrate = randomIndex(random, true);
      const lower = airySingleFilm(wavelengthNm, middle, substrate, top.index);
      const r01 = interfaceReflection(AIR, top.index);
      // e^{−2iδ} with the complex phase thickness δ = 2πNd/λ of the top film
      const delta = scale(top.index, (2 * Math.PI * top.thicknessNm) / wavelengthNm);
      const lowerDelayed = mul(lower, exp(mul(complex(0, -2), delta)));
      const nested = div(add(r01, lowerDelayed), add(ONE, mul(r01, lowerDelayed)));
      const fromMatrix = stackResponse(wavelengthNm, [top, middle], substrate).r;
      expect(abs(sub(fromMatrix, nested))).toBeLessThan(1e-12);
    }
  });
});

describe('energy conservation', () => {
  // With no absorption anywhere, reflected plus transmitted power is all the incident power
  // (Born & Wolf ch. 1.6; Macleod, Thin-Film Optical Filters ch. 2).
  it('gives R + T = 1 for random lossless stacks on lossless substrates', () => {
    const random = seededRandom(404);
    for (let trial = 0; trial < 300; trial += 1) {
      const layers: Layer[] = Array.from({ length: 1 + Math.floor(random() * 4) }, () => ({
        index: randomIndex(random, false),
        thicknessNm: uniform(random, 0, 300),
      }));
      const response = stackResponse(uniform(random, 400, 750), layers, randomIndex(random, false));
      expect(response.reflectance).toBeLessThanOrEqual(1);
      expect(response.reflectance + response.transmittance).toBeCloseTo(1, 12);
    }
  });

  // Power that enters an absorbing substrate is lost there, not in lossless layers above it.
  it('gives R + T = 1 for a lossless oxide on absorbing silicon, and R + T < 1 once the film absorbs', () => {
    const oxide: Layer = { index: complex(1.46), thicknessNm: 285 };
    const si = SILICON.index(550);
    const clean = stackResponse(550, [oxide], si);
    expect(clean.reflectance + clean.transmittance).toBeCloseTo(1, 12);
    const graphene: Layer = { index: refractiveIndex(2.6, 1.3), thicknessNm: 0.34 };
    const covered = stackResponse(550, [graphene, oxide], si);
    expect(covered.reflectance + covered.transmittance).toBeLessThan(1);
  });

  // A quarter-wave film of index √(n_s) cancels the reflection of a substrate of index n_s at its
  // design wavelength: the textbook anti-reflection condition (Hecht, Optics, ch. 9).
  it('makes a quarter-wave film with n_f = √n_s reflect nothing', () => {
    for (const substrateIndex of [1.52, 2.0, 3.5]) {
      const filmIndex = Math.sqrt(substrateIndex);
      const wavelengthNm = 550;
      const film: Layer = { index: complex(filmIndex), thicknessNm: wavelengthNm / (4 * filmIndex) };
      expect(stackReflectance(wavelengthNm, [film], complex(substrateIndex))).toBeLessThan(1e-28);
      // Away from the design wavelength the cancellation is imperfect.
      expect(stackReflectance(450, [film], complex(substrateIndex))).toBeGreaterThan(1e-5);
    }
  });

  // A half-wave lossless layer is an "absent layer": it leaves the reflectance of what lies
  // beneath unchanged at its design wavelength (Macleod, Thin-Film Optical Filters, from memory; Hecht).
  it('treats half-wave and zero-thickness layers as absent', () => {
    const si = SILICON.index(600);
    const bare = stackReflectance(600, [], si);
    const halfWave: Layer = { index: complex(1.46), thicknessNm: 600 / (2 * 1.46) };
    expect(stackReflectance(600, [halfWave], si)).toBeCloseTo(bare, 12);
    expect(stackReflectance(600, [{ index: refractiveIndex(4, 2), thicknessNm: 0 }], si)).toBeCloseTo(bare, 14);
  });
});

describe('input checks', () => {
  it('refuses non-physical wavelengths, thicknesses and absorbing ambients', () => {
    const si = SILICON.index(600);
    expect(() => stackReflectance(0, [], si)).toThrow(RangeError);
    expect(() => stackReflectance(Number.NaN, [], si)).toThrow(RangeError);
    expect(() => stackReflectance(600, [{ index: complex(1.5), thicknessNm: -1 }], si)).toThrow(RangeError);
    expect(() => stackReflectance(600, [], si, refractiveIndex(1.3, 0.1))).toThrow(RangeError);
  });
});
