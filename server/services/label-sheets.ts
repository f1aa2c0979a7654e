import path from 'node:path';
import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import type { LabelTemplate } from '../../shared/schemas/labels';

/** PDF points per millimetre (1 pt = 1/72 inch, 1 inch = 25.4 mm). */
const PT_PER_MM = 72 / 25.4;
/**
 * Light modules kept around the symbol. ISO/IEC 18004 asks for four; two still scan reliably on
 * small lab labels that sit on a plain white background (common practice, no source).
 */
const QUIET_MODULES = 2;
/** Q recovers about 25 % of the symbol (ISO/IEC 18004), enough for a smudged or scratched label. */
const ERROR_CORRECTION = 'Q' as const;
const LABEL_PADDING_MM = 0.8;

const fontFile = (pkg: string, file: string) => path.join(path.dirname(require.resolve(`${pkg}/package.json`)), file);
const MONO_FONT = fontFile('@expo-google-fonts/ibm-plex-mono', '500Medium/IBMPlexMono_500Medium.ttf');
const SANS_FONT = fontFile('@expo-google-fonts/ibm-plex-sans', '400Regular/IBMPlexSans_400Regular.ttf');

export interface LabelContent {
  code: string;
  /** What the QR encodes: `<public base URL>/s/<code>`. */
  url: string;
  /** Up to three short lines for people: e.g. material and kind, date, owner initials. */
  lines: string[];
}

const pt = (mm: number) => mm * PT_PER_MM;

function drawQr(doc: PDFKit.PDFDocument, text: string, x: number, y: number, side: number) {
  const symbol = QRCode.create(text, { errorCorrectionLevel: ERROR_CORRECTION });
  const count = symbol.modules.size;
  const module = side / (count + 2 * QUIET_MODULES);
  const origin = { x: x + QUIET_MODULES * module, y: y + QUIET_MODULES * module };
  // Every dark module is a filled square in one path: vector, sharp at any printer resolution.
  for (let row = 0; row < count; row += 1) {
    for (let column = 0; column < count; column += 1) {
      if (symbol.modules.get(row, column)) doc.rect(origin.x + column * module, origin.y + row * module, module, module);
    }
  }
  doc.fill('#000000');
}

/** Text smaller than this is not printed legibly by label printers (common practice, no source). */
const MIN_FONT_PT = 3;

/** Largest font size (pt) at which `text` fits `width` points, capped at `max`; 1 % spare for rounding. */
function fitFontSize(doc: PDFKit.PDFDocument, text: string, width: number, max: number): number {
  doc.fontSize(max);
  const natural = doc.widthOfString(text);
  return natural <= width * 0.99 ? max : Math.max(MIN_FONT_PT, (max * width * 0.99) / natural);
}

/**
 * One line that never wraps onto the next: PDFKit wraps whenever a width is given, so the width
 * is given only when the text cannot fit even at the smallest size, and then it is cut with "…".
 */
function drawLine(doc: PDFKit.PDFDocument, text: string, x: number, y: number, width: number, size: number) {
  doc.fontSize(size);
  if (doc.widthOfString(text) <= width) {
    doc.text(text, x, y, { lineBreak: false });
  } else {
    doc.text(text, x, y, { width, height: size * 1.2, ellipsis: true });
  }
}

function drawLabel(doc: PDFKit.PDFDocument, template: LabelTemplate, content: LabelContent, left: number, top: number) {
  const width = pt(template.labelWidthMm);
  const height = pt(template.labelHeightMm);
  const padding = pt(LABEL_PADDING_MM);
  if (template.shape === 'round') {
    // The QR's corners must stay inside the circle: side = diameter / √2.
    const side = Math.min(width, height) / Math.SQRT2;
    drawQr(doc, content.url, left + (width - side) / 2, top + (height - side) / 2, side);
    return;
  }
  const side = Math.min(height, width / 2) - 2 * padding;
  drawQr(doc, content.url, left + padding, top + (height - side) / 2, side);
  const textLeft = left + padding + side + padding;
  const textWidth = width - (textLeft - left) - padding;
  let y = top + padding;
  doc.font('mono').fillColor('#000000');
  const codeSize = fitFontSize(doc, content.code, textWidth, Math.min(11, height / 3));
  drawLine(doc, content.code, textLeft, y, textWidth, codeSize);
  y += codeSize * 1.15;
  doc.font('sans');
  // One size for all human lines, small enough for the longest.
  const largest = Math.min(8, codeSize * 0.8);
  const lineSize = Math.min(largest, ...content.lines.map((line) => fitFontSize(doc, line, textWidth, largest)));
  for (const line of content.lines) {
    if (y + lineSize > top + height - padding / 2) break;
    drawLine(doc, line, textLeft, y, textWidth, lineSize);
    y += lineSize * 1.2;
  }
}

/**
 * A PDF of labels laid out on the template's sheet, in reading order, starting after `skip`
 * positions (to finish a part-used sheet). Page size is the template's, in millimetres.
 */
export function renderLabelSheet(template: LabelTemplate, labels: LabelContent[], skip = 0): Promise<Buffer> {
  const perPage = template.columns * template.rows;
  const doc = new PDFDocument({
    size: [pt(template.pageWidthMm), pt(template.pageHeightMm)],
    margin: 0,
    autoFirstPage: false,
    info: { Title: `Flakeline labels — ${template.name}`, Creator: 'Flakeline' },
  });
  doc.registerFont('mono', MONO_FONT);
  doc.registerFont('sans', SANS_FONT);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  labels.forEach((content, index) => {
    const position = (index + (skip % perPage)) % perPage;
    if (index === 0 || position === 0) doc.addPage();
    const column = position % template.columns;
    const row = Math.floor(position / template.columns);
    drawLabel(
      doc,
      template,
      content,
      pt(template.marginLeftMm + column * (template.labelWidthMm + template.columnGapMm)),
      pt(template.marginTopMm + row * (template.labelHeightMm + template.rowGapMm)),
    );
  });
  doc.end();
  return done;
}
