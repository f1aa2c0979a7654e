import { CHECK_SYMBOLS } from '../../shared/codes';
import type { Role } from '../../shared/roles';
import type { Box, SampleLocation } from '../../shared/schemas/storage';
import { buildPerson } from '../helpers/factories';
import { codeWithBody, insertSample } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { boxInput, insertBox, insertPlace, putAway } from '../helpers/storage-factories';
import { resetDatabase, startTestApp, testAdminKnex, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

/** Crockford Base32 body and check symbol after the box prefix. */
const BOX_CODE = /^BX-[0-9A-HJKMNP-TV-Z]{6}[0-9A-HJKMNP-TV-Z*~$=U]$/;

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}
type Session = Awaited<ReturnType<typeof signedIn>>;

/** The same code with a different check symbol (never one that folds back to the right one). */
function withWrongCheckSymbol(code: string): string {
  const check = code[code.length - 1];
  return code.slice(0, -1) + CHECK_SYMBOLS[(CHECK_SYMBOLS.indexOf(check) + 1) % CHECK_SYMBOLS.length];
}

const locationPath = (code: string) => `/api/samples/${encodeURIComponent(code)}/location`;

const put = (session: Pick<Session, 'agent' | 'csrfToken'>, code: string, body: object) =>
  session.agent.put(locationPath(code)).set('x-csrf-token', session.csrfToken).send(body);

const takeOut = (session: Pick<Session, 'agent' | 'csrfToken'>, code: string) =>
  session.agent.delete(locationPath(code)).set('x-csrf-token', session.csrfToken);

async function movesOf(code: string): Promise<{ from: SampleLocation | null; to: SampleLocation | null }[]> {
  const rows = await lab.knex('history_events').where({ subjectCode: code, type: 'sample.moved' }).orderBy('id');
  return rows.map((row: { payload: { from: SampleLocation | null; to: SampleLocation | null } }) => row.payload);
}

async function boxDetail(session: Session, code: string): Promise<Box> {
  const response = await session.agent.get(`/api/boxes/${code}`);
  if (response.status !== 200) throw new Error(`Box detail failed: ${response.status} ${JSON.stringify(response.body)}`);
  return response.body.box as Box;
}

const occupantOf = (box: Box, slot: string) => box.slots.find((entry) => entry.slot === slot)?.sample?.code ?? null;

describe('GET /api/places', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/places');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('200 for a reviewer: every place with its full path and how many boxes it holds, in path order', async () => {
    const { agent } = await signedIn('reviewer');
    const room = await insertPlace(lab.knex, { name: 'Lab 2.14', kind: 'room' });
    const glovebox = await insertPlace(lab.knex, { name: 'Glovebox', kind: 'glovebox', parentId: room.id });
    const desiccator = await insertPlace(lab.knex, { name: 'Desiccator B', kind: 'desiccator', parentId: room.id });
    await insertBox(lab.knex, { placeId: desiccator.id });
    await insertBox(lab.knex, { placeId: desiccator.id });

    const response = await agent.get('/api/places');
    expect(response.status).toBe(200);
    expect(response.body.places).toEqual([
      { id: room.id, name: 'Lab 2.14', kind: 'room', parentId: null, path: 'Lab 2.14', note: null, boxCount: 0 },
      {
        id: desiccator.id,
        name: 'Desiccator B',
        kind: 'desiccator',
        parentId: room.id,
        path: 'Lab 2.14 › Desiccator B',
        note: null,
        boxCount: 2,
      },
      {
        id: glovebox.id,
        name: 'Glovebox',
        kind: 'glovebox',
        parentId: room.id,
        path: 'Lab 2.14 › Glovebox',
        note: null,
        boxCount: 0,
      },
    ]);
  });
});

describe('POST /api/places', () => {
  const post = (session: Pick<Session, 'agent' | 'csrfToken'>, body: object) =>
    session.agent.post('/api/places').set('x-csrf-token', session.csrfToken).send(body);

  it('401 unauthenticated when signed out', async () => {
    const response = await post(await anonymousAgent(lab.app), { name: 'Lab 2.14', kind: 'room' });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming an empty name and an unknown kind', async () => {
    const manager = await signedIn('manager');
    const response = await post(manager, { name: '  ', kind: 'attic' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['kind', 'name']);
  });

  it('422 validation_failed naming parentId when the parent place does not exist; nothing is stored', async () => {
    const manager = await signedIn('manager');
    const response = await post(manager, { name: 'Desiccator B', kind: 'desiccator', parentId: 999 });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['parentId']);
    expect(response.body.error.fields.parentId[0]).toContain('999');
    expect(await lab.knex('storage_places').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it.each(['reviewer', 'researcher'] as const)('403 forbidden for a %s', async (role) => {
    const response = await post(await signedIn(role), { name: 'Lab 2.14', kind: 'room' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('storage_places').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('409 conflict for a second place of the same name (any case) in the same parent', async () => {
    const manager = await signedIn('manager');
    const room = await insertPlace(lab.knex, { name: 'Lab 2.14', kind: 'room' });
    await insertPlace(lab.knex, { name: 'Desiccator B', kind: 'desiccator', parentId: room.id });
    const response = await post(manager, { name: 'desiccator b', kind: 'desiccator', parentId: room.id });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
  });

  it('201 with a room, then a desiccator inside it whose path is "Room › Desiccator"', async () => {
    const manager = await signedIn('manager');
    const room = await post(manager, { name: 'Lab 2.14', kind: 'room' });
    expect(room.status).toBe(201);
    expect(room.body.place).toMatchObject({ name: 'Lab 2.14', kind: 'room', parentId: null, path: 'Lab 2.14', boxCount: 0 });

    const desiccator = await post(manager, {
      name: ' Desiccator B ',
      kind: 'desiccator',
      parentId: room.body.place.id,
      note: 'Silica gel changed monthly',
    });
    expect(desiccator.status).toBe(201);
    expect(desiccator.body.place).toEqual({
      id: expect.any(Number),
      name: 'Desiccator B',
      kind: 'desiccator',
      parentId: room.body.place.id,
      path: 'Lab 2.14 › Desiccator B',
      note: 'Silica gel changed monthly',
      boxCount: 0,
    });
    // The same name is fine under another parent.
    const elsewhere = await post(manager, { name: 'Desiccator B', kind: 'desiccator' });
    expect(elsewhere.status).toBe(201);
    expect(elsewhere.body.place.path).toBe('Desiccator B');
  });
});

describe('GET /api/boxes', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/boxes');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('200 for a reviewer: every box by name, with its place path and how many slots are taken', async () => {
    const reviewer = await signedIn('reviewer');
    const owner = await buildPerson(lab.knex);
    const room = await insertPlace(lab.knex, { name: 'Lab 2.14', kind: 'room' });
    const fridge = await insertPlace(lab.knex, { name: 'Fridge', kind: 'fridge', parentId: room.id });
    const hbn = await insertBox(lab.knex, { name: 'hBN crystals', placeId: fridge.id, rows: 2, columns: 3 });
    const chips = await insertBox(lab.knex, { name: 'Chips to measure', rows: 4, columns: 5 });
    for (const slot of ['A1', 'A2']) {
      const sample = await insertSample(lab.knex, owner, { kind: 'crystal', material: 'hBN' });
      await putAway(lab.knex, owner, sample.code, hbn.code, slot);
    }

    const response = await reviewer.agent.get('/api/boxes');
    expect(response.status).toBe(200);
    expect(response.body.boxes).toEqual([
      {
        code: chips.code,
        name: 'Chips to measure',
        placeId: null,
        placePath: null,
        rows: 4,
        columns: 5,
        rowLabels: 'letters',
        columnLabels: 'numbers',
        occupied: 0,
      },
      {
        code: hbn.code,
        name: 'hBN crystals',
        placeId: fridge.id,
        placePath: 'Lab 2.14 › Fridge',
        rows: 2,
        columns: 3,
        rowLabels: 'letters',
        columnLabels: 'numbers',
        occupied: 2,
      },
    ]);
  });
});

describe('POST /api/boxes', () => {
  const post = (session: Pick<Session, 'agent' | 'csrfToken'>, body: object) =>
    session.agent.post('/api/boxes').set('x-csrf-token', session.csrfToken).send(body);

  it('401 unauthenticated when signed out', async () => {
    const response = await post(await anonymousAgent(lab.app), boxInput());
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('400 malformed_json for a body that is not JSON', async () => {
    const manager = await signedIn('manager');
    const response = await manager.agent
      .post('/api/boxes')
      .set('x-csrf-token', manager.csrfToken)
      .set('content-type', 'application/json')
      .send('{"name": "Chip box", "rows": ');
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('malformed_json');
  });

  it('422 validation_failed naming each bad field: empty name, no rows, 51 columns, unknown labels', async () => {
    const manager = await signedIn('manager');
    const response = await post(manager, { name: '', rows: 0, columns: 51, rowLabels: 'roman' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['columns', 'name', 'rowLabels', 'rows']);
  });

  it('422 validation_failed naming rows for 27 rows (they are lettered A–Z)', async () => {
    const response = await post(await signedIn('manager'), boxInput({ rows: 27 }));
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields)).toEqual(['rows']);
  });

  it('422 validation_failed naming columns for 27 lettered columns; 26 are fine', async () => {
    const manager = await signedIn('manager');
    const refused = await post(manager, boxInput({ columns: 27, columnLabels: 'letters' }));
    expect(refused.status).toBe(422);
    expect(refused.body.error.code).toBe('validation_failed');
    expect(Object.keys(refused.body.error.fields)).toEqual(['columns']);
    expect(await lab.knex('boxes').count({ count: '*' }).first()).toEqual({ count: 0 });
    const accepted = await post(manager, boxInput({ rows: 2, columns: 26, rowLabels: 'numbers', columnLabels: 'letters' }));
    expect(accepted.status).toBe(201);
    expect(accepted.body.box.slots.at(-1).slot).toBe('2Z');
  });

  it('422 validation_failed naming placeId when the place does not exist', async () => {
    const response = await post(await signedIn('manager'), boxInput({ placeId: 424242 }));
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields)).toEqual(['placeId']);
    expect(await lab.knex('boxes').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it.each(['reviewer', 'researcher'] as const)('403 forbidden for a %s; nothing is stored', async (role) => {
    const response = await post(await signedIn(role), boxInput());
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('boxes').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('201 with a checked BX code and a 4 × 5 grid of 20 empty slots, A1 … D5 in reading order', async () => {
    const manager = await signedIn('manager');
    const desiccator = await insertPlace(lab.knex, { name: 'Desiccator B', kind: 'desiccator' });
    const response = await post(manager, {
      name: 'Exfoliated chips, Nov',
      placeId: desiccator.id,
      rows: 4,
      columns: 5,
      note: 'Chip tray with a soft gel bed',
    });
    expect(response.status).toBe(201);
    const box = response.body.box as Box;
    expect(box.code).toMatch(BOX_CODE);
    expect(box).toMatchObject({
      name: 'Exfoliated chips, Nov',
      placeId: desiccator.id,
      placePath: 'Desiccator B',
      rows: 4,
      columns: 5,
      rowLabels: 'letters',
      columnLabels: 'numbers',
      occupied: 0,
      note: 'Chip tray with a soft gel bed',
    });
    // prettier-ignore
    expect(box.slots.map((slot) => slot.slot)).toEqual([
      'A1', 'A2', 'A3', 'A4', 'A5',
      'B1', 'B2', 'B3', 'B4', 'B5',
      'C1', 'C2', 'C3', 'C4', 'C5',
      'D1', 'D2', 'D3', 'D4', 'D5',
    ]);
    expect(box.slots[7]).toEqual({ slot: 'B3', row: 2, column: 3, sample: null });
    expect(box.slots.every((slot) => slot.sample === null)).toBe(true);
  });

  it('201 with slots named "row-column" when both axes are numbered', async () => {
    const response = await post(await signedIn('manager'), boxInput({ rows: 3, columns: 8, rowLabels: 'numbers' }));
    expect(response.status).toBe(201);
    const names = (response.body.box as Box).slots.map((slot) => slot.slot);
    expect(names).toHaveLength(24);
    expect(names.slice(0, 3)).toEqual(['1-1', '1-2', '1-3']);
    expect(names[14]).toBe('2-7');
    expect(names.at(-1)).toBe('3-8');
  });

  it('201 gives every box its own code', async () => {
    const manager = await signedIn('manager');
    const codes = [];
    for (let i = 0; i < 8; i += 1) codes.push((await post(manager, boxInput())).body.box.code);
    expect(new Set(codes).size).toBe(8);
    for (const code of codes) expect(code).toMatch(BOX_CODE);
  });
});

describe('GET /api/boxes/:code', () => {
  it('401 unauthenticated when signed out', async () => {
    const box = await insertBox(lab.knex);
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get(`/api/boxes/${box.code}`);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 code_typo for a box code whose check symbol is wrong', async () => {
    const reviewer = await signedIn('reviewer');
    const box = await insertBox(lab.knex);
    const response = await reviewer.agent.get(`/api/boxes/${withWrongCheckSymbol(box.code)}`);
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('code_typo');
  });

  it('404 not_found naming the code for a well-formed box code nobody has', async () => {
    const reviewer = await signedIn('reviewer');
    const unknown = codeWithBody('BX', '7Q3M0K');
    const response = await reviewer.agent.get(`/api/boxes/${unknown}`);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    expect(response.body.error.message).toContain(unknown);
  });

  it('404 not_found for a sample code: a sample is not a box', async () => {
    const reviewer = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, reviewer.person);
    const response = await reviewer.agent.get(`/api/boxes/${sample.code}`);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('200 for a box code typed in lower case, without the hyphen: each slot and what sits in it', async () => {
    const reviewer = await signedIn('reviewer');
    const room = await insertPlace(lab.knex, { name: 'Lab 2.14', kind: 'room' });
    const box = await insertBox(lab.knex, { name: 'Devices to bond', placeId: room.id, rows: 2, columns: 2 });
    const device = await insertSample(lab.knex, reviewer.person, {
      kind: 'device',
      material: 'graphene/hBN',
      name: 'Hall bar 3',
    });
    await putAway(lab.knex, reviewer.person, device.code, box.code, 'B1');

    const response = await reviewer.agent.get(`/api/boxes/${box.code.toLowerCase().replace('-', '')}`);
    expect(response.status).toBe(200);
    expect(response.body.box).toEqual({
      code: box.code,
      name: 'Devices to bond',
      placeId: room.id,
      placePath: 'Lab 2.14',
      rows: 2,
      columns: 2,
      rowLabels: 'letters',
      columnLabels: 'numbers',
      occupied: 1,
      note: null,
      slots: [
        { slot: 'A1', row: 1, column: 1, sample: null },
        { slot: 'A2', row: 1, column: 2, sample: null },
        {
          slot: 'B1',
          row: 2,
          column: 1,
          sample: {
            code: device.code,
            kind: 'device',
            material: 'graphene/hBN',
            name: 'Hall bar 3',
            status: 'ready',
            layerEstimate: null,
          },
        },
        { slot: 'B2', row: 2, column: 2, sample: null },
      ],
    });
  });
});

describe('GET /api/samples/:code/location', () => {
  it('401 unauthenticated when signed out', async () => {
    const owner = await buildPerson(lab.knex);
    const sample = await insertSample(lab.knex, owner);
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get(locationPath(sample.code));
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 code_typo for a sample code whose check symbol is wrong', async () => {
    const reviewer = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, reviewer.person);
    const response = await reviewer.agent.get(locationPath(withWrongCheckSymbol(sample.code)));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('code_typo');
  });

  it('404 not_found for a sample code nobody has', async () => {
    const reviewer = await signedIn('reviewer');
    const response = await reviewer.agent.get(locationPath(codeWithBody('FK', '4F7K2M')));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('200 with location null for a sample never put away, then the box, slot and place once it is', async () => {
    const reviewer = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, reviewer.person);
    expect((await reviewer.agent.get(locationPath(sample.code))).body).toEqual({ code: sample.code, location: null });

    const room = await insertPlace(lab.knex, { name: 'Lab 2.14', kind: 'room' });
    const glovebox = await insertPlace(lab.knex, { name: 'Glovebox', kind: 'glovebox', parentId: room.id });
    const box = await insertBox(lab.knex, { name: 'Air-sensitive flakes', placeId: glovebox.id });
    await putAway(lab.knex, reviewer.person, sample.code, box.code, 'C4');
    const response = await reviewer.agent.get(locationPath(sample.code.toLowerCase()));
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      code: sample.code,
      location: { boxCode: box.code, boxName: 'Air-sensitive flakes', slot: 'C4', placePath: 'Lab 2.14 › Glovebox' },
    });
  });
});

describe('PUT /api/samples/:code/location', () => {
  it('401 unauthenticated when signed out', async () => {
    const owner = await buildPerson(lab.knex);
    const sample = await insertSample(lab.knex, owner);
    const box = await insertBox(lab.knex);
    const response = await put(await anonymousAgent(lab.app), sample.code, { boxCode: box.code, slot: 'B3' });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('400 malformed_json for a body that is not JSON', async () => {
    const researcher = await signedIn();
    const sample = await insertSample(lab.knex, researcher.person);
    const response = await researcher.agent
      .put(locationPath(sample.code))
      .set('x-csrf-token', researcher.csrfToken)
      .set('content-type', 'application/json')
      .send('{"boxCode": ');
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('malformed_json');
  });

  it('422 validation_failed naming boxCode and slot when both are empty', async () => {
    const researcher = await signedIn();
    const sample = await insertSample(lab.knex, researcher.person);
    const response = await put(researcher, sample.code, { boxCode: ' ', slot: '' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['boxCode', 'slot']);
  });

  it.each(['E1', 'A6', 'Z9', '0-1', 'B3X'])(
    '422 validation_failed naming slot for "%s", which is not in a 4 × 5 box; nothing moves',
    async (slot) => {
      const researcher = await signedIn();
      const sample = await insertSample(lab.knex, researcher.person);
      const box = await insertBox(lab.knex, { name: 'Chip box 7', rows: 4, columns: 5 });
      const response = await put(researcher, sample.code, { boxCode: box.code, slot });
      expect(response.status).toBe(422);
      expect(response.body.error.code).toBe('validation_failed');
      expect(Object.keys(response.body.error.fields)).toEqual(['slot']);
      expect(response.body.error.fields.slot[0]).toContain('A1 to D5');
      expect(await lab.knex('sample_locations').count({ count: '*' }).first()).toEqual({ count: 0 });
      expect(await movesOf(sample.code)).toEqual([]);
    },
  );

  it('422 code_typo for a box code whose check symbol is wrong', async () => {
    const researcher = await signedIn();
    const sample = await insertSample(lab.knex, researcher.person);
    const box = await insertBox(lab.knex);
    const response = await put(researcher, sample.code, { boxCode: withWrongCheckSymbol(box.code), slot: 'B3' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('code_typo');
  });

  it('403 forbidden for a reviewer; nothing moves', async () => {
    const reviewer = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, reviewer.person);
    const box = await insertBox(lab.knex);
    const response = await put(reviewer, sample.code, { boxCode: box.code, slot: 'B3' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('sample_locations').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('404 not_found naming the box code when no box has it', async () => {
    const researcher = await signedIn();
    const sample = await insertSample(lab.knex, researcher.person);
    const unknown = codeWithBody('BX', 'H4RDQ2');
    const response = await put(researcher, sample.code, { boxCode: unknown, slot: 'B3' });
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    expect(response.body.error.message).toContain(unknown);
  });

  it('404 not_found for a sample code nobody has', async () => {
    const researcher = await signedIn();
    const box = await insertBox(lab.knex);
    const response = await put(researcher, codeWithBody('CH', '4F7K2M'), { boxCode: box.code, slot: 'B3' });
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('409 slot_taken naming the sample already in the slot; the newcomer stays where it was', async () => {
    const researcher = await signedIn();
    const box = await insertBox(lab.knex, { name: 'Chip box 7' });
    const first = await insertSample(lab.knex, researcher.person, { kind: 'chip', material: 'Si/SiO2' });
    const second = await insertSample(lab.knex, researcher.person, { kind: 'chip', material: 'Si/SiO2' });
    await put(researcher, first.code, { boxCode: box.code, slot: 'B3' }).expect(200);
    await put(researcher, second.code, { boxCode: box.code, slot: 'A1' }).expect(200);

    const response = await put(researcher, second.code, { boxCode: box.code, slot: 'b3' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('slot_taken');
    expect(response.body.error.message).toContain(first.code);
    expect(response.body.error.message).toContain('B3');
    const detail = await boxDetail(researcher, box.code);
    expect([occupantOf(detail, 'B3'), occupantOf(detail, 'A1')]).toEqual([first.code, second.code]);
    expect(await movesOf(second.code)).toHaveLength(1);
  });

  it('200 puts a sample in B3: its location shows in the answer, in the sample and in the box; one event from nowhere', async () => {
    const researcher = await signedIn();
    const manager = await signedIn('manager');
    const desiccator = await insertPlace(lab.knex, { name: 'Desiccator B', kind: 'desiccator' });
    const box = await insertBox(lab.knex, { name: 'Chip box 7', placeId: desiccator.id });
    const chip = await insertSample(lab.knex, manager.person, { kind: 'chip', material: 'Si/SiO2' });
    const where: SampleLocation = { boxCode: box.code, boxName: 'Chip box 7', slot: 'B3', placePath: 'Desiccator B' };

    const response = await put(researcher, chip.code, { boxCode: box.code.toLowerCase(), slot: 'b 3' });
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ code: chip.code, location: where });

    const sample = await researcher.agent.get(`/api/samples/${chip.code}`).expect(200);
    expect(sample.body.sample.location).toEqual(where);
    const detail = await boxDetail(researcher, box.code);
    expect(occupantOf(detail, 'B3')).toBe(chip.code);
    expect(detail.occupied).toBe(1);
    expect(detail.slots.filter((slot) => slot.sample !== null).map((slot) => slot.slot)).toEqual(['B3']);
    expect(await movesOf(chip.code)).toEqual([{ from: null, to: where }]);
    const [event] = await lab.knex('history_events').where({ subjectCode: chip.code, type: 'sample.moved' });
    expect(event.actorId).toBe(researcher.person.id);
  });

  it('200 moves a sample to another slot: B3 is free again, and exactly one sample.moved event has from and to', async () => {
    const researcher = await signedIn();
    const box = await insertBox(lab.knex, { name: 'Chip box 7' });
    const chip = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    await put(researcher, chip.code, { boxCode: box.code, slot: 'B3' }).expect(200);
    const before = await movesOf(chip.code);

    const response = await put(researcher, chip.code, { boxCode: box.code, slot: 'D5' });
    expect(response.status).toBe(200);
    expect(response.body.location.slot).toBe('D5');
    const moves = await movesOf(chip.code);
    expect(moves).toHaveLength(before.length + 1);
    expect(moves.at(-1)).toEqual({
      from: { boxCode: box.code, boxName: 'Chip box 7', slot: 'B3', placePath: null },
      to: { boxCode: box.code, boxName: 'Chip box 7', slot: 'D5', placePath: null },
    });
    const detail = await boxDetail(researcher, box.code);
    expect([occupantOf(detail, 'B3'), occupantOf(detail, 'D5')]).toEqual([null, chip.code]);
    // The freed slot takes another sample.
    const other = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    expect((await put(researcher, other.code, { boxCode: box.code, slot: 'B3' })).status).toBe(200);
  });

  it('200 moves a sample from one box into another; the first box no longer counts it', async () => {
    const manager = await signedIn('manager');
    const from = await insertBox(lab.knex, { name: 'Bench tray' });
    const to = await insertBox(lab.knex, { name: 'Long-term storage', rows: 9, columns: 9, rowLabels: 'numbers' });
    const flake = await insertSample(lab.knex, manager.person);
    await put(manager, flake.code, { boxCode: from.code, slot: 'A1' }).expect(200);

    const response = await put(manager, flake.code, { boxCode: to.code, slot: '9 9' });
    expect(response.status).toBe(200);
    expect(response.body.location).toEqual({ boxCode: to.code, boxName: 'Long-term storage', slot: '9-9', placePath: null });
    expect((await boxDetail(manager, from.code)).occupied).toBe(0);
    expect(occupantOf(await boxDetail(manager, to.code), '9-9')).toBe(flake.code);
    expect((await movesOf(flake.code)).at(-1)).toMatchObject({
      from: { boxCode: from.code, slot: 'A1' },
      to: { boxCode: to.code, slot: '9-9' },
    });
  });

  it('200 putting a sample into the slot it is already in changes nothing and writes no event', async () => {
    const researcher = await signedIn();
    const box = await insertBox(lab.knex);
    const chip = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    await put(researcher, chip.code, { boxCode: box.code, slot: 'B3' }).expect(200);
    const eventCount = (await lab.knex('history_events').count({ count: '*' }).first())?.count;

    const response = await put(researcher, chip.code, { boxCode: box.code.toLowerCase(), slot: 'B-3' });
    expect(response.status).toBe(200);
    expect(response.body.location.slot).toBe('B3');
    expect((await lab.knex('history_events').count({ count: '*' }).first())?.count).toBe(eventCount);
    expect(await movesOf(chip.code)).toHaveLength(1);
  });

  it('two different samples put into the same free slot at once: exactly one 200 and one 409 slot_taken', async () => {
    const researcher = await signedIn();
    const manager = await signedIn('manager');
    const box = await insertBox(lab.knex);
    const first = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    const second = await insertSample(lab.knex, researcher.person, { kind: 'chip' });

    const responses = await Promise.all([
      put(researcher, first.code, { boxCode: box.code, slot: 'C2' }),
      put(manager, second.code, { boxCode: box.code, slot: 'C2' }),
    ]);
    expect(responses.map((response) => response.status).sort()).toEqual([200, 409]);
    const loser = responses.find((response) => response.status === 409);
    expect(loser?.body.error.code).toBe('slot_taken');
    const winner = responses.find((response) => response.status === 200)?.body.code as string;
    expect(occupantOf(await boxDetail(researcher, box.code), 'C2')).toBe(winner);
    expect(await lab.knex('sample_locations').count({ count: '*' }).first()).toEqual({ count: 1 });
    // Only the winner's move is in the history.
    const moved = await lab.knex('history_events').where({ type: 'sample.moved' }).select('subjectCode');
    expect(moved.map((row: { subjectCode: string }) => row.subjectCode)).toEqual([winner]);
  });

  it('the same race with both checks passing before either commits: the database index decides, one 200 and one 409', async () => {
    const researcher = await signedIn();
    const manager = await signedIn('manager');
    const box = await insertBox(lab.knex);
    const first = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    const second = await insertSample(lab.knex, researcher.person, { kind: 'chip' });

    // Hold every history write: each move gets as far as writing its event and waits there,
    // so neither has committed when the other looks whether C2 is free.
    const gate = await testAdminKnex().transaction();
    let responses;
    try {
      await gate.raw('lock table history_events in exclusive mode');
      const racing = Promise.all([
        put(researcher, first.code, { boxCode: box.code, slot: 'C2' }).then((response) => response),
        put(manager, second.code, { boxCode: box.code, slot: 'C2' }).then((response) => response),
      ]);
      // Wait (by asking the database, not by sleeping) until one move waits on the history
      // and the other waits on the first one's slot row.
      const deadline = Date.now() + 15_000;
      for (;;) {
        const waiting = await lab.knex.raw(
          "select wait_event from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'",
        );
        const events = waiting.rows.map((row: { waitEvent?: string; wait_event?: string }) => row.waitEvent ?? row.wait_event);
        if (events.includes('relation') && events.includes('transactionid')) break;
        if (Date.now() > deadline) throw new Error(`The two moves never met: waiting on ${JSON.stringify(events)}`);
      }
      await gate.commit();
      responses = await racing;
    } finally {
      if (!gate.isCompleted()) await gate.rollback();
    }

    expect(responses.map((response) => response.status).sort()).toEqual([200, 409]);
    const loser = responses.find((response) => response.status === 409);
    expect(loser?.body.error.code).toBe('slot_taken');
    expect(loser?.body.error.message).toContain('C2');
    const winner = responses.find((response) => response.status === 200)?.body.code as string;
    expect(occupantOf(await boxDetail(researcher, box.code), 'C2')).toBe(winner);
    expect(await lab.knex('sample_locations').count({ count: '*' }).first()).toEqual({ count: 1 });
    const moved = await lab.knex('history_events').where({ type: 'sample.moved' }).select('subjectCode');
    expect(moved.map((row: { subjectCode: string }) => row.subjectCode)).toEqual([winner]);
  });
});

describe('DELETE /api/samples/:code/location', () => {
  it('401 unauthenticated when signed out', async () => {
    const owner = await buildPerson(lab.knex);
    const sample = await insertSample(lab.knex, owner);
    const response = await takeOut(await anonymousAgent(lab.app), sample.code);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('403 forbidden for a reviewer; the sample stays in its slot', async () => {
    const reviewer = await signedIn('reviewer');
    const sample = await insertSample(lab.knex, reviewer.person);
    const box = await insertBox(lab.knex);
    await putAway(lab.knex, reviewer.person, sample.code, box.code, 'A1');
    const response = await takeOut(reviewer, sample.code);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(occupantOf(await boxDetail(reviewer, box.code), 'A1')).toBe(sample.code);
  });

  it('404 not_found for a sample code nobody has', async () => {
    const response = await takeOut(await signedIn(), codeWithBody('SK', '9Z0Q3T'));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('200 takes a sample out of its box: location null everywhere, the slot is free, one event to nowhere', async () => {
    const researcher = await signedIn();
    const box = await insertBox(lab.knex, { name: 'Chip box 7' });
    const chip = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    await put(researcher, chip.code, { boxCode: box.code, slot: 'B3' }).expect(200);

    const response = await takeOut(researcher, chip.code);
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ code: chip.code, location: null });
    expect((await researcher.agent.get(`/api/samples/${chip.code}`)).body.sample.location).toBeNull();
    expect((await researcher.agent.get(locationPath(chip.code))).body.location).toBeNull();
    expect(occupantOf(await boxDetail(researcher, box.code), 'B3')).toBeNull();
    expect(await movesOf(chip.code)).toEqual([
      { from: null, to: { boxCode: box.code, boxName: 'Chip box 7', slot: 'B3', placePath: null } },
      { from: { boxCode: box.code, boxName: 'Chip box 7', slot: 'B3', placePath: null }, to: null },
    ]);
  });

  it('200 for a sample that is in no box: location null, and no event', async () => {
    const researcher = await signedIn();
    const chip = await insertSample(lab.knex, researcher.person, { kind: 'chip' });
    const response = await takeOut(researcher, chip.code);
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ code: chip.code, location: null });
    expect(await movesOf(chip.code)).toEqual([]);
  });
});
