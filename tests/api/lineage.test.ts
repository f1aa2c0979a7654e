import type { Role } from '../../shared/roles';
import type { Lineage } from '../../shared/schemas/lineage';
import type { Sample } from '../../shared/schemas/sample';
import type { StepCreateInput } from '../../shared/schemas/step';
import { buildPerson } from '../helpers/factories';
import {
  codeWithBody,
  insertChain,
  insertLattice,
  insertSample,
  insertStep,
  outputCodes,
  rowCounts,
  stepBody,
} from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent, type SessionAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

async function lineage(session: SessionAgent, code: string, direction: 'ancestors' | 'descendants'): Promise<Lineage> {
  const response = await session.agent.get(`/api/samples/${encodeURIComponent(code)}/${direction}`);
  if (response.status !== 200) throw new Error(`${direction} of ${code}: ${response.status} ${JSON.stringify(response.body)}`);
  return response.body as Lineage;
}

const relativeCodes = (result: Lineage) => result.relatives.map((relative) => relative.code);
const byCode = (result: Lineage) => new Map(result.relatives.map((relative) => [relative.code, relative]));

/** The step that links `parent` to `child`, from the database. */
async function linkingStep(parent: string, child: string): Promise<number> {
  const row = await lab
    .knex('lineage_links as l')
    .join('samples as p', 'p.id', 'l.parent_id')
    .join('samples as c', 'c.id', 'l.child_id')
    .where({ 'p.code': parent, 'c.code': child })
    .first('l.step_id as stepId');
  if (!row) throw new Error(`No link ${parent} → ${child}`);
  return row.stepId;
}

const post = (session: SessionAgent, body: StepCreateInput) =>
  session.agent.post('/api/steps').set('x-csrf-token', session.csrfToken).send(body);

describe('GET /api/samples/:code/ancestors and /descendants', () => {
  it.each(['ancestors', 'descendants'])('401 unauthenticated for %s when signed out', async (direction) => {
    const person = await buildPerson(lab.knex);
    const flake = await insertSample(lab.knex, person);
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get(`/api/samples/${flake.code}/${direction}`);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it.each(['ancestors', 'descendants'])(
    '422 code_typo and 404 not_found for %s of a code with a typo or nobody has',
    async (direction) => {
      const { person, agent } = await signedIn('reviewer');
      const flake = await insertSample(lab.knex, person);
      const typo = flake.code.slice(0, -1) + (flake.code.endsWith('0') ? '1' : '0');
      const typoResponse = await agent.get(`/api/samples/${typo}/${direction}`);
      expect(typoResponse.status).toBe(422);
      expect(typoResponse.body.error.code).toBe('code_typo');
      const unknown = codeWithBody('FK', 'NQ8R3T');
      const unknownResponse = await agent.get(`/api/samples/${unknown}/${direction}`);
      expect(unknownResponse.status).toBe(404);
      expect(unknownResponse.body.error.code).toBe('not_found');
      expect(unknownResponse.body.error.message).toContain(unknown);
    },
  );

  it('200 with no relatives for a sample no step has touched', async () => {
    const session = await signedIn('reviewer');
    const crystal = await insertSample(lab.knex, session.person, { kind: 'crystal' });
    expect(await lineage(session, crystal.code.toLowerCase(), 'ancestors')).toEqual({
      code: crystal.code,
      direction: 'ancestors',
      relatives: [],
    });
    expect((await lineage(session, crystal.code, 'descendants')).relatives).toEqual([]);
  });

  it('200 lists every ancestor of a 30-generation chain exactly once, generations 1 to 30 in order, each with its step', async () => {
    const session = await signedIn('reviewer');
    const chain = await insertChain(lab.knex, session.person, 30);
    const leaf = chain[30];

    const result = await lineage(session, leaf, 'ancestors');
    expect(result.code).toBe(leaf);
    expect(result.direction).toBe('ancestors');
    expect(relativeCodes(result)).toEqual([...chain.slice(0, 30)].reverse());
    expect(result.relatives.map((relative) => relative.generation)).toEqual(Array.from({ length: 30 }, (_, i) => i + 1));
    for (const [index, relative] of result.relatives.entries()) {
      const child = chain[30 - index];
      expect(relative.links).toEqual([{ stepId: await linkingStep(relative.code, child), stepType: 'transfer', via: child }]);
    }
    expect(result.relatives[29]).toMatchObject({ code: chain[0], kind: 'flake', material: 'graphene', status: 'used_up' });
  });

  it('200 lists every descendant of the same chain, the mirror image of its ancestors', async () => {
    const session = await signedIn('reviewer');
    const chain = await insertChain(lab.knex, session.person, 30);

    const result = await lineage(session, chain[0], 'descendants');
    expect(relativeCodes(result)).toEqual(chain.slice(1));
    expect(result.relatives.map((relative) => relative.generation)).toEqual(Array.from({ length: 30 }, (_, i) => i + 1));
    for (const [index, relative] of result.relatives.entries()) {
      const parent = chain[index];
      expect(relative.links).toEqual([{ stepId: await linkingStep(parent, relative.code), stepType: 'transfer', via: parent }]);
    }

    const middle = chain[15];
    expect(relativeCodes(await lineage(session, middle, 'ancestors'))).toEqual(chain.slice(0, 15).reverse());
    expect(relativeCodes(await lineage(session, middle, 'descendants'))).toEqual(chain.slice(16));
  });

  it('200 lists each ancestor once in a 30-generation lattice with 3^30 paths from the roots to a leaf', async () => {
    const session = await signedIn('reviewer');
    const layers = await insertLattice(lab.knex, session.person, 30, 3);
    const leaf = layers[30][0];

    const result = await lineage(session, leaf, 'ancestors');
    expect(result.relatives).toHaveLength(90);
    expect(new Set(relativeCodes(result)).size).toBe(90);
    for (let generation = 1; generation <= 30; generation += 1) {
      const layer = layers[30 - generation];
      const atGeneration = result.relatives.filter((relative) => relative.generation === generation);
      expect(atGeneration.map((relative) => relative.code)).toEqual([...layer].sort());
      // A parent of the leaf links only to the leaf; further up, each links to all three samples below it.
      for (const relative of atGeneration) expect(relative.links).toHaveLength(generation === 1 ? 1 : 3);
    }

    const descendants = await lineage(session, layers[0][0], 'descendants');
    expect(descendants.relatives).toHaveLength(90);
    expect(Math.max(...descendants.relatives.map((relative) => relative.generation))).toBe(30);
  });

  describe('a diamond: one flake stacked into two stacks that are later joined into one device', () => {
    async function diamond(session: Awaited<ReturnType<typeof signedIn>>) {
      const owner = session.person;
      const flake = await insertSample(lab.knex, owner, { kind: 'flake', material: 'graphene', name: 'Large monolayer' });
      const hbnA = await insertSample(lab.knex, owner, { kind: 'flake', material: 'hBN', name: 'Bottom hBN A' });
      const hbnB = await insertSample(lab.knex, owner, { kind: 'flake', material: 'hBN', name: 'Bottom hBN B' });
      const stackOf = async (hbn: string) => {
        const step = await insertStep(
          lab.knex,
          owner,
          stepBody('stacking', {
            inputs: [{ code: hbn }, { code: flake.code }],
            outputs: [{ kind: 'stack', material: 'graphene/hBN' }],
          }),
        );
        return { step: step.id, code: (await outputCodes(lab.knex, step.id))[0] };
      };
      const left = await stackOf(hbnA.code);
      const right = await stackOf(hbnB.code);
      return { flake: flake.code, hbnA: hbnA.code, hbnB: hbnB.code, left, right };
    }

    it('200 joined by one step with both stacks as inputs: the flake is listed once, at generation 2, with both of its steps', async () => {
      const session = await signedIn();
      const { flake, hbnA, hbnB, left, right } = await diamond(session);
      const join = await insertStep(
        lab.knex,
        session.person,
        stepBody('metal_deposition', {
          inputs: [{ code: left.code }, { code: right.code }],
          outputs: [{ kind: 'device', name: 'Cross-stack junction' }],
        }),
      );
      const [device] = await outputCodes(lab.knex, join.id);

      const ancestors = await lineage(session, device, 'ancestors');
      expect(relativeCodes(ancestors).filter((code) => code === flake)).toHaveLength(1);
      expect(ancestors.relatives.map((relative) => [relative.code, relative.generation])).toEqual([
        ...[left.code, right.code].sort().map((code) => [code, 1]),
        ...[flake, hbnA, hbnB].sort().map((code) => [code, 2]),
      ]);
      const found = byCode(ancestors);
      expect(found.get(flake)?.links).toEqual([
        { stepId: left.step, stepType: 'stacking', via: left.code },
        { stepId: right.step, stepType: 'stacking', via: right.code },
      ]);
      expect(found.get(hbnA)?.links).toEqual([{ stepId: left.step, stepType: 'stacking', via: left.code }]);
      expect(found.get(left.code)?.links).toEqual([{ stepId: join.id, stepType: 'metal_deposition', via: device }]);

      const descendants = await lineage(session, flake, 'descendants');
      expect(descendants.relatives.map((relative) => [relative.code, relative.generation])).toEqual([
        ...[left.code, right.code].sort().map((code) => [code, 1]),
        [device, 2],
      ]);
      expect(byCode(descendants).get(device)?.links).toEqual(
        [left.code, right.code].sort().map((via) => ({ stepId: join.id, stepType: 'metal_deposition', via })),
      );
      expect(byCode(descendants).get(left.code)?.links).toEqual([{ stepId: left.step, stepType: 'stacking', via: flake }]);
    });

    it('200 joined by linking an existing device along paths of different length: the flake is listed at its nearest generation', async () => {
      const session = await signedIn();
      const { flake, hbnB, left, right } = await diamond(session);
      // left → device (2 steps from the flake); right → encapsulated → device (3 steps from the flake).
      const patterned = await insertStep(
        lab.knex,
        session.person,
        stepBody('lithography', {
          inputs: [{ code: left.code, consumed: true }],
          outputs: [{ kind: 'device', name: 'Hall bar' }],
        }),
      );
      const [device] = await outputCodes(lab.knex, patterned.id);
      const encapsulated = await insertStep(
        lab.knex,
        session.person,
        stepBody('encapsulation', { inputs: [{ code: right.code, consumed: true }], outputs: [{ kind: 'stack' }] }),
      );
      const [covered] = await outputCodes(lab.knex, encapsulated.id);
      const response = await post(
        session,
        stepBody('transfer', { inputs: [{ code: covered, consumed: true }], existingOutputs: [device] }),
      );
      expect(response.status).toBe(201);
      const linkStep = response.body.step.id as number;

      const ancestors = await lineage(session, device, 'ancestors');
      const found = byCode(ancestors);
      expect(relativeCodes(ancestors).filter((code) => code === flake)).toHaveLength(1);
      expect(found.get(flake)?.generation).toBe(2);
      expect(found.get(flake)?.links).toEqual([
        { stepId: left.step, stepType: 'stacking', via: left.code },
        { stepId: right.step, stepType: 'stacking', via: right.code },
      ]);
      expect(found.get(covered)).toMatchObject({
        generation: 1,
        links: [{ stepId: linkStep, stepType: 'transfer', via: device }],
      });
      expect(found.get(right.code)?.generation).toBe(2);
      expect(found.get(hbnB)?.generation).toBe(3);

      const descendants = byCode(await lineage(session, flake, 'descendants'));
      expect(descendants.get(device)?.generation).toBe(2);
      expect(descendants.get(device)?.links).toEqual([
        { stepId: patterned.id, stepType: 'lithography', via: left.code },
        { stepId: linkStep, stepType: 'transfer', via: covered },
      ]);
      const sample = (await session.agent.get(`/api/samples/${device}`)).body.sample as Sample;
      expect(sample.parents.map((parent) => parent.code)).toEqual([left.code, covered].sort());
    });
  });
});

describe('POST /api/steps refuses a loop in the lineage', () => {
  it('422 lineage_cycle naming the loop when an ancestor would become the child of its descendant; nothing is written', async () => {
    const session = await signedIn();
    const [first, second, third] = await insertChain(lab.knex, session.person, 2);
    const before = await rowCounts(lab.knex);
    const response = await post(session, stepBody('transfer', { inputs: [{ code: third }], existingOutputs: [first] }));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('lineage_cycle');
    expect(response.body.error.message).toContain(`${first} → ${second} → ${third} → ${first}`);
    expect(Object.keys(response.body.error.fields)).toEqual(['existingOutputs']);
    expect(await rowCounts(lab.knex)).toEqual(before);
    expect(relativeCodes(await lineage(session, first, 'ancestors'))).toEqual([]);
  });

  it('201 linking an existing sample that is no ancestor, then 422 lineage_cycle for the reverse link', async () => {
    const session = await signedIn();
    const flake = await insertSample(lab.knex, session.person, { material: 'WSe2' });
    const device = await insertSample(lab.knex, session.person, { kind: 'device', material: 'WSe2' });
    expect(
      (await post(session, stepBody('transfer', { inputs: [{ code: flake.code }], existingOutputs: [device.code] }))).status,
    ).toBe(201);
    const reverse = await post(session, stepBody('transfer', { inputs: [{ code: device.code }], existingOutputs: [flake.code] }));
    expect(reverse.status).toBe(422);
    expect(reverse.body.error.code).toBe('lineage_cycle');
    expect(reverse.body.error.message).toContain(`${flake.code} → ${device.code} → ${flake.code}`);
  });

  it('422 lineage_cycle for a sample named as its own output', async () => {
    const session = await signedIn();
    const flake = await insertSample(lab.knex, session.person);
    const before = await rowCounts(lab.knex);
    const response = await post(
      session,
      stepBody('annealing', { inputs: [{ code: flake.code }], existingOutputs: [flake.code] }),
    );
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('lineage_cycle');
    expect(response.body.error.message).toContain(`${flake.code} → ${flake.code}`);
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  describe('when two people log steps at the same moment that together would close a loop', () => {
    // Each round fires both requests at once; several rounds make an unlucky interleaving likely.
    const ROUNDS = 5;

    async function expectOneWins(responses: { status: number; body: { error?: { code: string } } }[]) {
      expect(responses.map((response) => response.status).sort()).toEqual([201, 422]);
      expect(responses.find((response) => response.status === 422)?.body.error?.code).toBe('lineage_cycle');
    }

    it('A → B and B → A: exactly one is logged, the other gets 422 lineage_cycle, and no loop remains', async () => {
      const alice = await signedIn();
      const bob = await signedIn();
      for (let round = 1; round <= ROUNDS; round += 1) {
        const a = await insertSample(lab.knex, alice.person, { name: `Flake A${round}` });
        const b = await insertSample(lab.knex, alice.person, { name: `Flake B${round}` });
        const responses = await Promise.all([
          post(alice, stepBody('transfer', { inputs: [{ code: a.code }], existingOutputs: [b.code] })),
          post(bob, stepBody('transfer', { inputs: [{ code: b.code }], existingOutputs: [a.code] })),
        ]);
        await expectOneWins(responses);
        const ofA = relativeCodes(await lineage(alice, a.code, 'ancestors'));
        const ofB = relativeCodes(await lineage(alice, b.code, 'ancestors'));
        expect(ofA).not.toContain(a.code);
        expect(ofB).not.toContain(b.code);
        expect([...ofA, ...ofB]).toHaveLength(1);
      }
      expect((await alice.agent.get('/api/history/verify')).body.intact).toBe(true);
    });

    it('A → B plus C → D, then B → C and D → A (no sample in common): exactly one is logged', async () => {
      const alice = await signedIn();
      const bob = await signedIn();
      for (let round = 1; round <= ROUNDS; round += 1) {
        const [a, b] = await insertChain(lab.knex, alice.person, 1);
        const [c, d] = await insertChain(lab.knex, alice.person, 1);
        const responses = await Promise.all([
          post(alice, stepBody('stacking', { inputs: [{ code: b }], existingOutputs: [c] })),
          post(bob, stepBody('stacking', { inputs: [{ code: d }], existingOutputs: [a] })),
        ]);
        await expectOneWins(responses);
        for (const code of [a, b, c, d]) {
          expect(relativeCodes(await lineage(alice, code, 'ancestors'))).not.toContain(code);
        }
        expect(
          (await lineage(alice, a, 'descendants')).relatives.length + (await lineage(alice, c, 'descendants')).relatives.length,
        ).toBe(4);
      }
    });
  });
});
