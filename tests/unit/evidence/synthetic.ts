/**
 * Synthetic measurements with known answers: spectra built from chosen Lorentzians on a sloped,
 * curved background with seeded Gaussian noise, and AFM profiles built from chosen terraces.
 */
import { seededRandom } from '../optics/seeded-random';

export interface TruePeak {
  readonly centre: number;
  readonly fwhm: number;
  readonly height: number;
}

/** Standard normal numbers from a seeded uniform generator (Box–Muller transform). */
export function gaussianNoise(seed: number): () => number {
  const random = seededRandom(seed);
  return () => {
    const u = Math.max(random(), 1e-12);
    const v = random();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}

export function evenGrid(from: number, to: number, count: number): number[] {
  return Array.from({ length: count }, (_, i) => from + ((to - from) * i) / (count - 1));
}

export interface SpectrumSpec {
  readonly from: number;
  readonly to: number;
  readonly points: number;
  readonly peaks: readonly TruePeak[];
  readonly noise: number;
  readonly seed: number;
  /** Background a + b·t + c·t², t running 0…1 across the range. */
  readonly background?: readonly [number, number, number];
}

export function syntheticSpectrum(spec: SpectrumSpec): { x: number[]; y: number[] } {
  const x = evenGrid(spec.from, spec.to, spec.points);
  const noise = gaussianNoise(spec.seed);
  const [a, b, c] = spec.background ?? [200, 150, -80];
  const y = x.map((value) => {
    const t = (value - spec.from) / (spec.to - spec.from);
    let signal = a + b * t + c * t * t;
    for (const peak of spec.peaks) {
      const u = (2 * (value - peak.centre)) / peak.fwhm;
      signal += peak.height / (1 + u * u);
    }
    return signal + spec.noise * noise();
  });
  return { x, y };
}
