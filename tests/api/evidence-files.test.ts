import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { PNG } from 'pngjs';
import { formatCode } from '../../shared/codes';
import { SAMPLE_CODE_PREFIXES } from '../../shared/samples';
import { SPECTRUM_MAX_BYTES, THUMBNAIL_MAX_EDGE_PX } from '../../shared/schemas/evidence';
import type { Evidence } from '../../shared/schemas/evidence';
import { blobKey } from '../../server/files/blob-store';
import { createFileStore } from '../../server/files/file-store';
import {
  craftedPngHeader,
  encodePng,
  encodeWithJimp,
  MONOLAYER_MOS2_RAMAN,
  paintMicrograph,
  spectrumCsv,
  upload,
} from '../helpers/evidence-fixtures';
import { buildPerson } from '../helpers/factories';
import { insertSample, insertStep, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp();
});
afterAll(() => lab.close());
beforeEach(async () => {
  await resetDatabase();
  // The file store outlives a database reset; each test starts from an empty one.
  rmSync(blobDir(), { recursive: true, force: true });
});

const sha256 = (data: Buffer | string) => createHash('sha256').update(data).digest('hex');
const blobDir = () => (lab.config.storage as { dir: string }).dir;
const blobPath = (sha: string) => path.join(blobDir(), ...blobKey(sha).split('/'));

/** Every file under the blob folder, temporary ones included. */
function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.join(entry.parentPath, entry.name));
}

const SUBSTRATE = { red: 170, green: 120, blue: 200 };
const smallPng = () => encodePng(paintMicrograph({ width: 640, height: 480, substrate: SUBSTRATE, noise: 3 }));

async function researcherWithFlake(material = 'MoS2') {
  const person = await buildPerson(lab.knex, { role: 'researcher' });
  const session = await signedInAgent(lab.app, person.email);
  const flake = await insertSample(lab.knex, person, {
    kind: 'flake',
    material,
    properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
  });
  return { ...session, person, flake };
}

async function counts() {
  const [{ count: evidence }] = await lab.knex('evidence').count({ count: '*' });
  const [{ count: storedFiles }] = await lab.knex('stored_files').count({ count: '*' });
  return { evidence: Number(evidence), storedFiles: Number(storedFiles) };
}

describe('POST /api/samples/:code/evidence', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await upload(
      agent,
      csrfToken,
      '/api/samples/FL-0000000/evidence',
      { data: smallPng(), name: 'a.png' },
      'micrograph',
    );
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('403 csrf_invalid for a multipart upload without the token, and nothing is read or stored', async () => {
    const { agent, flake } = await researcherWithFlake();
    const response = await agent
      .post(`/api/samples/${flake.code}/evidence`)
      .field('kind', 'micrograph')
      .attach('file', smallPng(), { filename: 'a.png', contentType: 'image/png' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_invalid');
    expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
  });

  it('403 forbidden for a reviewer', async () => {
    const owner = await buildPerson(lab.knex);
    const flake = await insertSample(lab.knex, owner, { kind: 'flake', material: 'MoS2' });
    const reviewer = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent, csrfToken } = await signedInAgent(lab.app, reviewer.email);
    const response = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: smallPng(), name: 'a.png' },
      'micrograph',
    );
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('422 when the body is JSON rather than a multipart upload', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const response = await agent
      .post(`/api/samples/${flake.code}/evidence`)
      .set('x-csrf-token', csrfToken)
      .send({ kind: 'raman' });
    expect(response.status).toBe(422);
    expect(response.body.error.fields.file[0]).toMatch(/multipart\/form-data/);
  });

  it('422 when the file part is missing or the kind is unknown', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const noFile = await agent.post(`/api/samples/${flake.code}/evidence`).set('x-csrf-token', csrfToken).field('kind', 'raman');
    expect(noFile.status).toBe(422);
    expect(noFile.body.error.fields.file).toEqual(['Choose a file to upload.']);
    const badKind = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: smallPng(), name: 'a.png' },
      'xray',
    );
    expect(badKind.status).toBe(422);
    expect(Object.keys(badKind.body.error.fields)).toEqual(['kind']);
  });

  it('422 with the field named when the metadata is not valid JSON or breaks its kind’s rules', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const notJson = await agent
      .post(`/api/samples/${flake.code}/evidence`)
      .set('x-csrf-token', csrfToken)
      .field('kind', 'raman')
      .field('metadata', '{laserNm: 532')
      .attach('file', Buffer.from(MONOLAYER_MOS2_RAMAN()), { filename: 'r.csv', contentType: 'text/csv' });
    expect(notJson.status).toBe(422);
    expect(notJson.body.error.fields.metadata).toEqual(['The metadata is not valid JSON.']);
    const unknownField = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: MONOLAYER_MOS2_RAMAN(), name: 'r.csv' },
      'raman',
      {
        laserNm: -532,
        colour: 'green',
      },
    );
    expect(unknownField.status).toBe(422);
    expect(Object.keys(unknownField.body.error.fields).sort()).toEqual(['metadata', 'metadata.laserNm']);
    expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
  });

  it('404 not_found for an unknown sample code', async () => {
    const { agent, csrfToken } = await researcherWithFlake();
    const unknown = formatCode(SAMPLE_CODE_PREFIXES.flake, 12345);
    const response = await upload(
      agent,
      csrfToken,
      `/api/samples/${unknown}/evidence`,
      { data: smallPng(), name: 'a.png' },
      'micrograph',
    );
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  describe('415 file_type_mismatch when the content says otherwise', () => {
    it.each([
      [
        'a PNG named .jpg',
        () => ({ data: smallPng(), name: 'flake.jpg', contentType: 'image/jpeg' }),
        'micrograph',
        /named like JPEG.*PNG image/,
      ],
      [
        'a PNG sent as image/tiff',
        () => ({ data: smallPng(), name: 'flake', contentType: 'image/tiff' }),
        'micrograph',
        /sent as image\/tiff.*PNG/,
      ],
      [
        'text named .png',
        () => ({ data: MONOLAYER_MOS2_RAMAN(), name: 'flake.png', contentType: 'image/png' }),
        'raman',
        /named like a PNG image.*text/,
      ],
      [
        'a spectrum chosen as a micrograph',
        () => ({ data: MONOLAYER_MOS2_RAMAN(), name: 'spectrum.csv' }),
        'micrograph',
        /text, not an image/,
      ],
      [
        'a PNG chosen as a Raman spectrum',
        () => ({ data: smallPng(), name: 'spectrum.png' }),
        'raman',
        /PNG image, but a raman spectrum/,
      ],
      [
        'a GIF image',
        () => ({
          data: Buffer.from('474946383961010001008000000000ffffff21f90401000000002c00000000010001000002024401003b', 'hex'),
          name: 'a.gif',
        }),
        'micrograph',
        /GIF image/,
      ],
      [
        'an unknown binary file',
        () => ({ data: Buffer.from([0x00, 0x01, 0x02, 0xfe, 0x80, 0x81, 0x00, 0x00, 0x10]), name: 'x.bin' }),
        'afm',
        /cannot tell what this file is/,
      ],
    ])('%s', async (_what, file, kind, message) => {
      const { agent, csrfToken, flake } = await researcherWithFlake();
      const response = await upload(agent, csrfToken, `/api/samples/${flake.code}/evidence`, file(), kind);
      expect(response.status).toBe(415);
      expect(response.body.error.code).toBe('file_type_mismatch');
      expect(response.body.error.message).toMatch(message);
      expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
      expect(filesUnder(blobDir())).toEqual([]);
    });
  });

  it('413 image_too_large from the header alone: an 80-megapixel PNG of a few bytes is refused without decoding', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const crafted = craftedPngHeader(10_000, 8_000);
    expect(crafted.length).toBeLessThan(100);
    const rssBefore = process.memoryUsage().rss;
    const response = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: crafted, name: 'huge.png', contentType: 'image/png' },
      'micrograph',
    );
    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('image_too_large');
    expect(response.body.error.message).toMatch(/10000 × 8000 pixels \(80\.0 megapixels\).*50 megapixels/);
    // Decoding would have needed 320 MB for the pixels alone.
    expect(process.memoryUsage().rss - rssBefore).toBeLessThan(100 * 1024 * 1024);
    expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
  });

  it('422 image_corrupt for a JPEG cut short and a PNG with damaged data, storing nothing', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const jpeg = await encodeWithJimp(
      paintMicrograph({ width: 320, height: 240, substrate: SUBSTRATE, noise: 20 }),
      'image/jpeg',
    );
    const truncated = jpeg.subarray(0, Math.floor(jpeg.length / 2));
    const png = Buffer.from(smallPng());
    // Flip bytes inside the compressed pixel data (after the 8-byte signature and 25-byte IHDR chunk).
    for (let i = 60; i < 90; i += 1) png[i] ^= 0xff;
    for (const file of [
      { data: truncated, name: 'cut.jpg', contentType: 'image/jpeg' },
      { data: png, name: 'damaged.png', contentType: 'image/png' },
    ]) {
      const response = await upload(agent, csrfToken, `/api/samples/${flake.code}/evidence`, file, 'micrograph');
      expect({ name: file.name, status: response.status, code: response.body.error?.code }).toEqual({
        name: file.name,
        status: 422,
        code: 'image_corrupt',
      });
    }
    expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
    expect(filesUnder(blobDir())).toEqual([]);
  });

  describe('422 spectrum_invalid with a message naming the line', () => {
    const valid = MONOLAYER_MOS2_RAMAN().split('\n');
    const withLine = (index: number, line: string) => [...valid.slice(0, index), line, ...valid.slice(index + 1)].join('\n');
    it.each([
      ['text in a data row', withLine(40, '411.2,saturated'), /line 41/i],
      ['one column', valid.map((line) => line.split(',')[0]).join('\n'), /line \d+/i],
      ['a NaN', withLine(12, '303.0,NaN'), /line 13/i],
      // Row 31 jumps ahead to 330 cm⁻¹, so row 32 is the first that goes backwards.
      ['x values out of order', withLine(30, '330.0,150'), /line 32/i],
      ['a repeated x value', withLine(31, valid[30]), /line 32/i],
    ])('%s', async (_what, text, line) => {
      const { agent, csrfToken, flake } = await researcherWithFlake();
      const response = await upload(
        agent,
        csrfToken,
        `/api/samples/${flake.code}/evidence`,
        { data: text, name: 'raman.csv', contentType: 'text/csv' },
        'raman',
      );
      expect(response.status).toBe(422);
      expect(response.body.error.code).toBe('spectrum_invalid');
      expect(response.body.error.message).toMatch(line);
      expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
    });
  });

  it('413 payload_too_large for a spectrum over the spectrum limit', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const big = `# padding\n${'#'.repeat(SPECTRUM_MAX_BYTES)}\n${MONOLAYER_MOS2_RAMAN()}`;
    const response = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: big, name: 'big.csv' },
      'raman',
    );
    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('payload_too_large');
  });

  it('201 for a PNG micrograph: stored under its SHA-256 in ab/cd/ folders, with a ≤ 320 px PNG thumbnail and a history event', async () => {
    const { agent, csrfToken, flake, person } = await researcherWithFlake();
    const png = smallPng();
    const response = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: png, name: 'chip µ-scan 1.png', contentType: 'image/png' },
      'micrograph',
      {
        objectiveMagnification: 50,
        illumination: { kind: 'white' },
        exposureMs: 12,
      },
    );
    expect(response.status).toBe(201);
    const evidence = response.body.evidence as Evidence;
    expect(evidence).toMatchObject({
      kind: 'micrograph',
      sample: { code: flake.code },
      step: null,
      originalName: 'chip µ-scan 1.png',
      // Filled from the flake's record: Flakeline has data for MoS2, and its substrate is recorded.
      metadata: { objectiveMagnification: 50, material: 'MoS2', substrate: { kind: 'oxide-on-silicon', oxideThicknessNm: 285 } },
      estimate: null,
      createdBy: { id: person.id },
      version: 1,
      file: {
        sha256: sha256(png),
        byteSize: png.length,
        mediaType: 'image/png',
        widthPx: 640,
        heightPx: 480,
        url: `/api/files/${sha256(png)}`,
        thumbnailUrl: `/api/files/${sha256(png)}/thumbnail`,
      },
    });
    const stored = blobPath(sha256(png));
    expect(path.relative(blobDir(), stored)).toBe(path.join(sha256(png).slice(0, 2), sha256(png).slice(2, 4), sha256(png)));
    expect(sha256(readFileSync(stored))).toBe(sha256(png));
    expect(filesUnder(blobDir()).filter((file) => path.basename(file).startsWith('.'))).toEqual([]);

    const thumbnail = await agent
      .get(evidence.file.thumbnailUrl as string)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(thumbnail.status).toBe(200);
    expect(thumbnail.headers['content-type']).toBe('image/png');
    const decoded = PNG.sync.read(thumbnail.body as Buffer);
    expect(Math.max(decoded.width, decoded.height)).toBe(THUMBNAIL_MAX_EDGE_PX);
    expect(decoded.width / decoded.height).toBeCloseTo(640 / 480, 2);

    const events = await lab.knex('history_events').where({ type: 'evidence.added', subjectCode: flake.code });
    expect(events).toHaveLength(1);
    expect(events[0].payload).toMatchObject({ evidenceId: evidence.id, kind: 'micrograph', sha256: sha256(png) });
  });

  it('201 for JPEG and TIFF micrographs, typed from their content', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const image = paintMicrograph({ width: 400, height: 300, substrate: SUBSTRATE, noise: 4 });
    for (const [mime, name] of [
      ['image/jpeg', 'scan.jpeg'],
      ['image/tiff', 'scan.tif'],
    ] as const) {
      const data = await encodeWithJimp(image, mime);
      const response = await upload(agent, csrfToken, `/api/samples/${flake.code}/evidence`, { data, name }, 'micrograph');
      expect(response.status).toBe(201);
      expect(response.body.evidence.file).toMatchObject({ mediaType: mime, widthPx: 400, heightPx: 300, sha256: sha256(data) });
    }
  });

  it('201 for a Raman spectrum: analysed, and the flake’s layer call follows it', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const text = MONOLAYER_MOS2_RAMAN();
    const response = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: text, name: 'raman.csv', contentType: 'text/csv' },
      'raman',
      {
        laserNm: 532,
      },
    );
    expect(response.status).toBe(201);
    const evidence = response.body.evidence as Evidence;
    expect(evidence.file).toMatchObject({ mediaType: 'text/csv', widthPx: null, thumbnailUrl: null });
    expect(evidence.estimate).toMatchObject({ layers: 1, method: 'raman' });
    const sample = await agent.get(`/api/samples/${flake.code}`);
    expect(sample.body.sample.layerEstimate).toBe(1);
    const served = await agent.get(evidence.file.url);
    expect(served.status).toBe(200);
    expect(served.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(served.text).toBe(text);
  });

  it('201 for a PL spectrum in nm and an AFM profile, each analysed for its kind', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const pl = spectrumCsv({
      from: 550,
      to: 800,
      points: 500,
      peaks: [{ centre: 662, fwhm: 22, height: 5000 }],
      noise: 20,
      header: 'wavelength_nm\tcounts',
    }).replace(/,/g, '\t');
    const plResponse = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: pl, name: 'pl.txt', contentType: 'text/plain' },
      'pl',
      {
        laserNm: 532,
        xUnit: 'nm',
      },
    );
    expect(plResponse.status).toBe(201);
    expect(plResponse.body.evidence.file.mediaType).toBe('text/plain');
    expect(plResponse.body.evidence.analysis.pl.aExciton.energyEv).toBeCloseTo(1239.84 / 662, 2);

    const steps = ['x_um,height_nm'];
    for (let i = 0; i < 400; i += 1) {
      const x = (4 * i) / 399;
      steps.push(`${x.toFixed(4)},${(x > 2 ? 1.0 : 0.0) + 0.05 * Math.sin(i * 1.7)}`);
    }
    const afm = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: steps.join('\n'), name: 'profile.csv' },
      'afm',
      { offsetNm: 0.35 },
    );
    expect(afm.status).toBe(201);
    expect(afm.body.evidence.analysis.afm.steps.length).toBeGreaterThan(0);
  });

  it('the same content uploaded twice is stored once and not rewritten; each upload is its own evidence', async () => {
    const { agent, csrfToken, flake } = await researcherWithFlake();
    const png = smallPng();
    const first = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: png, name: 'one.png' },
      'micrograph',
    );
    const before = statSync(blobPath(sha256(png)));
    const second = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: png, name: 'two.png' },
      'micrograph',
    );
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(second.body.evidence.id).not.toBe(first.body.evidence.id);
    expect(second.body.evidence.file).toEqual(first.body.evidence.file);
    const after = statSync(blobPath(sha256(png)));
    expect({ ino: after.ino, mtimeMs: after.mtimeMs }).toEqual({ ino: before.ino, mtimeMs: before.mtimeMs });
    expect(await counts()).toEqual({ evidence: 2, storedFiles: 1 });
    // The file and its thumbnail, nothing else.
    expect(filesUnder(blobDir())).toHaveLength(2);
  });

  it('an upload cut off mid-way stores nothing: no rows, no blobs, no temporary files', async () => {
    const { flake, person } = await researcherWithFlake();
    const server = http.createServer(lab.app);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    try {
      // Sign in with plain requests to have the cookie and token for a raw socket.
      const csrf = await fetch(`${base}/api/auth/csrf`);
      const anonCookie = csrf.headers.getSetCookie()[0].split(';')[0];
      const signIn = await fetch(`${base}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', cookie: anonCookie, 'x-csrf-token': (await csrf.json()).csrfToken },
        body: JSON.stringify({ email: person.email, password: 'correct horse battery' }),
      });
      const cookie = signIn.headers.getSetCookie()[0].split(';')[0];
      const { csrfToken } = await signIn.json();

      const png = encodePng(paintMicrograph({ width: 800, height: 600, substrate: SUBSTRATE, noise: 30 }));
      const boundary = 'flakeline-test-boundary';
      const head = Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\nmicrograph\r\n` +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.png"\r\nContent-Type: image/png\r\n\r\n`,
      );
      const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
      /** Sends the upload over a raw socket; with `cutAfter`, the connection drops after that many file bytes. */
      const send = (cutAfter?: number) =>
        new Promise<number | 'cut'>((resolve) => {
          const request = http.request(`${base}/api/samples/${flake.code}/evidence`, {
            method: 'POST',
            headers: {
              cookie,
              'x-csrf-token': csrfToken,
              'content-type': `multipart/form-data; boundary=${boundary}`,
              'content-length': head.length + png.length + tail.length,
            },
          });
          request.on('response', (response) => {
            response.resume();
            resolve(response.statusCode ?? 0);
          });
          request.on('error', () => resolve('cut'));
          request.write(head);
          if (cutAfter === undefined) {
            request.end(Buffer.concat([png, tail]));
            return;
          }
          request.write(png.subarray(0, cutAfter), () => setTimeout(() => request.destroy(), 100));
        });

      expect(await send(Math.floor(png.length / 3))).toBe('cut');
      // Give the server a moment to notice the reset and unwind.
      await new Promise((resolve) => setTimeout(resolve, 300));
      expect(await counts()).toEqual({ evidence: 0, storedFiles: 0 });
      expect(filesUnder(blobDir())).toEqual([]);

      // The same request sent whole is accepted: the cut, not the request, stored nothing.
      expect(await send()).toBe(201);
      expect(await counts()).toEqual({ evidence: 1, storedFiles: 1 });
    } finally {
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
  });
});

describe('POST /api/steps/:id/evidence and GET /api/steps/:id/evidence', () => {
  it('404 for an unknown step; 201 for a micrograph of a step, listed with the step', async () => {
    const { agent, csrfToken, person } = await researcherWithFlake();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'MoS2' });
    const step = await insertStep(
      lab.knex,
      person,
      stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }),
    );
    const missing = await upload(
      agent,
      csrfToken,
      `/api/steps/${step.id + 1000}/evidence`,
      { data: smallPng(), name: 'a.png' },
      'micrograph',
    );
    expect(missing.status).toBe(404);
    const response = await upload(
      agent,
      csrfToken,
      `/api/steps/${step.id}/evidence`,
      { data: smallPng(), name: 'tape.png' },
      'micrograph',
    );
    expect(response.status).toBe(201);
    expect(response.body.evidence).toMatchObject({ sample: null, step: { id: step.id, type: 'exfoliation' } });
    const listed = await agent.get(`/api/steps/${step.id}/evidence`);
    expect(listed.status).toBe(200);
    expect(listed.body.evidence.map((item: Evidence) => item.id)).toEqual([response.body.evidence.id]);
  });
});

describe('GET /api/files/:sha256 and /thumbnail', () => {
  async function uploaded() {
    const session = await researcherWithFlake();
    const png = smallPng();
    const response = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${session.flake.code}/evidence`,
      { data: png, name: 'flake 7 (50×).png' },
      'micrograph',
    );
    expect(response.status).toBe(201);
    return { ...session, png, evidence: response.body.evidence as Evidence };
  }

  it('401 when signed out; 422 for a malformed checksum; 404 for an unknown one', async () => {
    const { evidence } = await uploaded();
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(evidence.file.url)).status).toBe(401);
    const reader = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent: reviewer } = await signedInAgent(lab.app, reader.email);
    expect((await reviewer.get('/api/files/not-a-checksum')).status).toBe(422);
    expect((await reviewer.get('/api/files/../../etc/passwd')).status).toBe(404);
    const unknown = await reviewer.get(`/api/files/${'0'.repeat(64)}`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
  });

  it('200 with the exact bytes, its type, nosniff, and an inline or attachment disposition with the original name', async () => {
    const { evidence, png } = await uploaded();
    const reviewer = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent } = await signedInAgent(lab.app, reviewer.email);
    const response = await agent.get(evidence.file.url).buffer(true);
    expect(response.status).toBe(200);
    expect(Buffer.compare(response.body as Buffer, png)).toBe(0);
    expect(response.headers['content-type']).toBe('image/png');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-disposition']).toBe(
      `inline; filename="flake 7 (50_).png"; filename*=UTF-8''${encodeURIComponent('flake 7 (50×).png')}`,
    );
    const download = await agent.get(`${evidence.file.url}?download=true`);
    expect(download.headers['content-disposition']).toMatch(/^attachment; /);
  });

  it('409 file_altered as JSON, never the bytes, once the stored file no longer matches its checksum; the same for the thumbnail', async () => {
    const { agent, csrfToken, flake, evidence, png } = await uploaded();
    const stored = blobPath(evidence.file.sha256);
    const tampered = Buffer.from(png);
    tampered[tampered.length - 20] ^= 0x01;
    writeFileSync(stored, tampered);

    const response = await agent.get(evidence.file.url);
    expect(response.status).toBe(409);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.body.error.code).toBe('file_altered');
    expect(response.headers['content-disposition']).toBeUndefined();

    const store = createFileStore(lab.config.storage);
    expect(await store.verify(evidence.file.sha256)).toBe('altered');
    await expect(store.read(evidence.file.sha256)).rejects.toMatchObject({ code: 'file_altered', status: 409 });

    const thumbnailSha = (await lab.knex('stored_files').where({ sha256: evidence.file.sha256 }).first()).thumbnailSha256;
    writeFileSync(blobPath(thumbnailSha), Buffer.from('not the thumbnail'));
    const thumbnail = await agent.get(evidence.file.thumbnailUrl as string);
    expect(thumbnail.status).toBe(409);
    expect(thumbnail.body.error.code).toBe('file_altered');

    // Re-analysing from an altered file is refused too.
    const contrast = await agent
      .post(`/api/evidence/${evidence.id}/contrast`)
      .set('x-csrf-token', csrfToken)
      .send({
        flakeRegion: { shape: 'box', x: 10, y: 10, width: 20, height: 20 },
        substrateRegion: { shape: 'box', x: 100, y: 100, width: 20, height: 20 },
      });
    expect(contrast.body.error.code).toBe('file_altered');

    // Uploading the original again repairs the stored copy.
    const again = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: png, name: 'again.png' },
      'micrograph',
    );
    expect(again.status).toBe(201);
    expect(await store.verify(evidence.file.sha256)).toBe('intact');
    expect((await agent.get(evidence.file.url)).status).toBe(200);
  });

  it('409 file_missing when the stored file is gone', async () => {
    const { agent, evidence } = await uploaded();
    rmSync(blobPath(evidence.file.sha256));
    const response = await agent.get(evidence.file.url);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('file_missing');
    expect(await createFileStore(lab.config.storage).verify(evidence.file.sha256)).toBe('missing');
  });
});
