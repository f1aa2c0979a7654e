/**
 * Contrast measured on a micrograph: the mean colour of a flake region against the mean colour of
 * bare substrate next to it, per channel, in the sign convention of contrast.ts:
 *
 *     C = (I_substrate − I_flake) / I_substrate      (positive = flake darker)
 *
 * Contrast is a ratio of intensities, so pixel values must be proportional to light intensity.
 * Scientific cameras saving raw or linear TIFF data are; ordinary JPEG/PNG images are
 * gamma-encoded sRGB and must be linearised first (`encoding: 'srgb'`). Using encoded values as
 * they are is common in the literature and is the default, to match how published contrasts
 * were read (common practice, no source); the UI should say which was used.
 */
import { RGB_BANDS, type PerChannel } from './contrast';
import { type ContrastMeasurement, DEFAULT_CONTRAST_UNCERTAINTY } from './layer-count';

export type PixelEncoding = 'as-recorded' | 'srgb';

export interface RegionContrastOptions {
  /** 'as-recorded' uses the pixel values as intensities; 'srgb' undoes the sRGB transfer curve. */
  readonly encoding?: PixelEncoding;
  /** Value of a full-scale pixel (255 for 8-bit images, 65535 for 16-bit); needed for 'srgb'. */
  readonly fullScale?: number;
}

/**
 * sRGB decoding to linear light, IEC 61966-2-1:1999: V/12.92 below 0.04045, otherwise
 * ((V + 0.055) / 1.055)^2.4, with V the encoded value scaled to 0–1.
 */
export function srgbToLinear(encoded: number): number {
  return encoded <= 0.04045 ? encoded / 12.92 : Math.pow((encoded + 0.055) / 1.055, 2.4);
}

function toIntensity(value: number, options: RegionContrastOptions): number {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`Pixel means must be non-negative numbers, got ${value}`);
  if ((options.encoding ?? 'as-recorded') === 'as-recorded') return value;
  const fullScale = options.fullScale ?? 255;
  if (!(fullScale > 0) || value > fullScale) throw new RangeError(`Pixel mean ${value} exceeds full scale ${fullScale}`);
  return srgbToLinear(value / fullScale);
}

function channelContrast(flake: number, substrate: number, options: RegionContrastOptions): number {
  const substrateIntensity = toIntensity(substrate, options);
  if (substrateIntensity === 0) throw new RangeError('The substrate region is black in a channel; contrast is undefined');
  return (substrateIntensity - toIntensity(flake, options)) / substrateIntensity;
}

/** Per-channel contrast of a flake region against a bare-substrate region from their mean RGB. */
export function regionContrast(
  flakeMean: PerChannel<number>,
  substrateMean: PerChannel<number>,
  options: RegionContrastOptions = {},
): PerChannel<number> {
  return {
    red: channelContrast(flakeMean.red, substrateMean.red, options),
    green: channelContrast(flakeMean.green, substrateMean.green, options),
    blue: channelContrast(flakeMean.blue, substrateMean.blue, options),
  };
}

/**
 * Turns a micrograph's per-channel contrast into measurements for `matchLayerCount`, pairing each
 * channel with its band in `RGB_BANDS`.
 */
export function channelMeasurements(
  contrast: PerChannel<number>,
  uncertainty: number = DEFAULT_CONTRAST_UNCERTAINTY,
): ContrastMeasurement[] {
  return [
    { illumination: RGB_BANDS.red, contrast: contrast.red, uncertainty },
    { illumination: RGB_BANDS.green, contrast: contrast.green, uncertainty },
    { illumination: RGB_BANDS.blue, contrast: contrast.blue, uncertainty },
  ];
}
