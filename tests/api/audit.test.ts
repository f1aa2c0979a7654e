import { PNG } from 'pngjs';
import type { Role } from '../../shared/roles';
import type { AuditGap, AuditReport } from '../../shared/schemas/audit';
import { createFileStore } from '../../server/files/file-store';
import { localBlobStore } from '../../server/files/local-blob-store';
import type { SampleModel } from '../../server/models/sample-model';
import { buildPerson } from '../helpers/factories';
import { fakeFileBytes, insertDeepDevice, insertDevice, insertEvidence, monolayerLensInput } from '../helpers/device-factories';
import { insertSample, insertStep, outputCodes, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent, type Agent, type SessionAgent } from '../helpers/session-agent';
import { readPdf, type PdfPage } from '../helpers/storage-factories';
import { resetDatabase, startTestApp, testAdminKnex, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const files = () => createFileStore(lab.config.storage);
const path = (code: string, rest = '') => `/api/samples/${encodeURIComponent(code)}/audit${rest}`;
const sampleRow = async (code: string) => (await lab.knex('samples').where({ code }).first()) as SampleModel;

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

async function audit(session: SessionAgent, code: string): Promise<AuditReport> {
  const response = await session.agent.get(path(code));
  if (response.status !== 200) throw new Error(`Audit of ${code}: ${response.status} ${JSON.stringify(response.body)}`);
  return response.body.audit as AuditReport;
}

/** GET a binary answer as bytes. */
async function bytesOf(agent: Agent, url: string) {
  const response = await agent
    .get(url)
    .buffer(true)
    .parse((res, callback) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => callback(null, Buffer.concat(chunks)));
    });
  return { status: response.status, contentType: String(response.headers['content-type']), body: response.body as Buffer };
}

const pdfText = (pages: PdfPage[]) => pages.map((page) => page.texts.join('')).join('\n');
const gapKinds = (gaps: AuditGap[]) => gaps.map((entry) => `${entry.kind}:${entry.sampleCode ?? entry.stepId}`).sort();

/** A 48 × 32 grey-blue PNG, standing in for a micrograph thumbnail. */
function thumbnailPng(): Buffer {
  const png = new PNG({ width: 48, height: 32 });
  for (let at = 0; at < png.data.length; at += 4) png.data.set([120, 140, 180, 255], at);
  return PNG.sync.write(png);
}

describe('GET /api/samples/:code/audit', () => {
  it('401 for a signed-out caller', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(path(device))).status).toBe(401);
  });

  it('404 for an unknown record', async () => {
    const reviewer = await signedIn('reviewer');
    expect((await reviewer.agent.get(path('DV-000000'))).status).toBe(404);
  });

  it('ready: every step with operator and time, the flake with intact evidence, the chain intact', async () => {
    const researcher = await signedIn();
    const scene = await insertDevice(lab.knex, researcher.person);
    const evidence = await insertEvidence(lab.knex, {
      sample: await sampleRow(scene.flake),
      createdBy: researcher.person,
      kind: 'raman',
      layerCount: 1,
      files: files(),
    });
    await researcher.agent
      .put(`/api/samples/${encodeURIComponent(scene.device)}/lens-design`)
      .set('x-csrf-token', researcher.csrfToken)
      .send(monolayerLensInput());
    const reviewer = await signedIn('reviewer');
    const report = await audit(reviewer, scene.device);
    expect(report.verdict).toBe('ready');
    expect(report.gaps).toEqual([]);
    expect(report.records.map((record) => [record.code, record.generation, record.isSource])).toEqual([
      [scene.device, 0, false],
      [scene.flake, -1, false],
      [scene.crystal, -2, true],
    ]);
    expect(report.steps.map((step) => step.id)).toEqual([scene.exfoliationStepId, scene.lithographyStepId]);
    expect(report.steps[1]).toMatchObject({
      type: 'lithography',
      operator: { id: researcher.person.id },
      startedAt: '2026-12-03T13:00:00.000Z',
      endedAt: '2026-12-03T15:00:00.000Z',
      instrument: 'E-beam writer',
      inputCodes: [scene.flake],
      outputCodes: [scene.device],
      parameters: { resist: 'PMMA', doseUCPerCm2: 350 },
    });
    expect(report.evidence).toEqual([
      expect.objectContaining({
        id: evidence.id,
        sampleCode: scene.flake,
        layerCount: 1,
        layerMethod: 'raman',
        file: expect.objectContaining({ sha256: evidence.sha256, check: 'intact' }),
      }),
    ]);
    expect(report.files).toEqual({ checked: 1, intact: 1, missing: 0, altered: 0 });
    expect(report.chain).toMatchObject({ intact: true, firstBroken: null });
    expect(report.lensDesign).toMatchObject({ zoneCount: 97, wavelengthNm: 632.8 });
    expect(report.events.map((event) => event.type)).toEqual(
      expect.arrayContaining(['sample.created', 'step.logged', 'sample.used', 'lens_design.saved']),
    );
  });

  it('lists the gaps: a step with no operator, a flake with no evidence, disagreeing evidence, missing and altered files, an ancestor edited after the device', async () => {
    const researcher = await signedIn();
    const owner = researcher.person;
    const crystal = await insertSample(lab.knex, owner, { kind: 'crystal', material: 'WSe2' });
    const exfoliation = await insertStep(
      lab.knex,
      owner,
      stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'flake', count: 3 }] }),
    );
    const [bare, disputed, checked] = await outputCodes(lab.knex, exfoliation.id);
    const stacking = await insertStep(
      lab.knex,
      owner,
      stepBody('stacking', {
        inputs: [{ code: bare }, { code: disputed }, { code: checked }],
        outputs: [{ kind: 'stack', material: 'WSe2/hBN' }],
      }),
    );
    const [stack] = await outputCodes(lab.knex, stacking.id);
    const lithography = await insertStep(
      lab.knex,
      owner,
      stepBody('lithography', { inputs: [{ code: stack }], outputs: [{ kind: 'device' }] }),
    );
    const [device] = await outputCodes(lab.knex, lithography.id);

    const store = files();
    // Raman says one layer, the micrograph's contrast says two.
    await insertEvidence(lab.knex, {
      sample: await sampleRow(disputed),
      createdBy: owner,
      kind: 'raman',
      layerCount: 1,
      files: store,
    });
    await insertEvidence(lab.knex, {
      sample: await sampleRow(disputed),
      createdBy: owner,
      kind: 'micrograph',
      layerCount: 2,
      files: store,
    });
    const missing = await insertEvidence(lab.knex, {
      sample: await sampleRow(checked),
      createdBy: owner,
      kind: 'afm',
      layerCount: 1,
      files: store,
      stored: false,
    });
    const altered = await insertEvidence(lab.knex, {
      sample: await sampleRow(checked),
      createdBy: owner,
      kind: 'pl',
      layerCount: 1,
      files: store,
    });
    // Someone overwrites the stored bytes behind Flakeline's back.
    const storage = lab.config.storage;
    if (storage.backend !== 'local') throw new Error('The test app stores files locally.');
    await localBlobStore(storage.dir).put(altered.sha256, fakeFileBytes('something else entirely'));
    // The stacking step loses its operator (an imported or legacy record).
    await lab.knex('steps').where({ id: stacking.id }).update({ operatorId: null });
    // The crystal's note is edited after the device exists.
    const crystalNow = await researcher.agent.get(`/api/samples/${encodeURIComponent(crystal.code)}`);
    const edit = await researcher.agent
      .patch(`/api/samples/${encodeURIComponent(crystal.code)}`)
      .set('x-csrf-token', researcher.csrfToken)
      .send({ version: crystalNow.body.sample.version, note: 'Relabelled after the lens was made' });
    expect(edit.status).toBe(200);

    const report = await audit(await signedIn('reviewer'), device);
    expect(report.verdict).toBe('not_ready');
    expect(gapKinds(report.gaps)).toEqual(
      [
        `step_without_operator:${stacking.id}`,
        `no_thickness_evidence:${bare}`,
        `disagreeing_evidence:${disputed}`,
        `file_missing:${checked}`,
        `file_altered:${checked}`,
        `edited_after_device:${crystal.code}`,
      ].sort(),
    );
    const message = (kind: string) => report.gaps.find((entry) => entry.kind === kind)?.message;
    expect(message('disagreeing_evidence')).toMatch(/raman #\d+ says 1, micrograph #\d+ says 2/);
    expect(report.gaps.find((entry) => entry.kind === 'file_missing')?.evidenceId).toBe(missing.id);
    expect(report.files).toEqual({ checked: 4, intact: 2, missing: 1, altered: 1 });
    const editEvent = report.gaps.find((entry) => entry.kind === 'edited_after_device');
    expect(editEvent?.eventId).toEqual(expect.any(Number));
  });

  it('an ancestry with a gap still renders and names the record whose origin is unknown', async () => {
    const researcher = await signedIn();
    // A flake registered by hand: a flake comes from somewhere, but its parents are not logged.
    const orphan = await insertSample(lab.knex, researcher.person, { kind: 'flake', material: 'graphene' });
    const step = await insertStep(
      lab.knex,
      researcher.person,
      stepBody('lithography', { inputs: [{ code: orphan.code }], outputs: [{ kind: 'device' }] }),
    );
    const [device] = await outputCodes(lab.knex, step.id);
    const report = await audit(researcher, device);
    expect(report.gaps).toEqual(
      expect.arrayContaining([expect.objectContaining({ kind: 'ancestry_gap', sampleCode: orphan.code })]),
    );
    const pdf = await bytesOf(researcher.agent, path(device, '.pdf'));
    expect(pdf.status).toBe(200);
    const text = pdfText(readPdf(pdf.body));
    expect(text).toContain('Ancestry incomplete');
    expect(text).toContain(orphan.code);
    expect(text).toContain('no recorded parents');
  });

  it('reports a history chain altered behind the app', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    const victim = await lab.knex('history_events').orderBy('id').offset(1).first();
    await testAdminKnex().transaction(async (trx) => {
      await trx.raw('set local session_replication_role = replica');
      await trx('history_events')
        .where({ id: victim.id })
        .update({ body: victim.body.replace('"type"', '"type" ') });
    });
    const report = await audit(researcher, device);
    expect(report.chain).toMatchObject({ intact: false, firstBroken: { eventId: victim.id } });
    expect(report.gaps).toEqual(expect.arrayContaining([expect.objectContaining({ kind: 'chain_broken', eventId: victim.id })]));
  });
});

describe('GET /api/samples/:code/audit.pdf', () => {
  it('401 for a signed-out caller; 404 for an unknown record', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(path(device, '.pdf'))).status).toBe(401);
    const reviewer = await signedIn('reviewer');
    expect((await reviewer.agent.get(path('DV-000000', '.pdf'))).status).toBe(404);
  });

  it('a 30-generation, two-parent ancestry: the audit lists every ancestor exactly once, and the PDF names each', async () => {
    const researcher = await signedIn();
    const deep = await insertDeepDevice(lab.knex, researcher.person, 30);
    const reviewer = await signedIn('reviewer');

    const report = await audit(reviewer, deep.device);
    const listed = report.records.map((record) => record.code);
    expect(new Set(listed).size).toBe(listed.length);
    expect(listed.sort()).toEqual([...deep.ancestors, deep.device].sort());
    expect(
      report.records
        .filter((record) => record.isSource)
        .map((record) => record.code)
        .sort(),
    ).toEqual([...deep.crystals].sort());
    // 31 flakes without evidence are gaps; nothing else is.
    expect(new Set(report.gaps.map((entry) => entry.kind))).toEqual(new Set(['no_thickness_evidence']));
    expect(report.gaps).toHaveLength(31);

    const started = Date.now();
    const pdf = await bytesOf(reviewer.agent, path(deep.device, '.pdf'));
    const elapsedMs = Date.now() - started;
    expect(pdf.status).toBe(200);
    expect(pdf.contentType).toMatch(/^application\/pdf/);
    const pages = readPdf(pdf.body);
    const text = pdfText(pages);
    for (const code of [...deep.ancestors, deep.device]) expect(text).toContain(code);
    expect(text).toContain('Not ready to publish');
    expect(text).toContain(`Generation -${deep.depth}`);
    pages.forEach((page, index) => expect(page.texts.join('')).toContain(`page ${index + 1} of ${pages.length}`));
    // Size and time of a 30-generation audit, for the record (2 shared cores).
    process.stdout.write(`30-generation audit PDF: ${pages.length} pages, ${pdf.body.length} bytes, ${elapsedMs} ms\n`);
    expect(elapsedMs).toBeLessThan(15_000);
  });

  it('shows micrograph thumbnails and embeds its fonts', async () => {
    const researcher = await signedIn();
    const scene = await insertDevice(lab.knex, researcher.person);
    await insertEvidence(lab.knex, {
      sample: await sampleRow(scene.flake),
      createdBy: researcher.person,
      kind: 'micrograph',
      mediaType: 'image/png',
      layerCount: 1,
      bytes: thumbnailPng(),
      thumbnail: thumbnailPng(),
      files: files(),
    });
    const pdf = await bytesOf(researcher.agent, path(scene.device, '.pdf'));
    const pages = readPdf(pdf.body);
    const images = pages.reduce((sum, page) => sum + (page.operators.paintImageXObject ?? 0), 0);
    expect(images).toBe(1);
    expect(pdfText(pages)).toContain('Ready to publish');
    // Embedded TrueType subsets are written as /FontFile2 streams (ISO 32000-1, 9.9).
    expect(pdf.body.toString('latin1')).toMatch(/\/FontFile2/);
  });
});
