import { CHECK_SYMBOLS, formatCode } from '../../shared/codes';
import type { Role } from '../../shared/roles';
import type { Sample } from '../../shared/schemas/sample';
import { buildPerson } from '../helpers/factories';
import {
  codeWithBody,
  crystalInput,
  insertSample,
  insertStep,
  outputCodes,
  registerCrystal,
  stepBody,
} from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

/** Crockford Base32 body and check symbol, as the brief for codes describes them. */
const CRYSTAL_CODE = /^CR-[0-9A-HJKMNP-TV-Z]{6}[0-9A-HJKMNP-TV-Z*~$=U]$/;

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

/** The same code with a different check symbol (never one that folds back to the right one). */
function withWrongCheckSymbol(code: string): string {
  const check = code[code.length - 1];
  const wrong = CHECK_SYMBOLS[(CHECK_SYMBOLS.indexOf(check) + 1) % CHECK_SYMBOLS.length];
  return code.slice(0, -1) + wrong;
}

const path = (code: string, suffix = '') => `/api/samples/${encodeURIComponent(code)}${suffix}`;

async function eventsOf(code: string) {
  return lab.knex('history_events').where({ subjectCode: code }).orderBy('id');
}

describe('POST /api/samples', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.post('/api/samples').set('x-csrf-token', csrfToken).send(crystalInput());
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming each bad field: unknown kind, empty material, negative oxide thickness', async () => {
    const { agent, csrfToken } = await signedIn();
    const response = await agent
      .post('/api/samples')
      .set('x-csrf-token', csrfToken)
      .send({ kind: 'wafer', material: '   ', properties: { substrate: 'si_sio2', oxideThicknessNm: -285 } });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['kind', 'material', 'properties.oxideThicknessNm']);
    expect(await lab.knex('samples').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('422 validation_failed for a property the schema does not know, a name too long and the status retired', async () => {
    const { agent, csrfToken } = await signedIn();
    const response = await agent
      .post('/api/samples')
      .set('x-csrf-token', csrfToken)
      .send(crystalInput({ name: 'x'.repeat(121), status: 'retired' as never, properties: { colour: 'grey' } as never }));
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['name', 'properties', 'status']);
  });

  it('403 forbidden for a reviewer; nothing is stored', async () => {
    const { agent, csrfToken } = await signedIn('reviewer');
    const response = await agent.post('/api/samples').set('x-csrf-token', csrfToken).send(crystalInput());
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('samples').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('201 with a new crystal: a checked CR code, owned by the caller, version 1, ready, made by no step', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const response = await agent
      .post('/api/samples')
      .set('x-csrf-token', csrfToken)
      .send({
        kind: 'crystal',
        material: '  MoS2 ',
        name: 'MoS2 natural crystal',
        note: 'From the mineral collection; cleaves easily',
        properties: { supplier: 'Mineral collection', growthMethod: 'natural' },
      });
    expect(response.status).toBe(201);
    const sample = response.body.sample as Sample;
    expect(sample.code).toMatch(CRYSTAL_CODE);
    expect(sample).toMatchObject({
      kind: 'crystal',
      material: 'MoS2',
      name: 'MoS2 natural crystal',
      note: 'From the mineral collection; cleaves easily',
      status: 'ready',
      owner: { id: person.id, displayName: person.displayName },
      properties: { supplier: 'Mineral collection', growthMethod: 'natural' },
      version: 1,
      retiredReason: null,
      madeBy: null,
      parents: [],
      children: [],
    });
    const fetched = await agent.get(path(sample.code));
    expect(fetched.body.sample).toEqual(sample);
  });

  it('201 ignores a code, owner or version the client tries to choose', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const other = await buildPerson(lab.knex);
    const chosen = codeWithBody('CR', '000001');
    const response = await agent
      .post('/api/samples')
      .set('x-csrf-token', csrfToken)
      .send({ ...crystalInput(), code: chosen, ownerId: other.id, version: 7 });
    expect(response.status).toBe(201);
    expect(response.body.sample.code).not.toBe(chosen);
    expect(response.body.sample.owner.id).toBe(person.id);
    expect(response.body.sample.version).toBe(1);
  });

  it('201 gives every sample its own code', async () => {
    const { agent, csrfToken } = await signedIn('manager');
    const codes = [];
    for (let i = 0; i < 12; i += 1) codes.push((await registerCrystal(agent, csrfToken)).code);
    expect(new Set(codes).size).toBe(codes.length);
    for (const code of codes) expect(code).toMatch(CRYSTAL_CODE);
  });
});

describe('GET /api/samples/:code', () => {
  it('401 unauthenticated when signed out', async () => {
    const { person } = await signedIn();
    const sample = await insertSample(lab.knex, person);
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get(path(sample.code));
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 code_typo for a code whose check symbol is wrong', async () => {
    const { person, agent } = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, person);
    const typo = withWrongCheckSymbol(sample.code);
    const response = await agent.get(path(typo));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('code_typo');
    expect(response.body.error.message).toContain(typo);
  });

  it('404 not_found naming the code, for a well-formed code nobody has', async () => {
    const { agent } = await signedIn('reviewer');
    const unknown = codeWithBody('CH', '4F7K2M');
    const response = await agent.get(path(unknown.toLowerCase()));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    expect(response.body.error.message).toContain(unknown);
  });

  it('404 not_found naming the text, for something that is not a code at all', async () => {
    const { agent } = await signedIn('reviewer');
    const response = await agent.get(path('XX-1234'));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    expect(response.body.error.message).toContain('XX-1234');
  });

  it.each([
    ['lower case', (code: string) => code.toLowerCase()],
    ['without the hyphen', (code: string) => code.replace('-', '')],
    ['with spaces', (code: string) => code.replace('-', ' ').replace(/(.{6})/, '$1 ')],
    ['O typed for 0', (code: string) => code.replace(/0/g, 'O')],
    ['I and l typed for 1', (code: string) => code.replace('1', 'I').replace(/1$/, 'l')],
    ['all of it at once', (code: string) => code.toLowerCase().replace('-', '').replace(/0/g, 'o').replace(/1/g, 'l')],
  ])('200 finds the same sample from its code typed %s', async (_variant, retype) => {
    const { person, agent } = await signedIn('reviewer');
    const code = codeWithBody('CR', '40K1M0');
    const sample = await insertSample(lab.knex, person, { kind: 'crystal', code });
    const typed = retype(code);
    expect(typed).not.toBe(code);
    const response = await agent.get(path(typed));
    expect(response.status).toBe(200);
    expect(response.body.sample.code).toBe(sample.code);
  });

  it('200 shows the step that made a sample, its parents and its children', async () => {
    const { person, agent } = await signedIn('reviewer');
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'hBN' });
    const step = await insertStep(
      lab.knex,
      person,
      stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 2 }] }),
    );
    const chips = await outputCodes(lab.knex, step.id);

    const chip = (await agent.get(path(chips[0]))).body.sample as Sample;
    expect(chip).toMatchObject({
      kind: 'chip',
      material: 'hBN',
      madeBy: { stepId: step.id, type: 'exfoliation', startedAt: '2026-12-03T09:30:00.000Z' },
      parents: [expect.objectContaining({ code: crystal.code, kind: 'crystal' })],
      children: [],
    });
    const parent = (await agent.get(path(crystal.code))).body.sample as Sample;
    expect(parent.children.map((child) => child.code)).toEqual([...chips].sort());
    expect(parent.parents).toEqual([]);
  });
});

describe('GET /api/samples', () => {
  const list = async (agent: Awaited<ReturnType<typeof signedIn>>['agent'], query: Record<string, string | number>) => {
    const response = await agent.get('/api/samples').query(query);
    if (response.status !== 200) throw new Error(`List failed: ${response.status} ${JSON.stringify(response.body)}`);
    return response.body as { samples: { code: string }[]; total: number; page: number; pageSize: number };
  };
  const codesOf = (page: { samples: { code: string }[] }) => page.samples.map((row) => row.code);

  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/samples');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming each bad filter', async () => {
    const { agent } = await signedIn('reviewer');
    const response = await agent.get('/api/samples').query({
      kind: 'chip,wafer',
      status: 'shelved',
      layersMin: 'few',
      createdFrom: 'last tuesday',
      sort: 'colour',
      order: 'sideways',
      page: '0',
      pageSize: '201',
    });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    const fields = Object.keys(response.body.error.fields).map((field) => field.split('.').slice(0, 2).join('.'));
    expect([...new Set(fields)].sort()).toEqual(
      [
        'query.createdFrom',
        'query.kind',
        'query.layersMin',
        'query.order',
        'query.page',
        'query.pageSize',
        'query.sort',
        'query.status',
      ].sort(),
    );
  });

  it('200 for a reviewer: every sample, newest first, with its owner', async () => {
    const { person, agent } = await signedIn('reviewer');
    const older = await insertSample(lab.knex, person, { createdAt: '2026-11-02T08:00:00Z' });
    const newer = await insertSample(lab.knex, person, { createdAt: '2026-11-03T08:00:00Z' });
    const page = await list(agent, {});
    expect(page).toMatchObject({ total: 2, page: 1, pageSize: 50 });
    expect(codesOf(page)).toEqual([newer.code, older.code]);
    expect(page.samples[0]).toMatchObject({
      code: newer.code,
      kind: 'flake',
      material: 'graphene',
      status: 'ready',
      owner: { id: person.id, displayName: person.displayName },
      createdAt: '2026-11-03T08:00:00.000Z',
    });
  });

  it('filters by kind and by status, each a comma list', async () => {
    const { person, agent } = await signedIn('reviewer');
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    const chip = await insertSample(lab.knex, person, { kind: 'chip', status: 'in_process' });
    const flake = await insertSample(lab.knex, person, { kind: 'flake', status: 'missing' });
    await insertSample(lab.knex, person, { kind: 'device', status: 'discarded' });

    expect(codesOf(await list(agent, { kind: 'crystal,chip', sort: 'code', order: 'asc' }))).toEqual(
      [crystal.code, chip.code].sort(),
    );
    expect(codesOf(await list(agent, { kind: 'flake' }))).toEqual([flake.code]);
    const byStatus = await list(agent, { status: 'in_process, missing', sort: 'code', order: 'asc' });
    expect(codesOf(byStatus)).toEqual([chip.code, flake.code].sort());
    expect(byStatus.total).toBe(2);
    expect(codesOf(await list(agent, { kind: 'chip', status: 'missing' }))).toEqual([]);
  });

  it('filters by material whatever its case, and by owner', async () => {
    const { person, agent } = await signedIn('reviewer');
    const colleague = await buildPerson(lab.knex);
    const mine = await insertSample(lab.knex, person, { material: 'MoS2' });
    const theirs = await insertSample(lab.knex, colleague, { material: 'mos2' });
    await insertSample(lab.knex, colleague, { material: 'MoSe2' });

    expect(codesOf(await list(agent, { material: 'MOS2', sort: 'code', order: 'asc' }))).toEqual([mine.code, theirs.code].sort());
    expect(codesOf(await list(agent, { ownerId: person.id }))).toEqual([mine.code]);
    expect(codesOf(await list(agent, { ownerId: colleague.id, material: 'mos2' }))).toEqual([theirs.code]);
  });

  it('filters by estimated layer count, both bounds included; samples without an estimate drop out', async () => {
    const { person, agent } = await signedIn('reviewer');
    const monolayer = await insertSample(lab.knex, person, { layerEstimate: 1 });
    const bilayer = await insertSample(lab.knex, person, { layerEstimate: 2 });
    const fewLayer = await insertSample(lab.knex, person, { layerEstimate: 5 });
    await insertSample(lab.knex, person, { layerEstimate: 40 });
    await insertSample(lab.knex, person);

    const sorted = { sort: 'code', order: 'asc' };
    expect(codesOf(await list(agent, { layersMin: 1, layersMax: 2, ...sorted }))).toEqual([monolayer.code, bilayer.code].sort());
    expect(codesOf(await list(agent, { layersMin: 2, layersMax: 5, ...sorted }))).toEqual([bilayer.code, fewLayer.code].sort());
    expect((await list(agent, { layersMin: 0 })).total).toBe(4);
    expect((await list(agent, { layersMax: 1.5 })).total).toBe(1);
  });

  it('filters by creation time, both bounds included', async () => {
    const { person, agent } = await signedIn('reviewer');
    await insertSample(lab.knex, person, { createdAt: '2026-10-31T23:59:59Z' });
    const first = await insertSample(lab.knex, person, { createdAt: '2026-11-01T00:00:00Z' });
    const middle = await insertSample(lab.knex, person, { createdAt: '2026-11-15T12:00:00Z' });
    const last = await insertSample(lab.knex, person, { createdAt: '2026-11-30T23:59:59Z' });
    await insertSample(lab.knex, person, { createdAt: '2026-12-01T00:00:00Z' });

    const november = await list(agent, { createdFrom: '2026-11-01T00:00:00Z', createdTo: '2026-11-30T23:59:59Z' });
    expect(codesOf(november)).toEqual([last.code, middle.code, first.code]);
    expect(codesOf(await list(agent, { createdFrom: '2026-11-15T13:00:00+01:00' }))).toHaveLength(3);
    expect(codesOf(await list(agent, { createdTo: '2026-11-01T01:00:00+01:00' }))).toHaveLength(2);
  });

  it('searches codes, names and notes for the text, ignoring case', async () => {
    const { person, agent } = await signedIn('reviewer');
    const byCode = await insertSample(lab.knex, person, { code: codeWithBody('FK', 'QZ7TXW'), name: 'Flake A' });
    const byName = await insertSample(lab.knex, person, { name: 'Twisted bilayer qz7tx candidate' });
    const byNote = await insertSample(lab.knex, person, { name: 'Flake C', note: 'Looks like QZ7TX under the microscope' });
    await insertSample(lab.knex, person, { name: 'Flake D', note: 'Nothing to see' });

    const found = await list(agent, { q: 'Qz7Tx', sort: 'code', order: 'asc' });
    expect(codesOf(found)).toEqual([byCode.code, byName.code, byNote.code].sort());
    expect(codesOf(await list(agent, { q: byCode.code.toLowerCase() }))).toEqual([byCode.code]);
  });

  it('takes % and _ in search text literally', async () => {
    const { person, agent } = await signedIn('reviewer');
    const percent = await insertSample(lab.knex, person, { name: 'Chip at 50% coverage' });
    await insertSample(lab.knex, person, { name: 'Chip at 500 coverage' });
    const underscore = await insertSample(lab.knex, person, { note: 'Batch w_2' });
    await insertSample(lab.knex, person, { note: 'Batch wx2' });

    expect(codesOf(await list(agent, { q: '50%' }))).toEqual([percent.code]);
    expect(codesOf(await list(agent, { q: '%' }))).toEqual([percent.code]);
    expect(codesOf(await list(agent, { q: 'w_2' }))).toEqual([underscore.code]);
  });

  it('sorts by each sort field, ascending or descending', async () => {
    const { person, agent } = await signedIn('reviewer');
    const a = await insertSample(lab.knex, person, {
      kind: 'stack',
      material: 'WSe2',
      status: 'ready',
      createdAt: '2026-11-01T00:00:00Z',
    });
    const b = await insertSample(lab.knex, person, {
      kind: 'chip',
      material: 'MoS2',
      status: 'missing',
      createdAt: '2026-11-03T00:00:00Z',
    });
    const c = await insertSample(lab.knex, person, {
      kind: 'film',
      material: 'graphene',
      status: 'in_process',
      createdAt: '2026-11-02T00:00:00Z',
    });

    expect(codesOf(await list(agent, { sort: 'material', order: 'asc' }))).toEqual([b.code, a.code, c.code]);
    expect(codesOf(await list(agent, { sort: 'material', order: 'desc' }))).toEqual([c.code, a.code, b.code]);
    expect(codesOf(await list(agent, { sort: 'kind', order: 'asc' }))).toEqual([b.code, c.code, a.code]);
    expect(codesOf(await list(agent, { sort: 'status', order: 'asc' }))).toEqual([c.code, b.code, a.code]);
    expect(codesOf(await list(agent, { sort: 'createdAt', order: 'asc' }))).toEqual([a.code, c.code, b.code]);
    expect(codesOf(await list(agent, { sort: 'code', order: 'desc' }))).toEqual([a.code, b.code, c.code].sort().reverse());
  });

  it('sorts by last change', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const first = await insertSample(lab.knex, person);
    const second = await insertSample(lab.knex, person);
    await agent.patch(path(first.code)).set('x-csrf-token', csrfToken).send({ version: 1, note: 'Imaged by AFM' }).expect(200);
    expect(codesOf(await list(agent, { sort: 'updatedAt', order: 'desc' }))).toEqual([first.code, second.code]);
    expect(codesOf(await list(agent, { sort: 'updatedAt', order: 'asc' }))).toEqual([second.code, first.code]);
  });

  it('pages without overlap or gaps, even among samples made at the same moment by one step', async () => {
    const { person, agent } = await signedIn('reviewer');
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'graphite' });
    await insertStep(
      lab.knex,
      person,
      stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 9 }] }),
    );

    const pages = [];
    for (let page = 1; page <= 4; page += 1) pages.push(await list(agent, { pageSize: 3, page }));
    expect(pages.map((page) => page.total)).toEqual([10, 10, 10, 10]);
    expect(pages.map((page) => page.samples.length)).toEqual([3, 3, 3, 1]);
    const seen = pages.flatMap(codesOf);
    expect(new Set(seen).size).toBe(10);
    const all = codesOf(await list(agent, { pageSize: 50 }));
    expect(seen).toEqual(all);
    expect((await list(agent, { pageSize: 3, page: 5 })).samples).toEqual([]);
  });
});

describe('PATCH /api/samples/:code', () => {
  it('401 unauthenticated when signed out', async () => {
    const { person } = await signedIn();
    const sample = await insertSample(lab.knex, person);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.patch(path(sample.code)).set('x-csrf-token', csrfToken).send({ version: 1, name: 'Mine now' });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming a missing version, an empty material and a status only retirement sets', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const sample = await insertSample(lab.knex, person);
    const response = await agent
      .patch(path(sample.code))
      .set('x-csrf-token', csrfToken)
      .send({ material: '', status: 'retired', properties: { flakeSizeUm: 0 } });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['material', 'properties.flakeSizeUm', 'status', 'version']);
  });

  it('403 forbidden for a reviewer; nothing changes', async () => {
    const { person, agent, csrfToken } = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, person);
    const response = await agent.patch(path(sample.code)).set('x-csrf-token', csrfToken).send({ version: 1, name: 'Renamed' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('samples').where({ id: sample.id }).first()).toMatchObject({ name: sample.name, version: 1 });
  });

  it('404 not_found for a code nobody has, and for a new owner who does not exist', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const sample = await insertSample(lab.knex, person);
    const unknownCode = await agent
      .patch(path(codeWithBody('FK', 'ZZZZZZ')))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, name: 'Renamed' });
    expect(unknownCode.status).toBe(404);
    expect(unknownCode.body.error.code).toBe('not_found');
    const unknownOwner = await agent
      .patch(path(sample.code))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, ownerId: 999_999 });
    expect(unknownOwner.status).toBe(404);
    expect(unknownOwner.body.error.code).toBe('not_found');
    expect(await lab.knex('samples').where({ id: sample.id }).first()).toMatchObject({ ownerId: person.id, version: 1 });
  });

  it('409 stale_version with the current record when someone else edited since; the late edit is not applied', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const colleague = await signedIn();
    const sample = await insertSample(lab.knex, person, { name: 'Flake 7' });
    await colleague.agent
      .patch(path(sample.code))
      .set('x-csrf-token', colleague.csrfToken)
      .send({ version: 1, name: 'Flake 7 (monolayer edge)' })
      .expect(200);

    const response = await agent.patch(path(sample.code)).set('x-csrf-token', csrfToken).send({ version: 1, name: 'Flake 7b' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('stale_version');
    expect(response.body.current).toMatchObject({ code: sample.code, name: 'Flake 7 (monolayer edge)', version: 2 });
    expect(response.body.current).toEqual((await agent.get(path(sample.code))).body.sample);
    expect((await eventsOf(sample.code)).map((event) => event.type)).toEqual(['sample.created', 'sample.edited']);
  });

  it('409 for a retired sample: retired records are kept as they are', async () => {
    const { person } = await signedIn();
    const manager = await signedIn('manager');
    const sample = await insertSample(lab.knex, person);
    await manager.agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', manager.csrfToken)
      .send({ version: 1, reason: 'Duplicate record of the same flake' })
      .expect(200);

    const response = await manager.agent
      .patch(path(sample.code))
      .set('x-csrf-token', manager.csrfToken)
      .send({ version: 2, name: 'Revived', status: 'ready' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('stale_version');
    expect(response.body.current).toMatchObject({ code: sample.code, status: 'retired', version: 2 });
    expect(await lab.knex('samples').where({ id: sample.id }).first()).toMatchObject({ status: 'retired', name: sample.name });
  });

  it('200 applies the changes, bumps the version and records each changed field with its old and new value', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const colleague = await buildPerson(lab.knex);
    const sample = await insertSample(lab.knex, person, {
      kind: 'chip',
      material: 'graphene',
      name: 'Chip 12',
      note: null,
      properties: { substrate: 'si_sio2', oxideThicknessNm: 90 },
    });
    const response = await agent
      .patch(path(sample.code))
      .set('x-csrf-token', csrfToken)
      .send({
        version: 1,
        material: 'graphite',
        name: 'Chip 12',
        note: '  Thick flakes only ',
        ownerId: colleague.id,
        properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
      });
    expect(response.status).toBe(200);
    expect(response.body.sample).toMatchObject({
      material: 'graphite',
      name: 'Chip 12',
      note: 'Thick flakes only',
      owner: { id: colleague.id, displayName: colleague.displayName },
      properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
      version: 2,
    });

    const events = await eventsOf(sample.code);
    expect(events.map((event) => event.type)).toEqual(['sample.created', 'sample.edited']);
    expect(events[1]).toMatchObject({ actorId: person.id, subjectCode: sample.code, stepId: null });
    expect(events[1].payload).toEqual({
      version: 2,
      changes: {
        material: { from: 'graphene', to: 'graphite' },
        note: { from: null, to: 'Thick flakes only' },
        ownerId: { from: person.id, to: colleague.id },
        properties: {
          from: { substrate: 'si_sio2', oxideThicknessNm: 90 },
          to: { substrate: 'si_sio2', oxideThicknessNm: 285 },
        },
      },
    });
  });

  it('200 records a status change as its own event, besides the edit of other fields', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const sample = await insertSample(lab.knex, person, { name: 'Flake 3' });
    const response = await agent
      .patch(path(sample.code))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, status: 'missing', note: 'Not in box 4 since the move' });
    expect(response.status).toBe(200);
    expect(response.body.sample).toMatchObject({ status: 'missing', version: 2 });

    const events = await eventsOf(sample.code);
    expect(events.map((event) => [event.type, event.payload])).toEqual([
      ['sample.created', expect.anything()],
      ['sample.edited', { version: 2, changes: { note: { from: null, to: 'Not in box 4 since the move' } } }],
      ['sample.status_changed', { version: 2, from: 'ready', to: 'missing' }],
    ]);
  });

  it('200 clears a name or note with null', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const sample = await insertSample(lab.knex, person, { name: 'Flake 9', note: 'Tape residue' });
    const response = await agent.patch(path(sample.code)).set('x-csrf-token', csrfToken).send({ version: 1, note: null });
    expect(response.status).toBe(200);
    expect(response.body.sample).toMatchObject({ name: 'Flake 9', note: null, version: 2 });
  });

  it('200 for an edit that changes nothing: same version, no event', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const sample = await insertSample(lab.knex, person, { name: 'Flake 5', material: 'WS2' });
    const response = await agent
      .patch(path(sample.code))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, name: ' Flake 5 ', material: 'WS2', status: 'ready' });
    expect(response.status).toBe(200);
    expect(response.body.sample.version).toBe(1);
    expect((await eventsOf(sample.code)).map((event) => event.type)).toEqual(['sample.created']);
  });

  it('200 for saving a chip exactly as it was read: same version, no event', async () => {
    // A form sends back what GET returned. Properties are one JSON object; the order of its
    // keys carries no meaning, so resending them unchanged must not count as a change.
    const { person, agent, csrfToken } = await signedIn();
    const sample = await insertSample(lab.knex, person, {
      kind: 'chip',
      material: 'Si/SiO2',
      properties: { substrate: 'si_sio2', oxideThicknessNm: 285, chipWidthMm: 10, chipHeightMm: 10 },
    });
    const read = (await agent.get(path(sample.code))).body.sample as Sample;
    const response = await agent
      .patch(path(sample.code))
      .set('x-csrf-token', csrfToken)
      .send({ version: read.version, material: read.material, name: read.name, note: read.note, properties: read.properties });
    expect(response.status).toBe(200);
    expect((await eventsOf(sample.code)).map((event) => [event.type, event.payload])).toEqual([
      ['sample.created', expect.anything()],
    ]);
    expect(response.body.sample.version).toBe(1);
  });
});

describe('POST /api/samples/:code/retirement', () => {
  it('401 unauthenticated when signed out', async () => {
    const { person } = await signedIn();
    const sample = await insertSample(lab.knex, person);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: 'Broken' });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed when the reason is missing or too short', async () => {
    const { person, agent, csrfToken } = await signedIn('manager');
    const sample = await insertSample(lab.knex, person);
    const missing = await agent.post(path(sample.code, '/retirement')).set('x-csrf-token', csrfToken).send({ version: 1 });
    const blank = await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: '  ok  ' });
    for (const response of [missing, blank]) {
      expect(response.status).toBe(422);
      expect(response.body.error.code).toBe('validation_failed');
      expect(Object.keys(response.body.error.fields)).toEqual(['reason']);
    }
    expect(await lab.knex('samples').where({ id: sample.id }).first()).toMatchObject({ status: 'ready', version: 1 });
  });

  it.each(['researcher', 'reviewer'] as const)('403 forbidden for a %s; the sample stays as it was', async (role) => {
    const { person, agent, csrfToken } = await signedIn(role);
    const sample = await insertSample(lab.knex, person);
    const response = await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: 'Lost in the glovebox' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('samples').where({ id: sample.id }).first()).toMatchObject({ status: 'ready', retiredReason: null });
  });

  it('404 not_found for a code nobody has', async () => {
    const { agent, csrfToken } = await signedIn('manager');
    const response = await agent
      .post(path(formatCode('DV', 12_345), '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: 'Shorted gate' });
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('409 stale_version for an old version, and for a sample already retired', async () => {
    const { person, agent, csrfToken } = await signedIn('manager');
    const sample = await insertSample(lab.knex, person);
    await agent.patch(path(sample.code)).set('x-csrf-token', csrfToken).send({ version: 1, name: 'Renamed' }).expect(200);
    const stale = await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: 'Cracked during pick-up' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_version');
    expect(stale.body.current).toMatchObject({ name: 'Renamed', version: 2, status: 'ready' });

    await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 2, reason: 'Cracked during pick-up' })
      .expect(200);
    const again = await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 3, reason: 'Retiring twice' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('stale_version');
    expect(again.body.current).toMatchObject({ status: 'retired', retiredReason: 'Cracked during pick-up' });
  });

  it('200 for a manager: the sample is retired with its reason, kept, listed and recorded in the history', async () => {
    const { person, agent, csrfToken } = await signedIn('manager');
    const sample = await insertSample(lab.knex, person, { status: 'missing' });
    const response = await agent
      .post(path(sample.code, '/retirement'))
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: '  Not found in two inventories; written off  ' });
    expect(response.status).toBe(200);
    expect(response.body.sample).toMatchObject({
      code: sample.code,
      status: 'retired',
      retiredReason: 'Not found in two inventories; written off',
      version: 2,
    });

    const listed = await agent.get('/api/samples').query({ status: 'retired' });
    expect(listed.body.samples.map((row: { code: string }) => row.code)).toEqual([sample.code]);
    const events = await eventsOf(sample.code);
    expect(events.map((event) => event.type)).toEqual(['sample.created', 'sample.retired']);
    expect(events[1]).toMatchObject({
      actorId: person.id,
      payload: { version: 2, from: 'missing', reason: 'Not found in two inventories; written off' },
    });
  });
});
