import { rmSync } from 'node:fs';
import type { FlakeMaterialId } from '../../shared/optics/materials';
import type { Evidence, EvidenceList, MicroscopeCalibration } from '../../shared/schemas/evidence';
import type { SampleProperties } from '../../shared/schemas/sample';
import type { UserModel } from '../../server/models/user-model';
import {
  encodePng,
  flakeColour,
  MONOLAYER_MOS2_RAMAN,
  paintMicrograph,
  type Patch,
  type Rgb,
  upload,
} from '../helpers/evidence-fixtures';
import { buildPerson } from '../helpers/factories';
import { insertSample } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp();
});
afterAll(() => lab.close());
beforeEach(async () => {
  await resetDatabase();
  rmSync((lab.config.storage as { dir: string }).dir, { recursive: true, force: true });
});

/**
 * The invented chip of these tests: MoS2 on 285 nm thermal oxide, pictured at 0.1 µm a pixel.
 * Flake colours come from Flakeline's own contrast prediction (checked against published values
 * in tests/unit/optics), so these tests check the plumbing: regions, storage, calls, lineage.
 */
const OXIDE = { kind: 'oxide-on-silicon' as const, oxideThicknessNm: 285 };
const CHIP_PROPERTIES: SampleProperties = { substrate: 'si_sio2', oxideThicknessNm: 285 };
const SUBSTRATE: Rgb = { red: 180, green: 140, blue: 210 };
const layersOf = (material: FlakeMaterialId, layers: number) => flakeColour(SUBSTRATE, { material, layers, substrate: OXIDE });

const MONOLAYER_PATCH: Patch = { x: 200, y: 150, width: 240, height: 160, colour: layersOf('MoS2', 1) };
const BILAYER_PATCH: Patch = { x: 540, y: 380, width: 120, height: 100, colour: layersOf('MoS2', 2) };
const UM_PER_PIXEL = 0.1;

const micrographPng = (patches: Patch[], seed = 3) =>
  encodePng(paintMicrograph({ width: 800, height: 600, substrate: SUBSTRATE, patches, noise: 2, seed }));

const box = (x: number, y: number, width: number, height: number) => ({ shape: 'box' as const, x, y, width, height });
/** Inside the monolayer patch, clear of its edges; and bare substrate to its left. */
const FLAKE_REGION = box(260, 190, 100, 80);
const SUBSTRATE_REGION = box(40, 190, 100, 80);

async function signedIn(role: 'researcher' | 'manager' | 'reviewer' = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

async function createCalibration(agent: Awaited<ReturnType<typeof signedIn>>) {
  const response = await agent.agent.post('/api/microscope-calibrations').set('x-csrf-token', agent.csrfToken).send({
    microscope: 'Upright microscope 2',
    objectiveMagnification: 50,
    umPerPixel: UM_PER_PIXEL,
    note: 'Stage micrometer, 10 µm divisions',
  });
  expect(response.status).toBe(201);
  return response.body.calibration as MicroscopeCalibration;
}

const insertFlake = (owner: UserModel, material = 'MoS2') =>
  insertSample(lab.knex, owner, { kind: 'flake', material, properties: CHIP_PROPERTIES });

describe('POST /api/evidence/:id/contrast', () => {
  async function flakeWithMicrograph(patches: Patch[] = [MONOLAYER_PATCH], material = 'MoS2', properties = CHIP_PROPERTIES) {
    const session = await signedIn();
    const flake = await insertSample(lab.knex, session.person, { kind: 'flake', material, properties });
    const response = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: micrographPng(patches), name: 'flake.png' },
      'micrograph',
      {
        objectiveMagnification: 50,
        illumination: { kind: 'white' },
      },
    );
    expect(response.status).toBe(201);
    return { ...session, flake, evidence: response.body.evidence as Evidence };
  }
  const contrast = (session: Awaited<ReturnType<typeof flakeWithMicrograph>>, body: object) =>
    session.agent.post(`/api/evidence/${session.evidence.id}/contrast`).set('x-csrf-token', session.csrfToken).send(body);

  it('401 when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.post('/api/evidence/1/contrast').set('x-csrf-token', csrfToken).send({});
    expect(response.status).toBe(401);
  });

  it('422 for a malformed region; 422 naming material and substrate when neither the evidence nor the sample gives them', async () => {
    // A material without optical data, and no substrate recorded on the flake or a parent.
    const session = await flakeWithMicrograph([MONOLAYER_PATCH], 'Bi2Se3', {});
    const malformed = await contrast(session, {
      flakeRegion: { shape: 'box', x: 1, y: 1, width: 0, height: 4 },
      substrateRegion: SUBSTRATE_REGION,
    });
    expect(malformed.status).toBe(422);
    expect(Object.keys(malformed.body.error.fields)).toEqual(['flakeRegion.width']);
    const unknown = await contrast(session, { flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(unknown.status).toBe(422);
    expect(Object.keys(unknown.body.error.fields).sort()).toEqual(['material', 'substrate']);
  });

  it('422 on a spectrum; 404 for unknown evidence; 403 for a reviewer', async () => {
    const session = await signedIn();
    const flake = await insertFlake(session.person);
    const raman = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: MONOLAYER_MOS2_RAMAN(), name: 'r.csv' },
      'raman',
    );
    const onSpectrum = await session.agent
      .post(`/api/evidence/${raman.body.evidence.id}/contrast`)
      .set('x-csrf-token', session.csrfToken)
      .send({ flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(onSpectrum.status).toBe(422);
    const unknown = await session.agent
      .post('/api/evidence/999999/contrast')
      .set('x-csrf-token', session.csrfToken)
      .send({ flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(unknown.status).toBe(404);
    const reviewer = await signedIn('reviewer');
    const refused = await reviewer.agent
      .post(`/api/evidence/${raman.body.evidence.id}/contrast`)
      .set('x-csrf-token', reviewer.csrfToken)
      .send({ flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(refused.status).toBe(403);
  });

  it('409 stale_version with the current item when the version sent is not the current one', async () => {
    const session = await flakeWithMicrograph();
    const response = await contrast(session, { version: 7, flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('stale_version');
    expect(response.body.current).toMatchObject({ id: session.evidence.id, version: 1 });
  });

  it('200: a monolayer patch and bare substrate give a one-layer call; the flake and the list filter follow', async () => {
    const session = await flakeWithMicrograph();
    const response = await contrast(session, { version: 1, flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(response.status).toBe(200);
    const evidence = response.body.evidence as Evidence;
    expect(evidence.version).toBe(2);
    expect(evidence.metadata).toMatchObject({
      flakeRegion: FLAKE_REGION,
      substrateRegion: SUBSTRATE_REGION,
      material: 'MoS2',
      substrate: OXIDE,
    });
    expect(evidence.analysis.contrast).toMatchObject({ bestLayers: 1, material: 'MoS2' });
    expect(evidence.estimate).toMatchObject({ layers: 1, method: 'optical_contrast' });

    const list = await session.agent.get(`/api/samples/${session.flake.code}/evidence`);
    expect(list.status).toBe(200);
    expect((list.body as EvidenceList).layerCall).toMatchObject({ layers: 1, status: 'single' });
    const oneLayer = await session.agent.get('/api/samples?kind=flake&layers=1');
    expect(oneLayer.body.samples.map((sample: { code: string }) => sample.code)).toEqual([session.flake.code]);
    const twoLayers = await session.agent.get('/api/samples?kind=flake&layers=2');
    expect(twoLayers.body.samples).toEqual([]);
    const events = await lab.knex('history_events').where({ type: 'evidence.analysed', subjectCode: session.flake.code });
    expect(events.map((event) => event.payload)).toEqual([
      expect.objectContaining({ evidenceId: evidence.id, what: 'contrast', layerCall: expect.objectContaining({ layers: 1 }) }),
    ]);
  });
});

describe('GET /api/samples/:code/evidence (combined layer call)', () => {
  it('422 for a malformed layers filter; 404 for an unknown sample', async () => {
    const session = await signedIn('reviewer');
    expect((await session.agent.get('/api/samples?layers=one')).status).toBe(422);
    expect((await session.agent.get('/api/samples?layers=0')).status).toBe(422);
    expect((await session.agent.get('/api/samples/FL-0000000/evidence')).status).not.toBe(200);
  });

  it('no evidence → no call; Raman 1 and contrast 2 → no call, with who says what in plain words', async () => {
    const session = await signedIn();
    const flake = await insertFlake(session.person);
    const empty = await session.agent.get(`/api/samples/${flake.code}/evidence`);
    expect(empty.body).toMatchObject({ evidence: [], layerCall: { layers: null, status: 'no_evidence' } });

    const raman = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: MONOLAYER_MOS2_RAMAN(), name: 'r.csv' },
      'raman',
    );
    expect(raman.body.evidence.estimate).toMatchObject({ layers: 1 });
    const bilayer: Patch = { ...MONOLAYER_PATCH, colour: layersOf('MoS2', 2) };
    const micrograph = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: micrographPng([bilayer]), name: 'm.png' },
      'micrograph',
      {
        flakeRegion: FLAKE_REGION,
        substrateRegion: SUBSTRATE_REGION,
      },
    );
    expect(micrograph.status).toBe(201);
    expect(micrograph.body.evidence.estimate).toMatchObject({ layers: 2, method: 'optical_contrast' });

    const list = await session.agent.get(`/api/samples/${flake.code}/evidence`);
    const { layerCall, evidence } = list.body as EvidenceList;
    expect(evidence.map((item) => item.kind)).toEqual(['micrograph', 'raman']);
    expect(layerCall).toMatchObject({ layers: null, status: 'disagreeing' });
    expect(layerCall.summary).toMatch(/Raman says 1.*contrast says 2/);
    const sample = await session.agent.get(`/api/samples/${flake.code}`);
    expect(sample.body.sample.layerEstimate).toBeNull();
  });
});

describe('PATCH /api/evidence/:id', () => {
  it('422 for metadata that breaks the kind’s rules; 409 stale_version; 200 re-analyses and bumps the version', async () => {
    const session = await signedIn();
    const flake = await insertFlake(session.person, 'unknown alloy');
    const raman = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: MONOLAYER_MOS2_RAMAN(), name: 'r.csv' },
      'raman',
    );
    expect(raman.status).toBe(201);
    const item = raman.body.evidence as Evidence;
    // The sample's material is not one Flakeline has rules for: no analysis yet, and it says why.
    expect(item.estimate).toBeNull();
    expect(item.analysis.notes).toEqual(['Name the material to get a layer call from this Raman spectrum.']);

    const patch = (body: object) =>
      session.agent.patch(`/api/evidence/${item.id}`).set('x-csrf-token', session.csrfToken).send(body);
    const bad = await patch({ version: 1, metadata: { material: 'unobtainium' } });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields)).toEqual(['metadata.material']);

    const edited = await patch({ version: 1, metadata: { material: 'MoS2', laserNm: 532 } });
    expect(edited.status).toBe(200);
    expect(edited.body.evidence).toMatchObject({
      version: 2,
      metadata: { material: 'MoS2', laserNm: 532 },
      estimate: { layers: 1, method: 'raman' },
    });
    expect((await session.agent.get(`/api/samples/${flake.code}`)).body.sample.layerEstimate).toBe(1);

    const stale = await patch({ version: 1, metadata: { material: 'WS2' } });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_version');
    expect(stale.body.current).toMatchObject({ version: 2, metadata: { material: 'MoS2' } });
    const events = await lab.knex('history_events').where({ type: 'evidence.edited' });
    expect(events).toHaveLength(1);
  });
});

describe('candidates on a chip micrograph, and a candidate made into a flake', () => {
  async function chipWithMicrograph(withCalibration: boolean) {
    const session = await signedIn();
    const chip = await insertSample(lab.knex, session.person, { kind: 'chip', material: 'MoS2', properties: CHIP_PROPERTIES });
    const calibration = withCalibration ? await createCalibration(session) : undefined;
    const response = await upload(
      session.agent,
      session.csrfToken,
      `/api/samples/${chip.code}/evidence`,
      { data: micrographPng([MONOLAYER_PATCH, BILAYER_PATCH]), name: 'chip.png' },
      'micrograph',
      {
        objectiveMagnification: 50,
        ...(calibration ? { calibrationId: calibration.id } : {}),
      },
    );
    expect(response.status).toBe(201);
    return { ...session, chip, calibration, evidence: response.body.evidence as Evidence };
  }

  it('ingest finds the monolayer (and the bilayer) on a chip with a calibration, with areas in µm²', async () => {
    const { evidence } = await chipWithMicrograph(true);
    expect(evidence.metadata).toMatchObject({
      umPerPixel: UM_PER_PIXEL,
      objectiveMagnification: 50,
      material: 'MoS2',
      substrate: OXIDE,
    });
    const found = evidence.analysis.candidates;
    expect(found).toBeDefined();
    const monolayer = found!.candidates.find((candidate) => candidate.layers === 1);
    expect(monolayer).toBeDefined();
    // 240 × 160 px at 0.1 µm a pixel is 384 µm²; the finder works on a coarser grid and trims edges.
    expect(monolayer!.areaUm2).toBeGreaterThan(0.8 * 384);
    expect(monolayer!.areaUm2).toBeLessThan(1.1 * 384);
    expect(monolayer!.centroidPx.x).toBeCloseTo(MONOLAYER_PATCH.x + MONOLAYER_PATCH.width / 2, -1);
    expect(monolayer!.centroidPx.y).toBeCloseTo(MONOLAYER_PATCH.y + MONOLAYER_PATCH.height / 2, -1);
    expect(found!.candidates.some((candidate) => candidate.layers === 2)).toBe(true);
  });

  it('without a calibration the finder says what it needs; POST candidates is 422 until one is named, then finds them', async () => {
    const session = await chipWithMicrograph(false);
    expect(session.evidence.analysis.candidates).toBeUndefined();
    expect(session.evidence.analysis.notes).toEqual(['The monolayer candidate finder needs a calibration (µm per pixel).']);
    const rerun = () =>
      session.agent.post(`/api/evidence/${session.evidence.id}/candidates`).set('x-csrf-token', session.csrfToken);
    const refused = await rerun();
    expect(refused.status).toBe(422);
    expect(refused.body.error.fields.metadata[0]).toMatch(/calibration/);

    const calibration = await createCalibration(session);
    const edited = await session.agent
      .patch(`/api/evidence/${session.evidence.id}`)
      .set('x-csrf-token', session.csrfToken)
      .send({ version: 1, metadata: { ...session.evidence.metadata, calibrationId: calibration.id } });
    expect(edited.status).toBe(200);
    expect(edited.body.evidence.analysis.candidates.candidates.length).toBeGreaterThan(0);
    const again = await rerun();
    expect(again.status).toBe(200);
    expect(again.body.evidence.version).toBe(3);
    expect(again.body.evidence.analysis.candidates.candidates).toEqual(edited.body.evidence.analysis.candidates.candidates);
  });

  it('404 for a candidate that is not there; 201 makes a flake from the chip (not used up), with the micrograph attached; 409 on a second tap; the micrograph lists it as made', async () => {
    const session = await chipWithMicrograph(true);
    const candidates = session.evidence.analysis.candidates!.candidates;
    const index = candidates.findIndex((candidate) => candidate.layers === 1);
    const make = (i: number) =>
      session.agent.post(`/api/evidence/${session.evidence.id}/candidates/${i}/flake`).set('x-csrf-token', session.csrfToken);

    const missing = await make(candidates.length);
    expect(missing.status).toBe(404);

    const made = await make(index);
    expect(made.status).toBe(201);
    const { sample, step, evidence } = made.body;
    expect(sample).toMatchObject({
      kind: 'flake',
      material: 'MoS2',
      status: 'ready',
      properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
    });
    expect(sample.parents.map((parent: { code: string }) => parent.code)).toEqual([session.chip.code]);
    expect(step).toMatchObject({
      type: 'flake_search',
      instrument: 'Upright microscope 2',
      parameters: { microscope: 'Upright microscope 2', objectiveMagnification: 50, evidenceId: session.evidence.id },
      inputs: [expect.objectContaining({ code: session.chip.code, consumed: false })],
      outputs: [expect.objectContaining({ code: sample.code })],
    });
    expect(evidence).toMatchObject({
      kind: 'micrograph',
      sample: { code: sample.code },
      file: session.evidence.file,
      metadata: { flakeRegion: { shape: 'box', ...candidates[index].boxPx }, umPerPixel: UM_PER_PIXEL },
      analysis: { fromCandidate: { evidenceId: session.evidence.id, index } },
      estimate: null,
    });
    const chip = await session.agent.get(`/api/samples/${session.chip.code}`);
    expect(chip.body.sample.status).toBe('ready');

    const twice = await make(index);
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toContain(sample.code);
    // The chip's micrograph now says which candidate became which flake, so the screen offers it no more.
    const source = await session.agent.get(`/api/evidence/${session.evidence.id}`);
    expect(source.body.evidence.candidateFlakes).toEqual([{ index, code: sample.code }]);
    expect(session.evidence.candidateFlakes).toEqual([]);

    // Marking bare substrate on the flake's copy of the micrograph gives it its call.
    const measured = await session.agent
      .post(`/api/evidence/${evidence.id}/contrast`)
      .set('x-csrf-token', session.csrfToken)
      .send({ flakeRegion: FLAKE_REGION, substrateRegion: SUBSTRATE_REGION });
    expect(measured.status).toBe(200);
    const flakeCall = await session.agent.get(`/api/samples/${sample.code}/evidence`);
    expect(flakeCall.body.layerCall).toMatchObject({ layers: 1 });
  });
});

describe('microscope calibrations', () => {
  it('401 signed out; 403 for a reviewer; 422 for a non-positive scale', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    expect((await agent.get('/api/microscope-calibrations')).status).toBe(401);
    const reviewer = await signedIn('reviewer');
    const refused = await reviewer.agent
      .post('/api/microscope-calibrations')
      .set('x-csrf-token', reviewer.csrfToken)
      .send({ microscope: 'M', objectiveMagnification: 50, umPerPixel: 0.1 });
    expect(refused.status).toBe(403);
    const researcher = await signedIn();
    const invalid = await researcher.agent
      .post('/api/microscope-calibrations')
      .set('x-csrf-token', researcher.csrfToken)
      .send({ microscope: ' ', objectiveMagnification: 50, umPerPixel: 0 });
    expect(invalid.status).toBe(422);
    expect(Object.keys(invalid.body.error.fields).sort()).toEqual(['microscope', 'umPerPixel']);
  });

  it('a recalibration retires the current one; retiring twice is 409; retired ones are listed on request', async () => {
    const session = await signedIn('manager');
    const first = await createCalibration(session);
    const second = await session.agent
      .post('/api/microscope-calibrations')
      .set('x-csrf-token', session.csrfToken)
      .send({ microscope: 'upright MICROSCOPE 2', objectiveMagnification: 50, umPerPixel: 0.098 });
    expect(second.status).toBe(201);
    const current = await session.agent.get('/api/microscope-calibrations');
    expect(current.body.calibrations.map((calibration: MicroscopeCalibration) => calibration.id)).toEqual([
      second.body.calibration.id,
    ]);
    const all = await session.agent.get('/api/microscope-calibrations?includeRetired=true');
    expect(all.body.calibrations).toEqual(
      expect.arrayContaining([expect.objectContaining({ id: first.id, retiredAt: expect.any(String) })]),
    );
    const retire = () =>
      session.agent
        .post(`/api/microscope-calibrations/${second.body.calibration.id}/retire`)
        .set('x-csrf-token', session.csrfToken);
    const retired = await retire();
    expect(retired.status).toBe(200);
    expect(retired.body.calibration.retiredAt).toEqual(expect.any(String));
    expect((await retire()).status).toBe(409);
    expect(
      (await session.agent.post('/api/microscope-calibrations/99999/retire').set('x-csrf-token', session.csrfToken)).status,
    ).toBe(404);
    const history = await lab
      .knex('history_events')
      .whereIn('type', ['calibration.created', 'calibration.retired'])
      .orderBy('id');
    expect(history.map((event) => event.type)).toEqual(['calibration.created', 'calibration.created', 'calibration.retired']);
  });
});
