import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Knex } from 'knex';
import type { BoxCreateInput, StoragePlace } from '../../shared/schemas/storage';
import type { LabelTemplateCreateInput } from '../../shared/schemas/labels';
import type { SampleKind } from '../../shared/samples';
import type { BoxModel, StoragePlaceModel } from '../../server/models/storage-models';
import type { SampleModel } from '../../server/models/sample-model';
import type { UserModel } from '../../server/models/user-model';
import { appendHistory } from '../../server/services/history-chain';
import { createdEvent, insertSamples } from '../../server/services/sample-registry';
import { createBox, createPlace, moveSample } from '../../server/services/storage';

let sequence = 0;
const next = () => (sequence += 1);

// ---------------------------------------------------------------------------------------------
// Request bodies with realistic values.
// ---------------------------------------------------------------------------------------------

/** A chip box with a grid of 4 rows (A–D) × 5 columns (1–5), unless told otherwise. */
export function boxInput(overrides: Partial<BoxCreateInput> = {}): BoxCreateInput {
  return { name: `Chip box ${next()}`, rows: 4, columns: 5, ...overrides };
}

/** A sheet of 40 × 20 mm labels, 4 across and 12 down on A4: fits with room to spare. */
export function labelTemplateInput(overrides: Partial<LabelTemplateCreateInput> = {}): LabelTemplateCreateInput {
  return {
    name: `Tube labels ${next()}, 40 × 20 mm, A4`,
    shape: 'rectangle',
    labelWidthMm: 40,
    labelHeightMm: 20,
    pageWidthMm: 210,
    pageHeightMm: 297,
    columns: 4,
    rows: 12,
    marginLeftMm: 15,
    marginTopMm: 20,
    columnGapMm: 5,
    rowGapMm: 2,
    ...overrides,
  };
}

// ---------------------------------------------------------------------------------------------
// Straight into the database through the services.
// ---------------------------------------------------------------------------------------------

export async function insertPlace(
  knex: Knex,
  fields: { name?: string; kind?: StoragePlace['kind']; parentId?: number | null } = {},
): Promise<StoragePlaceModel> {
  return knex.transaction((trx) =>
    createPlace(trx, { name: fields.name ?? `Cabinet ${next()}`, kind: fields.kind ?? 'cabinet', parentId: fields.parentId }),
  );
}

/** A box made by the storage service (so it gets a real BX code), 4 × 5 unless told otherwise. */
export async function insertBox(knex: Knex, fields: Partial<BoxCreateInput> = {}): Promise<BoxModel> {
  const input = boxInput(fields);
  return knex.transaction((trx) => createBox(trx, { ...input, name: input.name, rows: input.rows, columns: input.columns }));
}

/** Puts a sample into a box slot through the storage service, with its `sample.moved` event. */
export async function putAway(knex: Knex, actor: UserModel, code: string, boxCode: string, slot: string) {
  return knex.transaction((trx) => moveSample({ trx, actor, code, to: { boxCode, slot } }));
}

/** `count` samples in one transaction, each with its `sample.created` event; in insertion order. */
export async function insertManySamples(
  knex: Knex,
  owner: UserModel,
  count: number,
  fields: { kind?: SampleKind; material?: string } = {},
): Promise<SampleModel[]> {
  return knex.transaction(async (trx) => {
    const rows = Array.from({ length: count }, (_, index) => ({
      kind: fields.kind ?? ('flake' as SampleKind),
      material: fields.material ?? 'graphene',
      name: `Sample ${index + 1}`,
      ownerId: owner.id,
    }));
    const created = await insertSamples(trx, owner.id, rows);
    await appendHistory(
      trx,
      created.map((sample) => createdEvent(owner.id, sample)),
    );
    return created;
  });
}

// ---------------------------------------------------------------------------------------------
// Reading a label PDF with pdf.js (pdfjs-dist, Mozilla's PDF reader), the independent reference
// for what a PDF contains. pdfjs-dist 4 is ES modules only and Jest here runs CommonJS without
// VM modules, so pdf.js runs in a child Node process and hands back what it read as JSON.
// ---------------------------------------------------------------------------------------------

export interface PdfRect {
  /** Page coordinates in points, origin at the page's top-left corner, y downwards. */
  left: number;
  top: number;
  right: number;
  bottom: number;
}

export interface PdfPage {
  /** pdf.js's `page.view`: [x0, y0, x1, y1] of the media box in points. */
  view: number[];
  /** Each text item pdf.js found, in content order. */
  texts: string[];
  /** The same items with where they start (page points from the top-left), their width and font size. */
  textItems: { str: string; x: number; y: number; width: number; size: number }[];
  /** How often each operator appears in the page's operator list, by pdf.js's OPS name. */
  operators: Record<string, number>;
  /** Every filled rectangle on the page, after the transformation matrix. */
  filledRects: PdfRect[];
}

const PDFJS = pathToFileURL(path.join(__dirname, '../../node_modules/pdfjs-dist/legacy/build/pdf.mjs')).href;

const READ_PDF_SCRIPT = `
import * as pdfjs from ${JSON.stringify(PDFJS)};
const chunks = [];
for await (const chunk of process.stdin) chunks.push(chunk);
const doc = await pdfjs.getDocument({
  data: new Uint8Array(Buffer.concat(chunks)),
  useSystemFonts: false,
  isEvalSupported: false,
  verbosity: 0,
}).promise;
const names = Object.fromEntries(Object.entries(pdfjs.OPS).map(([name, id]) => [id, name]));
const multiply = (o, m) => [
  o[0] * m[0] + o[2] * m[1], o[1] * m[0] + o[3] * m[1],
  o[0] * m[2] + o[2] * m[3], o[1] * m[2] + o[3] * m[3],
  o[0] * m[4] + o[2] * m[5] + o[4], o[1] * m[4] + o[3] * m[5] + o[5],
];
const apply = (m, x, y) => [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
const pages = [];
for (let number = 1; number <= doc.numPages; number += 1) {
  const page = await doc.getPage(number);
  const [, , , height] = page.view;
  const text = await page.getTextContent();
  const list = await page.getOperatorList();
  const operators = {};
  const filledRects = [];
  let ctm = [1, 0, 0, 1, 0, 0];
  const stack = [];
  let pending = [];
  list.fnArray.forEach((fn, index) => {
    const name = names[fn] ?? String(fn);
    operators[name] = (operators[name] ?? 0) + 1;
    const args = list.argsArray[index];
    if (fn === pdfjs.OPS.save) stack.push(ctm);
    else if (fn === pdfjs.OPS.restore) ctm = stack.pop() ?? ctm;
    else if (fn === pdfjs.OPS.transform) ctm = multiply(ctm, args);
    else if (fn === pdfjs.OPS.constructPath) {
      const [ops, coords] = args;
      let at = 0;
      for (const op of ops) {
        if (op === pdfjs.OPS.rectangle) {
          const [x, y, w, h] = coords.slice(at, at + 4);
          const [x0, y0] = apply(ctm, x, y);
          const [x1, y1] = apply(ctm, x + w, y + h);
          pending.push({
            left: Math.min(x0, x1), right: Math.max(x0, x1),
            top: height - Math.max(y0, y1), bottom: height - Math.min(y0, y1),
          });
          at += 4;
        } else if (op === pdfjs.OPS.moveTo || op === pdfjs.OPS.lineTo) at += 2;
        else if (op === pdfjs.OPS.curveTo) at += 6;
        else if (op === pdfjs.OPS.curveTo2 || op === pdfjs.OPS.curveTo3) at += 4;
      }
    } else if ([pdfjs.OPS.fill, pdfjs.OPS.eoFill, pdfjs.OPS.fillStroke, pdfjs.OPS.eoFillStroke].includes(fn)) {
      filledRects.push(...pending);
      pending = [];
    } else if ([pdfjs.OPS.endPath, pdfjs.OPS.stroke, pdfjs.OPS.closeStroke].includes(fn)) {
      pending = [];
    }
  });
  const items = text.items.filter((item) => item.str !== undefined);
  pages.push({
    view: page.view,
    texts: items.map((item) => item.str),
    textItems: items.filter((item) => item.str !== '').map((item) => ({
      str: item.str, x: item.transform[4], y: height - item.transform[5], width: item.width, size: Math.hypot(item.transform[2], item.transform[3]),
    })),
    operators,
    filledRects,
  });
}
process.stdout.write(JSON.stringify({ pages }));
`;

/** Pages of a PDF as pdf.js reads them. */
export function readPdf(pdf: Buffer): PdfPage[] {
  const output = execFileSync(process.execPath, ['--input-type=module', '-e', READ_PDF_SCRIPT], {
    input: pdf,
    maxBuffer: 256 * 1024 * 1024,
  });
  return (JSON.parse(output.toString('utf8')) as { pages: PdfPage[] }).pages;
}

/**
 * Black-on-white RGBA pixels of the filled rectangles inside `area` (page points), at `scale`
 * pixels per point with a white border: what a printer would put on that label, for a QR decoder.
 */
export function rasterize(rects: PdfRect[], area: PdfRect, scale = 10, border = 40) {
  const width = Math.ceil((area.right - area.left) * scale) + 2 * border;
  const height = Math.ceil((area.bottom - area.top) * scale) + 2 * border;
  const data = new Uint8ClampedArray(width * height * 4).fill(255);
  const inside = (rect: PdfRect) =>
    rect.left >= area.left - 0.01 &&
    rect.right <= area.right + 0.01 &&
    rect.top >= area.top - 0.01 &&
    rect.bottom <= area.bottom + 0.01;
  for (const rect of rects.filter(inside)) {
    // A pixel is dark when its centre lies in the rectangle.
    const x0 = Math.ceil((rect.left - area.left) * scale - 0.5) + border;
    const x1 = Math.floor((rect.right - area.left) * scale - 0.5) + border;
    const y0 = Math.ceil((rect.top - area.top) * scale - 0.5) + border;
    const y1 = Math.floor((rect.bottom - area.top) * scale - 0.5) + border;
    for (let y = y0; y <= y1; y += 1) {
      for (let x = x0; x <= x1; x += 1) {
        const at = (y * width + x) * 4;
        data[at] = 0;
        data[at + 1] = 0;
        data[at + 2] = 0;
      }
    }
  }
  return { data, width, height };
}
