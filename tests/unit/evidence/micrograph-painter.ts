/**
 * Synthetic micrographs painted with predicted reflectances: each colour channel's pixel value is
 * the band-averaged reflectance of the bare substrate or of an N-layer flake on it (transfer
 * matrix of shared/optics over the RGB bands), times a camera gain, plus seeded noise.
 */
import {
  bandSamples,
  COLOUR_CHANNELS,
  type PerChannel,
  reflectances,
  RGB_BANDS,
  type Substrate,
} from '../../../shared/optics/contrast';
import { type FlakeMaterialId } from '../../../shared/optics/materials';

/** Band-averaged reflectance per channel of N layers (0 = bare substrate). */
export function bandReflectance(material: FlakeMaterialId, layers: number, substrate: Substrate): PerChannel<number> {
  const result = { red: 0, green: 0, blue: 0 };
  for (const channel of COLOUR_CHANNELS) {
    const band = RGB_BANDS[channel];
    if (band.kind !== 'band') throw new Error('RGB channels are bands');
    const { wavelengthsNm, weights } = bandSamples(band.fromNm, band.toNm);
    wavelengthsNm.forEach((wavelengthNm, i) => {
      const pair = reflectances({ material, layers: Math.max(layers, 1), substrate }, wavelengthNm);
      result[channel] += weights[i] * (layers === 0 ? pair.bareSubstrate : pair.withFlake);
    });
  }
  return result;
}

export interface Patch {
  readonly layers: number;
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface PaintSpec {
  readonly width: number;
  readonly height: number;
  readonly material: FlakeMaterialId;
  readonly substrate: Substrate;
  readonly patches: readonly Patch[];
  /** Pixel value per unit reflectance, per channel (white balance and exposure). */
  readonly gain: PerChannel<number>;
  /** Uniform noise of ± this many pixel values. */
  readonly noise: number;
  readonly seed: number;
  /** Encode the linear values with the sRGB curve, as an ordinary JPEG/PNG would. */
  readonly srgb?: boolean;
  /** Relative illumination at a pixel (1 = nominal), e.g. the fall-off towards the field's edge. */
  readonly illumination?: (x: number, y: number) => number;
}

/** Inverse of the IEC 61966-2-1 sRGB decoding: linear 0–1 to encoded 0–1. */
export function linearToSrgb(linear: number): number {
  return linear <= 0.0031308 ? 12.92 * linear : 1.055 * Math.pow(linear, 1 / 2.4) - 0.055;
}

export function paintMicrograph(spec: PaintSpec): Uint8Array {
  const rgba = new Uint8Array(spec.width * spec.height * 4);
  // xorshift32 (Marsaglia, J. Stat. Softw. 8, 2003, from memory): shifts and xors only, which stay fast
  // inside Jest's sandbox where the Math.imul of the shared seeded generator does not.
  let state = spec.seed >>> 0 || 1;
  const random = () => {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    return (state >>> 0) / 4294967296;
  };
  const colours = new Map<number, number[]>();
  const colourOf = (layers: number) => {
    let colour = colours.get(layers);
    if (!colour) {
      const reflectance = bandReflectance(spec.material, layers, spec.substrate);
      colour = COLOUR_CHANNELS.map((channel) => {
        const linear = reflectance[channel] * spec.gain[channel];
        return spec.srgb ? 255 * linearToSrgb(linear / 255) : linear;
      });
      colours.set(layers, colour);
    }
    return colour;
  };
  const layerMap = new Uint8Array(spec.width * spec.height);
  for (const patch of spec.patches) {
    for (let y = patch.y; y < patch.y + patch.height; y += 1)
      layerMap.fill(patch.layers, y * spec.width + patch.x, y * spec.width + patch.x + patch.width);
  }
  // Plain arithmetic rather than Math calls per pixel: global lookups are slow inside Jest's sandbox.
  const clampByte = (value: number) => (value <= 0 ? 0 : value >= 255 ? 255 : (value + 0.5) | 0);
  for (let i = 0; i < layerMap.length; i += 1) {
    const colour = colourOf(layerMap[i]);
    const light = spec.illumination ? spec.illumination(i % spec.width, (i / spec.width) | 0) : 1;
    for (let c = 0; c < 3; c += 1)
      rgba[4 * i + c] = clampByte(light * colour[c] + (spec.noise ? spec.noise * (2 * random() - 1) : 0));
    rgba[4 * i + 3] = 255;
  }
  return rgba;
}
