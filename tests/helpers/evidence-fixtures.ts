import { Jimp } from 'jimp';
import { PNG } from 'pngjs';
import { type FlakeOnSubstrate, rgbContrast } from '../../shared/optics/contrast';
import type { Agent } from './session-agent';

/**
 * Files for evidence tests, made in code: micrographs of an invented chip and spectra whose true
 * peaks are known. Nothing here is a real measurement.
 */

export interface Rgb {
  red: number;
  green: number;
  blue: number;
}

/** A small deterministic pseudo-random generator (mulberry32), so "noise" is the same on every run. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface Patch {
  x: number;
  y: number;
  width: number;
  height: number;
  colour: Rgb;
}

/** RGBA pixels: bare substrate everywhere, patches painted over it, ±`noise` counts of uniform noise. */
export function paintMicrograph(props: {
  width: number;
  height: number;
  substrate: Rgb;
  patches?: Patch[];
  noise?: number;
  seed?: number;
}) {
  const { width, height, substrate } = props;
  const random = seededRandom(props.seed ?? 7);
  const noise = props.noise ?? 0;
  const rgba = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y += 1) {
    for (let x = 0; x < width; x += 1) {
      const patch = props.patches?.find((p) => x >= p.x && x < p.x + p.width && y >= p.y && y < p.y + p.height);
      const colour = patch?.colour ?? substrate;
      const i = (y * width + x) * 4;
      rgba[i] = clamp(colour.red + (random() * 2 - 1) * noise);
      rgba[i + 1] = clamp(colour.green + (random() * 2 - 1) * noise);
      rgba[i + 2] = clamp(colour.blue + (random() * 2 - 1) * noise);
      rgba[i + 3] = 255;
    }
  }
  return { rgba, width, height };
}

const clamp = (value: number) => Math.max(0, Math.min(255, Math.round(value)));

/**
 * The colour a flake of `flake` shows over `substrate` pixels when pixel values are read as
 * intensities: I_flake = I_substrate × (1 − C) per channel, C from Flakeline's own prediction.
 * (The physics is checked against published values in tests/unit; here it only makes a picture.)
 */
export function flakeColour(substrate: Rgb, flake: FlakeOnSubstrate): Rgb {
  const contrast = rgbContrast(flake);
  return {
    red: substrate.red * (1 - contrast.red),
    green: substrate.green * (1 - contrast.green),
    blue: substrate.blue * (1 - contrast.blue),
  };
}

export function encodePng(image: { rgba: Buffer; width: number; height: number }): Buffer {
  const png = new PNG({ width: image.width, height: image.height });
  image.rgba.copy(png.data);
  return PNG.sync.write(png);
}

export async function encodeWithJimp(
  image: { rgba: Buffer; width: number; height: number },
  mime: 'image/jpeg' | 'image/tiff',
): Promise<Buffer> {
  const jimp = new Jimp({ width: image.width, height: image.height, color: 0 });
  image.rgba.copy(jimp.bitmap.data);
  return mime === 'image/jpeg' ? jimp.getBuffer('image/jpeg', { quality: 95 }) : jimp.getBuffer('image/tiff');
}

/** CRC-32 of PNG chunks (ISO 3309 polynomial, as the PNG specification §5.5 requires). */
function crc32(data: Buffer): number {
  let crc = 0xffffffff;
  for (const byte of data) {
    crc ^= byte;
    for (let k = 0; k < 8; k += 1) crc = crc & 1 ? (crc >>> 1) ^ 0xedb88320 : crc >>> 1;
  }
  return (crc ^ 0xffffffff) >>> 0;
}

function pngChunk(type: string, body: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(body.length);
  const typed = Buffer.concat([Buffer.from(type, 'ascii'), body]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typed));
  return Buffer.concat([length, typed, crc]);
}

/**
 * A PNG whose header claims `width` × `height` pixels but whose data is a few bytes: well-formed
 * enough for a header reader, and a trap for anything that would allocate the pixels first.
 */
export function craftedPngHeader(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', ihdr),
    pngChunk('IDAT', Buffer.from([0x78, 0x9c, 0x03, 0x00, 0x00, 0x00, 0x00, 0x01])),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

export interface PeakSpec {
  centre: number;
  fwhm: number;
  height: number;
}

/** Lorentzian peaks on a sloping baseline with deterministic noise, as "x,y" lines with a header. */
export function spectrumCsv(props: {
  from: number;
  to: number;
  points: number;
  peaks: PeakSpec[];
  baseline?: (x: number) => number;
  noise?: number;
  seed?: number;
  header?: string;
}): string {
  const random = seededRandom(props.seed ?? 11);
  const lines = [props.header ?? 'shift_cm-1,intensity'];
  for (let i = 0; i < props.points; i += 1) {
    const x = props.from + ((props.to - props.from) * i) / (props.points - 1);
    let y = props.baseline?.(x) ?? 0;
    for (const peak of props.peaks) y += peak.height / (1 + ((2 * (x - peak.centre)) / peak.fwhm) ** 2);
    y += ((random() + random() + random() - 1.5) / 1.5) * (props.noise ?? 0);
    lines.push(`${x.toFixed(3)},${y.toFixed(3)}`);
  }
  return `${lines.join('\n')}\n`;
}

/**
 * A monolayer-MoS2-like Raman spectrum: E¹2g at 385.0 and A1g at 403.5 cm⁻¹, 18.5 cm⁻¹ apart,
 * inside the 18–19 cm⁻¹ Lee et al. (ACS Nano 4, 2695, 2010) report for one layer.
 */
export const MONOLAYER_MOS2_RAMAN = () =>
  spectrumCsv({
    from: 300,
    to: 480,
    points: 600,
    peaks: [
      { centre: 385.0, fwhm: 3.5, height: 800 },
      { centre: 403.5, fwhm: 4.5, height: 1000 },
    ],
    baseline: (x) => 120 + 0.2 * (x - 300),
    noise: 8,
  });

/** Uploads a file as evidence through the API, like the app's upload form. */
export function upload(
  agent: Agent,
  csrfToken: string,
  path: string,
  file: { data: Buffer | string; name: string; contentType?: string },
  kind: string,
  metadata: object = {},
) {
  return agent
    .post(path)
    .set('x-csrf-token', csrfToken)
    .field('kind', kind)
    .field('metadata', JSON.stringify(metadata))
    .attach('file', Buffer.isBuffer(file.data) ? file.data : Buffer.from(file.data, 'utf8'), {
      filename: file.name,
      contentType: file.contentType ?? 'application/octet-stream',
    });
}
