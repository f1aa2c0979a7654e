import { imageSize } from 'image-size';
import type { EvidenceKind, StoredMediaType } from '../../shared/schemas/evidence';
import { EVIDENCE_KIND_LABELS, IMAGE_MAX_PIXELS, SPECTRUM_MAX_BYTES } from '../../shared/schemas/evidence';
import { fileTypeMismatch, imageCorrupt, imageTooLarge, invalid, payloadTooLarge } from '../errors';

type ImageMediaType = Extract<StoredMediaType, `image/${string}`>;
type TextMediaType = Extract<StoredMediaType, `text/${string}`>;

/** What a file turned out to be from its bytes, whatever its name or the browser said. */
export type SniffedFile =
  | { family: 'image'; mediaType: ImageMediaType; widthPx: number; heightPx: number; orientation?: number }
  | { family: 'text'; mediaType: TextMediaType; text: string };

const IMAGE_NAMES: Record<ImageMediaType, string> = { 'image/jpeg': 'JPEG', 'image/png': 'PNG', 'image/tiff': 'TIFF' };

/** File signatures (magic numbers) of the formats Flakeline stores, from each format's specification. */
const SIGNATURES: { mediaType: ImageMediaType; bytes: number[] }[] = [
  { mediaType: 'image/jpeg', bytes: [0xff, 0xd8, 0xff] }, // JPEG SOI marker + next marker
  { mediaType: 'image/png', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] }, // PNG spec §5.2
  { mediaType: 'image/tiff', bytes: [0x49, 0x49, 0x2a, 0x00] }, // TIFF 6.0, little-endian "II*\0"
  { mediaType: 'image/tiff', bytes: [0x4d, 0x4d, 0x00, 0x2a] }, // TIFF 6.0, big-endian "MM\0*"
];

/** What a file name's extension claims. Unknown extensions claim nothing. */
const EXTENSION_CLAIMS: Record<string, { family: 'image' | 'text'; name: string; mediaType?: ImageMediaType }> = {
  jpg: { family: 'image', name: 'JPEG', mediaType: 'image/jpeg' },
  jpeg: { family: 'image', name: 'JPEG', mediaType: 'image/jpeg' },
  jpe: { family: 'image', name: 'JPEG', mediaType: 'image/jpeg' },
  png: { family: 'image', name: 'PNG', mediaType: 'image/png' },
  tif: { family: 'image', name: 'TIFF', mediaType: 'image/tiff' },
  tiff: { family: 'image', name: 'TIFF', mediaType: 'image/tiff' },
  gif: { family: 'image', name: 'GIF' },
  bmp: { family: 'image', name: 'BMP' },
  webp: { family: 'image', name: 'WebP' },
  heic: { family: 'image', name: 'HEIC' },
  csv: { family: 'text', name: 'CSV text' },
  tsv: { family: 'text', name: 'tab-separated text' },
  txt: { family: 'text', name: 'text' },
  dat: { family: 'text', name: 'text data' },
  asc: { family: 'text', name: 'text data' },
  xy: { family: 'text', name: 'text data' },
};

const extensionOf = (name: string | undefined) => /\.([A-Za-z0-9]{1,8})$/.exec(name ?? '')?.[1].toLowerCase();

/**
 * Text Flakeline reads: UTF-8 (a byte-order mark allowed) or UTF-16 with its byte-order mark, as
 * some instrument software writes, with no control characters besides tab, line feed and
 * carriage return. Binary files fail this within their first bytes.
 */
export function decodeStrictText(data: Buffer): string | null {
  let text: string;
  try {
    if (data[0] === 0xff && data[1] === 0xfe) text = new TextDecoder('utf-16le', { fatal: true }).decode(data.subarray(2));
    else if (data[0] === 0xfe && data[1] === 0xff) text = new TextDecoder('utf-16be', { fatal: true }).decode(data.subarray(2));
    else text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(data);
  } catch {
    return null;
  }
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused
  return /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(text) ? null : text;
}

function signatureOf(data: Buffer): ImageMediaType | null {
  const match = SIGNATURES.find(({ bytes }) => bytes.every((byte, i) => data[i] === byte));
  return match?.mediaType ?? null;
}

/** A refusal naming the image format when image-size recognises one Flakeline does not store. */
function notOurImage(data: Buffer) {
  let other: string | undefined;
  try {
    other = imageSize(data).type;
  } catch {
    other = undefined;
  }
  return fileTypeMismatch(
    other
      ? `This is a ${other.toUpperCase()} image. Micrographs must be JPEG, PNG or TIFF; save it in one of those and try again.`
      : 'Flakeline cannot tell what this file is: it is neither a JPEG, PNG or TIFF image nor plain text.',
  );
}

const kindWords = (kind: EvidenceKind) => EVIDENCE_KIND_LABELS[kind].toLowerCase();

/**
 * Decides what an upload is from its content, refusing files whose name, declared type or
 * chosen kind say otherwise, and images with more pixels than Flakeline decodes. Image size
 * comes from the header alone: nothing is decoded here.
 */
export function sniffUpload(props: {
  data: Buffer;
  originalName?: string;
  declaredType?: string;
  kind: EvidenceKind;
}): SniffedFile {
  const { data, originalName, kind } = props;
  if (data.length === 0) throw invalid({ file: ['The file is empty.'] }, 'The file is empty.');
  const declaredType = (props.declaredType ?? '').toLowerCase().split(';')[0].trim();
  const extension = extensionOf(originalName);
  const claim = extension ? EXTENSION_CLAIMS[extension] : undefined;
  const nameLabel = originalName ? `"${originalName}"` : 'The file';

  const mediaType = signatureOf(data);
  if (!mediaType) {
    // Spectra are small: a large file that is not one of our images is refused before it is decoded as text.
    if (data.length > SPECTRUM_MAX_BYTES) {
      if (kind === 'micrograph') throw notOurImage(data);
      throw payloadTooLarge(`Spectra and profiles up to ${SPECTRUM_MAX_BYTES / (1024 * 1024)} MB are accepted.`);
    }
    const text = decodeStrictText(data);
    if (text !== null) {
      if (kind === 'micrograph') {
        throw fileTypeMismatch('This file is text, not an image. A micrograph must be a JPEG, PNG or TIFF image.');
      }
      if (claim?.family === 'image') {
        throw fileTypeMismatch(
          `${nameLabel} is named like a ${claim.name} image, but its content is text. Rename it or pick the right file.`,
        );
      }
      if (declaredType.startsWith('image/')) {
        throw fileTypeMismatch(`The file was sent as ${declaredType}, but its content is text. Pick the right file.`);
      }
      const isCsv = extension === 'csv' || declaredType === 'text/csv' || declaredType === 'application/csv';
      return { family: 'text', mediaType: isCsv ? 'text/csv' : 'text/plain', text };
    }
    throw notOurImage(data);
  }
  const format = IMAGE_NAMES[mediaType];
  if (kind !== 'micrograph') {
    throw fileTypeMismatch(
      `This file is a ${format} image, but a ${kindWords(kind)} must be a text file with two columns of numbers.`,
    );
  }
  if (claim && claim.mediaType !== mediaType) {
    throw fileTypeMismatch(
      `${nameLabel} is named like ${claim.name}, but its content is a ${format} image. Rename it or pick the right file.`,
    );
  }
  if (declaredType.startsWith('text/') || (declaredType.startsWith('image/') && declaredType !== mediaType)) {
    throw fileTypeMismatch(`The file was sent as ${declaredType}, but its content is a ${format} image.`);
  }

  let widthPx: number;
  let heightPx: number;
  let orientation: number | undefined;
  try {
    ({ width: widthPx, height: heightPx, orientation } = imageSize(data));
  } catch {
    throw imageCorrupt(`The ${format} header cannot be read: the file is damaged or cut short.`);
  }
  if (!(widthPx > 0 && heightPx > 0)) throw imageCorrupt(`The ${format} header gives no image size: the file is damaged.`);
  const pixels = widthPx * heightPx;
  if (pixels > IMAGE_MAX_PIXELS) {
    throw imageTooLarge(
      `This image is ${widthPx} × ${heightPx} pixels (${(pixels / 1e6).toFixed(1)} megapixels); Flakeline reads up to ${IMAGE_MAX_PIXELS / 1e6} megapixels. Save a cropped or scaled copy.`,
    );
  }
  return { family: 'image', mediaType, widthPx, heightPx, orientation };
}
