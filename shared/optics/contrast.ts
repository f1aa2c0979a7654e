/**
 * Optical contrast of an N-layer flake against the bare substrate beside it, at normal incidence.
 *
 * Sign convention, used everywhere in Flakeline:
 *
 *     C = (R_substrate − R_flake) / R_substrate
 *
 * so C > 0 means the flake looks darker than the bare substrate and C < 0 brighter. This is the
 * definition of Blake et al., Appl. Phys. Lett. 91, 063124 (2007): C = (I(n=1) − I(n₁)) / I(n=1),
 * the intensity without the flake (its layer replaced by air, n = 1) minus the intensity with it.
 * Some papers use the opposite sign (flake minus substrate), so a value quoted from them as
 * "negative contrast, flake darker" is positive here.
 *
 * Substrates: a thermal oxide of chosen thickness on silicon, or a semi-infinite sapphire or
 * quartz substrate. Thermal oxide is given Malitson's fused-silica index, as Blake et al. and most
 * contrast papers do (its index differs from fused silica's by well under 1 %, from memory). Light from the back surface of a transparent wafer is
 * ignored, as in a reflected-light microscope that focuses on the top surface (common practice,
 * no source).
 */
import { type Complex } from './complex';
import {
  type DatasetInfo,
  FLAKE_MATERIALS,
  type FlakeMaterialId,
  FUSED_SILICA,
  SAPPHIRE,
  SILICON,
  VISIBLE_RANGE_NM,
} from './materials';
import { type Layer, stackReflectance } from './thin-film';

export type Substrate =
  | { readonly kind: 'oxide-on-silicon'; readonly oxideThicknessNm: number }
  | { readonly kind: 'sapphire' }
  /**
   * Fused quartz / fused silica, modelled with Malitson's fused-silica formula. Crystalline
   * (z-cut) quartz has n_o ≈ 1.544 (from memory), about 6 % higher; it is not modelled separately.
   */
  | { readonly kind: 'quartz' };

/** A flake of `layers` layers of `material` lying on `substrate`. */
export interface FlakeOnSubstrate {
  readonly material: FlakeMaterialId;
  readonly layers: number;
  readonly substrate: Substrate;
}

export interface SubstrateStack {
  readonly layers: readonly Layer[];
  readonly substrateIndex: Complex;
}

/** Upper bound on layer counts accepted, far beyond where "few-layer" optics make sense. */
export const MAX_LAYERS = 100;
/** Thermal oxides thicker than this are outside what the planning and matching tools expect. */
export const MAX_OXIDE_THICKNESS_NM = 2000;

function checkSubstrate(substrate: Substrate): void {
  if (substrate.kind !== 'oxide-on-silicon') return;
  const { oxideThicknessNm } = substrate;
  if (!(oxideThicknessNm >= 0 && oxideThicknessNm <= MAX_OXIDE_THICKNESS_NM)) {
    throw new RangeError(`Oxide thickness must be 0–${MAX_OXIDE_THICKNESS_NM} nm, got ${oxideThicknessNm}`);
  }
}

function checkLayerCount(layers: number): void {
  if (!Number.isInteger(layers) || layers < 0 || layers > MAX_LAYERS) {
    throw new RangeError(`Layer count must be a whole number from 0 to ${MAX_LAYERS}, got ${layers}`);
  }
}

/** The bare substrate as thin-film layers over a semi-infinite base. */
export function substrateStack(substrate: Substrate, wavelengthNm: number): SubstrateStack {
  checkSubstrate(substrate);
  switch (substrate.kind) {
    case 'oxide-on-silicon':
      return {
        layers: [{ index: FUSED_SILICA.index(wavelengthNm), thicknessNm: substrate.oxideThicknessNm }],
        substrateIndex: SILICON.index(wavelengthNm),
      };
    case 'sapphire':
      return { layers: [], substrateIndex: SAPPHIRE.index(wavelengthNm) };
    case 'quartz':
      return { layers: [], substrateIndex: FUSED_SILICA.index(wavelengthNm) };
  }
}

/** The datasets a prediction on this substrate uses, for display beside it. */
export function substrateDatasets(substrate: Substrate): DatasetInfo[] {
  switch (substrate.kind) {
    case 'oxide-on-silicon':
      return [FUSED_SILICA.dataset, SILICON.dataset];
    case 'sapphire':
      return [SAPPHIRE.dataset];
    case 'quartz':
      return [FUSED_SILICA.dataset];
  }
}

/** An N-layer flake as one film (see `MULTILAYER_MODEL` in materials.ts). */
export function flakeFilm(material: FlakeMaterialId, layers: number, wavelengthNm: number): Layer {
  checkLayerCount(layers);
  const entry = FLAKE_MATERIALS[material];
  return { index: entry.index(wavelengthNm), thicknessNm: layers * entry.layerThicknessNm };
}

export interface ReflectancePair {
  readonly bareSubstrate: number;
  readonly withFlake: number;
}

export function reflectances(flake: FlakeOnSubstrate, wavelengthNm: number): ReflectancePair {
  const { layers, substrateIndex } = substrateStack(flake.substrate, wavelengthNm);
  const film = flakeFilm(flake.material, flake.layers, wavelengthNm);
  return {
    bareSubstrate: stackReflectance(wavelengthNm, layers, substrateIndex),
    withFlake: stackReflectance(wavelengthNm, [film, ...layers], substrateIndex),
  };
}

/** C = (R_substrate − R_flake) / R_substrate, the convention at the top of this file. */
export function contrastFromReflectances(bareSubstrate: number, withFlake: number): number {
  if (!(bareSubstrate > 0)) throw new RangeError('The bare substrate reflects nothing; contrast is undefined');
  return (bareSubstrate - withFlake) / bareSubstrate;
}

/** Contrast at one wavelength (monochromatic light or a narrow filter). */
export function contrastAt(flake: FlakeOnSubstrate, wavelengthNm: number): number {
  const pair = reflectances(flake, wavelengthNm);
  return contrastFromReflectances(pair.bareSubstrate, pair.withFlake);
}

// ---------------------------------------------------------------------------------------------
// Illumination: a single wavelength or a flat band

export type Illumination =
  | { readonly kind: 'wavelength'; readonly wavelengthNm: number }
  | { readonly kind: 'band'; readonly fromNm: number; readonly toNm: number };

export const COLOUR_CHANNELS = ['red', 'green', 'blue'] as const;
export type ColourChannel = (typeof COLOUR_CHANNELS)[number];
export type PerChannel<T> = { readonly [channel in ColourChannel]: T };

/**
 * Camera colour channels as flat bands: blue 400–500, green 500–600, red 600–700 nm. Real
 * sensor responses overlap and are peaked; flat thirds of the visible are common practice for
 * rough estimates (no source). A filter of known centre wavelength is better modelled as
 * `{ kind: 'wavelength' }`.
 */
export const RGB_BANDS: PerChannel<Illumination> = {
  red: { kind: 'band', fromNm: 600, toNm: 700 },
  green: { kind: 'band', fromNm: 500, toNm: 600 },
  blue: { kind: 'band', fromNm: 400, toNm: 500 },
};

/** Sampling step of band averages, the spacing of the generated tables. */
export const BAND_STEP_NM = 5;

/** Sample wavelengths and trapezoid weights (summing to 1) for a flat band. */
export function bandSamples(fromNm: number, toNm: number): { wavelengthsNm: number[]; weights: number[] } {
  if (!(fromNm >= VISIBLE_RANGE_NM.fromNm && toNm <= VISIBLE_RANGE_NM.toNm && fromNm <= toNm)) {
    throw new RangeError(`A band must lie within ${VISIBLE_RANGE_NM.fromNm}–${VISIBLE_RANGE_NM.toNm} nm, got ${fromNm}–${toNm}`);
  }
  if (fromNm === toNm) return { wavelengthsNm: [fromNm], weights: [1] };
  const intervals = Math.ceil((toNm - fromNm) / BAND_STEP_NM);
  const wavelengthsNm: number[] = [];
  const weights: number[] = [];
  for (let i = 0; i <= intervals; i += 1) {
    wavelengthsNm.push(fromNm + ((toNm - fromNm) * i) / intervals);
    weights.push((i === 0 || i === intervals ? 0.5 : 1) / intervals);
  }
  return { wavelengthsNm, weights };
}

/**
 * Contrast seen under an illumination. For a band, the camera integrates intensity, so the
 * reflectances (not the per-wavelength contrasts) are averaged over the band with flat weight,
 * then combined into one contrast.
 */
export function contrastUnder(flake: FlakeOnSubstrate, illumination: Illumination): number {
  if (illumination.kind === 'wavelength') return contrastAt(flake, illumination.wavelengthNm);
  const { wavelengthsNm, weights } = bandSamples(illumination.fromNm, illumination.toNm);
  let bareSubstrate = 0;
  let withFlake = 0;
  wavelengthsNm.forEach((wavelengthNm, i) => {
    const pair = reflectances(flake, wavelengthNm);
    bareSubstrate += weights[i] * pair.bareSubstrate;
    withFlake += weights[i] * pair.withFlake;
  });
  return contrastFromReflectances(bareSubstrate, withFlake);
}

/** Predicted contrast in the red, green and blue bands of `RGB_BANDS`. */
export function rgbContrast(flake: FlakeOnSubstrate): PerChannel<number> {
  return {
    red: contrastUnder(flake, RGB_BANDS.red),
    green: contrastUnder(flake, RGB_BANDS.green),
    blue: contrastUnder(flake, RGB_BANDS.blue),
  };
}

/** Evenly spaced wavelengths, both ends included. */
export function wavelengthGrid(fromNm: number, toNm: number, stepNm: number): number[] {
  if (!(stepNm > 0) || !(toNm >= fromNm)) throw new RangeError('A grid needs from ≤ to and a positive step');
  const count = Math.floor((toNm - fromNm) / stepNm + 1e-9) + 1;
  return Array.from({ length: count }, (_, i) => fromNm + i * stepNm);
}

export interface SpectrumPoint {
  readonly wavelengthNm: number;
  readonly contrast: number;
}

/** Contrast against wavelength, by default every 5 nm across 400–750 nm. */
export function contrastSpectrum(
  flake: FlakeOnSubstrate,
  wavelengthsNm: readonly number[] = wavelengthGrid(VISIBLE_RANGE_NM.fromNm, VISIBLE_RANGE_NM.toNm, BAND_STEP_NM),
): SpectrumPoint[] {
  return wavelengthsNm.map((wavelengthNm) => ({ wavelengthNm, contrast: contrastAt(flake, wavelengthNm) }));
}

/** Every dataset a prediction for this flake and substrate relies on. */
export function predictionDatasets(material: FlakeMaterialId, substrate: Substrate): DatasetInfo[] {
  return [FLAKE_MATERIALS[material].dataset, ...substrateDatasets(substrate)];
}
