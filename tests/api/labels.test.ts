import jsQR from 'jsqr';
import type { Role } from '../../shared/roles';
import type { LabelTemplate } from '../../shared/schemas/labels';
import { CHECK_SYMBOLS } from '../../shared/codes';
import { buildPerson } from '../helpers/factories';
import { codeWithBody, insertSample, insertStep, outputCodes, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent, type Agent } from '../helpers/session-agent';
import {
  insertBox,
  insertManySamples,
  insertPlace,
  labelTemplateInput,
  rasterize,
  readPdf,
  type PdfPage,
} from '../helpers/storage-factories';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

/** PDF points per millimetre: 1 pt = 1/72 inch and 1 inch = 25.4 mm (ISO 32000-1, 8.3.2.3). */
const PT_PER_MM = 72 / 25.4;

const BUILT_IN = {
  round: 'Round cap labels, 9.5 mm, A4 sheet',
  cryo: 'Cryo vial labels, 33 × 13 mm, A4 sheet',
  chipCarrier: 'Chip carrier labels, 20 × 10 mm, A4 sheet',
  box: 'Box labels, 70 × 37 mm, A4 sheet',
  single: 'Single label, 50 × 25 mm (roll printer)',
};

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role, displayName: 'Ada Kovacs Lin' });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

async function templates(agent: Agent): Promise<LabelTemplate[]> {
  const response = await agent.get('/api/label-templates');
  if (response.status !== 200) throw new Error(`Listing templates failed: ${response.status}`);
  return response.body.templates as LabelTemplate[];
}

async function builtIn(agent: Agent, name: string): Promise<LabelTemplate> {
  const template = (await templates(agent)).find((entry) => entry.name === name);
  if (!template) throw new Error(`No built-in template "${name}"`);
  return template;
}

/** GET /api/labels.pdf with the body kept as bytes; a JSON error is parsed for the caller. */
async function labelsPdf(agent: Agent, query: Record<string, string | number>) {
  const response = await agent
    .get('/api/labels.pdf')
    .query(query)
    .buffer(true)
    .parse((res, callback) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => callback(null, Buffer.concat(chunks)));
    });
  const bytes = response.body as Buffer;
  const isJson = String(response.headers['content-type']).startsWith('application/json');
  return {
    status: response.status,
    contentType: String(response.headers['content-type']),
    pdf: bytes,
    error: isJson ? (JSON.parse(bytes.toString('utf8')).error as { code: string; message: string; fields?: object }) : undefined,
  };
}

/** Pages of a label sheet as pdf.js reads them; fails unless the answer is a PDF. */
async function sheet(agent: Agent, query: Record<string, string | number>): Promise<PdfPage[]> {
  const response = await labelsPdf(agent, query);
  if (response.status !== 200) throw new Error(`Labels failed: ${response.status} ${JSON.stringify(response.error)}`);
  expect(response.contentType).toMatch(/^application\/pdf/);
  return readPdf(response.pdf);
}

const occurrences = (texts: string[], wanted: string) => texts.filter((text) => text === wanted).length;

/** Top-left corner and size of the label at `position` (reading order) on a sheet, in points. */
function cell(template: LabelTemplate, position: number) {
  const column = position % template.columns;
  const row = Math.floor(position / template.columns);
  const left = (template.marginLeftMm + column * (template.labelWidthMm + template.columnGapMm)) * PT_PER_MM;
  const top = (template.marginTopMm + row * (template.labelHeightMm + template.rowGapMm)) * PT_PER_MM;
  return { left, top, right: left + template.labelWidthMm * PT_PER_MM, bottom: top + template.labelHeightMm * PT_PER_MM };
}

/**
 * What a scanner reads from the label at `position`: the page's filled rectangles inside that
 * label are drawn into pixels (six per QR module) and decoded with jsQR (github.com/cozmo/jsQR),
 * a general-purpose QR decoder independent of the `qrcode` encoder the server uses. Null when
 * jsQR finds no symbol there.
 */
function scanLabel(page: PdfPage, template: LabelTemplate, position: number): string | null {
  const area = cell(template, position);
  const rects = page.filledRects.filter(
    (rect) =>
      rect.left >= area.left - 0.01 &&
      rect.right <= area.right + 0.01 &&
      rect.top >= area.top - 0.01 &&
      rect.bottom <= area.bottom + 0.01,
  );
  if (!rects.length) return null;
  const module = Math.min(...rects.map((rect) => rect.right - rect.left));
  const image = rasterize(rects, area, 6 / module);
  return jsQR(image.data, image.width, image.height, { inversionAttempts: 'dontInvert' })?.data ?? null;
}

const urlOf = (code: string) => `${lab.config.publicBaseUrl}/s/${code}`;

/** The same code with a different check symbol (never one that folds back to the right one). */
function withWrongCheckSymbol(code: string): string {
  const check = code[code.length - 1];
  return code.slice(0, -1) + CHECK_SYMBOLS[(CHECK_SYMBOLS.indexOf(check) + 1) % CHECK_SYMBOLS.length];
}

describe('GET /api/label-templates', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/label-templates');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('200 for a reviewer: the five built-in sheets, by name, sized in millimetres', async () => {
    const { agent } = await signedIn('reviewer');
    const list = await templates(agent);
    expect(list.map((template) => template.name)).toEqual(Object.values(BUILT_IN).sort((a, b) => a.localeCompare(b)));
    expect(list.every((template) => template.builtIn)).toBe(true);
    expect(list.find((template) => template.name === BUILT_IN.cryo)).toEqual({
      id: expect.any(Number),
      name: BUILT_IN.cryo,
      shape: 'rectangle',
      labelWidthMm: 33,
      labelHeightMm: 13,
      pageWidthMm: 210,
      pageHeightMm: 297,
      columns: 5,
      rows: 17,
      marginLeftMm: 12,
      marginTopMm: 12,
      columnGapMm: 5,
      rowGapMm: 3.8,
      builtIn: true,
    });
    expect(list.find((template) => template.name === BUILT_IN.round)).toMatchObject({ shape: 'round', columns: 15, rows: 21 });
  });

  it('every built-in sheet fits its page (margin + labels + gaps within the page, both ways)', async () => {
    const { agent } = await signedIn('reviewer');
    for (const template of await templates(agent)) {
      const across =
        template.marginLeftMm + template.columns * template.labelWidthMm + (template.columns - 1) * template.columnGapMm;
      const down = template.marginTopMm + template.rows * template.labelHeightMm + (template.rows - 1) * template.rowGapMm;
      expect({
        name: template.name,
        fitsAcross: across <= template.pageWidthMm + 0.01,
        fitsDown: down <= template.pageHeightMm + 0.01,
      }).toEqual({
        name: template.name,
        fitsAcross: true,
        fitsDown: true,
      });
    }
  });
});

describe('POST /api/label-templates', () => {
  const post = (session: { agent: Agent; csrfToken: string }, body: object) =>
    session.agent.post('/api/label-templates').set('x-csrf-token', session.csrfToken).send(body);

  it('401 unauthenticated when signed out', async () => {
    const response = await post(await anonymousAgent(lab.app), labelTemplateInput());
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming each bad field: unknown shape, labels too small to hold a code, no columns', async () => {
    const manager = await signedIn('manager');
    const response = await post(
      manager,
      labelTemplateInput({ shape: 'oval' as never, labelWidthMm: 5, labelHeightMm: 4, columns: 0 }),
    );
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['columns', 'labelHeightMm', 'labelWidthMm', 'shape']);
  });

  it('422 validation_failed naming columns and rows when the labels do not fit the page, with the millimetres needed and available', async () => {
    const manager = await signedIn('manager');
    // Across: 15 + 5 × 40 + 4 × 5 = 235 mm on a 210 mm page. Down: 20 + 12 × 25 + 11 × 2 = 342 mm on 297 mm.
    const response = await post(manager, labelTemplateInput({ columns: 5, labelHeightMm: 25 }));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['columns', 'rows']);
    expect(response.body.error.fields.columns[0]).toMatch(/235\.0 mm.*210 mm/);
    expect(response.body.error.fields.rows[0]).toMatch(/342\.0 mm.*297 mm/);
    expect(await lab.knex('label_templates').where('built_in', false).count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('422 validation_failed for labels that overrun the page by the margin alone', async () => {
    const manager = await signedIn('manager');
    // 4 × 40 + 3 × 5 = 175 mm fits 210 mm, but not after a 40 mm left margin (215 mm).
    const response = await post(manager, labelTemplateInput({ marginLeftMm: 40 }));
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields)).toEqual(['columns']);
    expect(response.body.error.fields.columns[0]).toMatch(/215\.0 mm.*210 mm/);
  });

  it.each(['reviewer', 'researcher'] as const)('403 forbidden for a %s', async (role) => {
    const response = await post(await signedIn(role), labelTemplateInput());
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('409 conflict for a name a template already has', async () => {
    const manager = await signedIn('manager');
    const response = await post(manager, labelTemplateInput({ name: BUILT_IN.cryo }));
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
  });

  it('201 with the new sheet, which is listed and prints on a page of its own size', async () => {
    const manager = await signedIn('manager');
    const body = labelTemplateInput({
      name: 'Slide box labels, 40 × 20 mm, letter',
      pageWidthMm: 215.9,
      pageHeightMm: 279.4,
      rows: 11,
    });
    const response = await post(manager, body);
    expect(response.status).toBe(201);
    expect(response.body.template).toEqual({ id: expect.any(Number), ...body, builtIn: false });
    expect((await templates(manager.agent)).map((template) => template.name)).toContain('Slide box labels, 40 × 20 mm, letter');

    const sample = await insertSample(lab.knex, manager.person);
    const [page] = await sheet(manager.agent, { template: response.body.template.id, samples: sample.code });
    expect(page.view[2]).toBeCloseTo(215.9 * PT_PER_MM, 2);
    expect(page.view[3]).toBeCloseTo(279.4 * PT_PER_MM, 2);
  });
});

describe('GET /api/labels.pdf', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await labelsPdf(agent, { template: 1, samples: codeWithBody('CH', '4F7K2M') });
    expect(response.status).toBe(401);
    expect(response.error?.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming the template when none is chosen, or it does not exist', async () => {
    const { agent, person } = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, person);
    const none = await labelsPdf(agent, { samples: sample.code });
    expect(none.status).toBe(422);
    expect(none.error?.code).toBe('validation_failed');
    expect(Object.keys(none.error?.fields ?? {})).toEqual(['query.template']);
    const unknown = await labelsPdf(agent, { template: 9999, samples: sample.code });
    expect(unknown.status).toBe(422);
    expect(Object.keys(unknown.error?.fields ?? {})).toEqual(['query.template']);
  });

  it('422 validation_failed when two things to print are named at once, or nothing is', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const sample = await insertSample(lab.knex, person);
    const box = await insertBox(lab.knex);
    const both = await labelsPdf(agent, { template: template.id, samples: sample.code, box: box.code });
    expect(both.status).toBe(422);
    expect(both.error?.code).toBe('validation_failed');
    expect(Object.keys(both.error?.fields ?? {})).toEqual(['query']);
    const neither = await labelsPdf(agent, { template: template.id });
    expect(neither.status).toBe(422);
    expect(neither.error?.code).toBe('validation_failed');
  });

  it('422 validation_failed for a skip that is not a whole number', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const sample = await insertSample(lab.knex, person);
    const response = await labelsPdf(agent, { template: template.id, samples: sample.code, skip: '-3' });
    expect(response.status).toBe(422);
    expect(Object.keys(response.error?.fields ?? {})).toEqual(['query.skip']);
  });

  it('422 code_typo for a sample code whose check symbol is wrong', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const sample = await insertSample(lab.knex, person);
    const response = await labelsPdf(agent, { template: template.id, samples: withWrongCheckSymbol(sample.code) });
    expect(response.status).toBe(422);
    expect(response.error?.code).toBe('code_typo');
  });

  it('404 not_found naming the sample code nobody has; no PDF', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const sample = await insertSample(lab.knex, person);
    const unknown = codeWithBody('FK', 'H4RDQ2');
    const response = await labelsPdf(agent, { template: template.id, samples: `${sample.code},${unknown}` });
    expect(response.status).toBe(404);
    expect(response.error?.code).toBe('not_found');
    expect(response.error?.message).toContain(unknown);
    expect(response.error?.message).not.toContain(sample.code);
  });

  it('404 not_found for a step that does not exist, and for a box code nobody has', async () => {
    const { agent } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const step = await labelsPdf(agent, { template: template.id, step: 4242 });
    expect(step.status).toBe(404);
    expect(step.error?.code).toBe('not_found');
    expect(step.error?.message).toContain('4242');
    const unknownBox = codeWithBody('BX', '7Q3M0K');
    const box = await labelsPdf(agent, { template: template.id, box: unknownBox });
    expect(box.status).toBe(404);
    expect(box.error?.code).toBe('not_found');
    expect(box.error?.message).toContain(unknownBox);
  });

  it('200 for a reviewer (labels only read): an inline PDF', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.single);
    const sample = await insertSample(lab.knex, person);
    const response = await labelsPdf(agent, { template: template.id, samples: sample.code });
    expect(response.status).toBe(200);
    expect(response.contentType).toMatch(/^application\/pdf/);
    expect(response.pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(readPdf(response.pdf)).toHaveLength(1);
  });

  it.each(Object.entries(BUILT_IN))(
    'pages have the size of the %s template, in points (pdf.js page.view)',
    async (_key, name) => {
      const { agent, person } = await signedIn('reviewer');
      const template = await builtIn(agent, name);
      const sample = await insertSample(lab.knex, person);
      const pages = await sheet(agent, { template: template.id, samples: sample.code });
      expect(pages).toHaveLength(1);
      const [x0, y0, width, height] = pages[0].view;
      expect([x0, y0]).toEqual([0, 0]);
      expect(Math.abs(width - template.pageWidthMm * PT_PER_MM)).toBeLessThan(0.01);
      expect(Math.abs(height - template.pageHeightMm * PT_PER_MM)).toBeLessThan(0.01);
    },
  );

  it('30 labels on a 5 × 17 sheet fill one page; each code is printed once, with its material and kind (pdf.js text)', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const flakes = await insertManySamples(lab.knex, person, 30, { kind: 'flake', material: 'graphene' });
    const pages = await sheet(agent, { template: template.id, samples: flakes.map((flake) => flake.code).join(',') });
    expect(pages).toHaveLength(1);
    const texts = pages[0].texts;
    for (const flake of flakes)
      expect({ code: flake.code, times: occurrences(texts, flake.code) }).toEqual({ code: flake.code, times: 1 });
    expect(occurrences(texts, 'graphene · Flake')).toBe(30);
    const today = flakes[0].createdAt.toISOString().slice(0, 10);
    expect(occurrences(texts, `${today} · AKL`)).toBe(30);
  });

  it('90 labels on a 5 × 17 sheet take two pages: 85 on the first, 5 on the second', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const flakes = await insertManySamples(lab.knex, person, 90);
    const pages = await sheet(agent, { template: template.id, samples: flakes.map((flake) => flake.code).join(',') });
    expect(pages).toHaveLength(2);
    const codesOn = (page: PdfPage) => flakes.map((flake) => flake.code).filter((code) => page.texts.includes(code));
    expect(codesOn(pages[0])).toEqual(flakes.slice(0, 85).map((flake) => flake.code));
    expect(codesOn(pages[1])).toEqual(flakes.slice(85).map((flake) => flake.code));
    for (const page of pages) expect(page.view.slice(2)).toEqual(pages[0].view.slice(2));
  });

  it('skip=80 with 10 labels uses the last 5 places of a part-used sheet, then 5 on a new page', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const flakes = await insertManySamples(lab.knex, person, 10);
    const codes = flakes.map((flake) => flake.code);
    const pages = await sheet(agent, { template: template.id, samples: codes.join(','), skip: 80 });
    expect(pages).toHaveLength(2);
    expect(codes.filter((code) => pages[0].texts.includes(code))).toEqual(codes.slice(0, 5));
    expect(codes.filter((code) => pages[1].texts.includes(code))).toEqual(codes.slice(5));
    // Where they sit: positions 80…84 on the first sheet (the last row), 0…4 on the second.
    expect(scanLabel(pages[0], template, 79)).toBeNull();
    expect(scanLabel(pages[0], template, 80)).toBe(urlOf(codes[0]));
    expect(scanLabel(pages[0], template, 84)).toBe(urlOf(codes[4]));
    expect(scanLabel(pages[1], template, 0)).toBe(urlOf(codes[5]));
    expect(scanLabel(pages[1], template, 5)).toBeNull();
  });

  it('the QR codes are vector paths, not pictures, and each decodes to its own label URL (jsQR)', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const chip = await insertSample(lab.knex, person, { kind: 'chip', material: 'Si/SiO2' });
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'MoS2' });
    const film = await insertSample(lab.knex, person, { kind: 'film', material: 'WS2' });
    const codes = [chip.code, crystal.code, film.code];
    // Codes typed loosely are printed in their canonical form.
    const [page] = await sheet(agent, {
      template: template.id,
      samples: [chip.code.toLowerCase(), crystal.code, film.code].join(', '),
    });

    // pdf.js operator list: no image of any kind on the page, so the QR prints sharp at any resolution.
    // Without a canvas pdf.js cannot render the page, but a vector QR needs none: scanLabel draws
    // the filled rectangles pdf.js reports and jsQR decodes them, so this checks the printed symbol
    // itself, beyond the PNG round trip in tests/unit/qr-roundtrip.test.ts.
    const imageOperators = Object.keys(page.operators).filter((name) => /image/i.test(name));
    expect(imageOperators).toEqual([]);
    expect(page.operators.constructPath).toBeGreaterThanOrEqual(3);

    expect([0, 1, 2, 3].map((position) => scanLabel(page, template, position))).toEqual([...codes.map(urlOf), null]);
    for (const code of codes) expect(occurrences(page.texts, code)).toBe(1);
  });

  // What a person reads on a label, top to bottom: the code, "material · kind", "date · initials".
  // Found failing (see the report): the server passes `width` to PDFKit's text(), and PDFKit then
  // wraps any line that measures wider than that box, although `lineBreak: false` is set; the
  // wrapped word lands on top of the next line.
  it('a line sized to exactly the width of the text column is printed whole (Si/SiO2 substrate chip, cryo vial label)', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.cryo);
    const chip = await insertSample(lab.knex, person, { kind: 'chip', material: 'Si/SiO2' });
    const [page] = await sheet(agent, { template: template.id, samples: chip.code });
    const lines = [...page.textItems].sort((a, b) => a.y - b.y || a.x - b.x).map((line) => line.str);
    const date = chip.createdAt.toISOString().slice(0, 10);
    expect(lines).toEqual([chip.code, 'Si/SiO2 · Substrate chip', `${date} · AKL`]);
  });

  it.each([
    ['a Si/SiO2 substrate chip on a cryo vial label', BUILT_IN.cryo, 'chip', 'Si/SiO2'],
    [
      'a graphene crystal on a chip carrier label, whose kind line is too long even at the smallest size',
      BUILT_IN.chipCarrier,
      'crystal',
      'graphene',
    ],
    ['a graphene flake on a chip carrier label', BUILT_IN.chipCarrier, 'flake', 'graphene'],
  ] as const)('no line runs into another or out of the label: %s', async (_case, name, kind, material) => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, name);
    const sample = await insertSample(lab.knex, person, { kind, material });
    const [page] = await sheet(agent, { template: template.id, samples: sample.code });

    const label = cell(template, 0);
    const lines = [...page.textItems].sort((a, b) => a.y - b.y || a.x - b.x);
    expect(lines[0].str).toBe(sample.code);
    for (const line of lines) {
      expect({
        line: line.str,
        left: line.x >= label.left,
        right: line.x + line.width <= label.right + 0.01,
        bottom: line.y <= label.bottom + 0.01,
      }).toEqual({
        line: line.str,
        left: true,
        right: true,
        bottom: true,
      });
    }
    // Baselines (pdf.js text positions) at least one font size apart: no line prints over another.
    const gaps = lines.slice(1).map((line, index) => ({ line: line.str, clear: line.y - lines[index].y >= line.size }));
    expect(gaps).toEqual(lines.slice(1).map((line) => ({ line: line.str, clear: true })));
  });

  it('round cap labels: the QR decodes and stays inside the circle', async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.round);
    const samples = await insertManySamples(lab.knex, person, 2, { kind: 'flake', material: 'hBN' });
    const [page] = await sheet(agent, { template: template.id, samples: samples.map((sample) => sample.code).join(',') });
    expect([0, 1].map((position) => scanLabel(page, template, position))).toEqual(samples.map((sample) => urlOf(sample.code)));

    const label = cell(template, 0);
    const centre = { x: (label.left + label.right) / 2, y: (label.top + label.bottom) / 2 };
    const radius = (template.labelWidthMm * PT_PER_MM) / 2;
    const inLabel = page.filledRects.filter((rect) => rect.right <= label.right + 0.01 && rect.bottom <= label.bottom + 0.01);
    expect(inLabel.length).toBeGreaterThan(100);
    const farthest = Math.max(
      ...inLabel.flatMap((rect) =>
        [rect.left, rect.right].flatMap((x) => [rect.top, rect.bottom].map((y) => Math.hypot(x - centre.x, y - centre.y))),
      ),
    );
    expect(farthest).toBeLessThanOrEqual(radius + 0.01);
  });

  it("step=<id> prints the step's outputs, in output order", async () => {
    const { agent, person } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.chipCarrier);
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'hBN' });
    const step = await insertStep(
      lab.knex,
      person,
      stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 4 }] }),
    );
    const chips = await outputCodes(lab.knex, step.id);
    expect(chips).toHaveLength(4);

    const [page] = await sheet(agent, { template: template.id, step: step.id });
    const printed = page.texts.filter((text) => /^[A-Z]{2}-/.test(text));
    expect(printed).toEqual(chips);
    expect(page.texts).not.toContain(crystal.code);
    expect([0, 1, 2, 3].map((position) => scanLabel(page, template, position))).toEqual(chips.map(urlOf));
  });

  it('box=<code> prints the box label: its code, name, place and grid, and a QR for the box', async () => {
    const { agent } = await signedIn('reviewer');
    const template = await builtIn(agent, BUILT_IN.box);
    const room = await insertPlace(lab.knex, { name: 'Lab 2.14', kind: 'room' });
    const desiccator = await insertPlace(lab.knex, { name: 'Desiccator B', kind: 'desiccator', parentId: room.id });
    const box = await insertBox(lab.knex, { name: 'Exfoliated chips, Nov', placeId: desiccator.id, rows: 4, columns: 5 });

    const [page] = await sheet(agent, { template: template.id, box: box.code.toLowerCase() });
    expect(occurrences(page.texts, box.code)).toBe(1);
    expect(page.texts).toEqual(expect.arrayContaining(['Exfoliated chips, Nov', 'Lab 2.14 › Desiccator B', '4 × 5 slots']));
    expect(scanLabel(page, template, 0)).toBe(urlOf(box.code));
    expect(scanLabel(page, template, 1)).toBeNull();
  });
});
