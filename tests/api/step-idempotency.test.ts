import type { Role } from '../../shared/roles';
import { buildPerson } from '../helpers/factories';
import { insertSample, rowCounts, STEP_PARAMETERS, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
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

/** An exfoliation of a fresh crystal owned by `person`, making two chips. */
async function exfoliationOf(person: Awaited<ReturnType<typeof buildPerson>>) {
  const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'WSe2' });
  return stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 2 }] });
}

const KEY = 'bench-tap-0001';

describe('POST /api/steps with Idempotency-Key', () => {
  it('401 unauthenticated when signed out, and records no key', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .set('Idempotency-Key', KEY)
      .send(stepBody('cvd_growth', { outputs: [{ kind: 'film', material: 'MoS2' }] }));
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
    expect(await lab.knex('step_submissions').count({ count: '*' })).toEqual([{ count: 0 }]);
  });

  it.each([
    ['too short', 'abc1234'],
    ['too long', 'k'.repeat(101)],
    ['with a space', 'bench tap 0001'],
    ['with a slash', 'bench/tap/0001'],
  ])('422 validation_failed naming idempotency-key for a key %s', async (_case, key) => {
    const { person, agent, csrfToken } = await signedIn();
    const body = await exfoliationOf(person);
    const before = await rowCounts(lab.knex);
    const response = await agent.post('/api/steps').set('x-csrf-token', csrfToken).set('Idempotency-Key', key).send(body);
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['idempotency-key']);
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  it('409 idempotency_conflict when the key comes back with a different body, and logs nothing more', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const body = await exfoliationOf(person);
    const first = await agent.post('/api/steps').set('x-csrf-token', csrfToken).set('Idempotency-Key', KEY).send(body);
    expect(first.status).toBe(201);
    const before = await rowCounts(lab.knex);
    const changed = { ...body, parameters: { ...STEP_PARAMETERS.exfoliation, peelCycles: 7 } };
    const response = await agent.post('/api/steps').set('x-csrf-token', csrfToken).set('Idempotency-Key', KEY).send(changed);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('idempotency_conflict');
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  it('201 with the first step and Idempotent-Replayed: true on a replay, creating nothing', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const body = await exfoliationOf(person);
    const first = await agent.post('/api/steps').set('x-csrf-token', csrfToken).set('Idempotency-Key', KEY).send(body);
    expect(first.status).toBe(201);
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    const before = await rowCounts(lab.knex);

    const replay = await agent.post('/api/steps').set('x-csrf-token', csrfToken).set('Idempotency-Key', KEY).send(body);
    expect(replay.status).toBe(201);
    expect(replay.headers['idempotent-replayed']).toBe('true');
    expect(replay.body).toEqual(first.body);
    expect(await rowCounts(lab.knex)).toEqual(before);
    expect(await lab.knex('step_submissions').where({ stepId: first.body.step.id })).toHaveLength(1);
  });

  it('treats the same key from two people as two submissions', async () => {
    const alice = await signedIn();
    const bob = await signedIn();
    const first = await alice.agent
      .post('/api/steps')
      .set('x-csrf-token', alice.csrfToken)
      .set('Idempotency-Key', KEY)
      .send(await exfoliationOf(alice.person));
    const second = await bob.agent
      .post('/api/steps')
      .set('x-csrf-token', bob.csrfToken)
      .set('Idempotency-Key', KEY)
      .send(await exfoliationOf(bob.person));
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(second.headers['idempotent-replayed']).toBeUndefined();
    expect(second.body.step.id).not.toBe(first.body.step.id);
  });

  it('logs exactly one step when the same submission arrives twice at once (a double tap)', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const body = await exfoliationOf(person);
    const before = await rowCounts(lab.knex);
    const send = () => agent.post('/api/steps').set('x-csrf-token', csrfToken).set('Idempotency-Key', KEY).send(body);
    const answers = await Promise.all([send(), send(), send()]);
    expect(answers.map((answer) => answer.status)).toEqual([201, 201, 201]);
    expect(new Set(answers.map((answer) => answer.body.step.id)).size).toBe(1);
    expect(answers.filter((answer) => answer.headers['idempotent-replayed'] === 'true')).toHaveLength(2);
    const after = await rowCounts(lab.knex);
    expect(after.steps - before.steps).toBe(1);
    expect(after.samples - before.samples).toBe(2);
  });

  it('logs a step each time when no key is sent, as before', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'WSe2' });
    const body = stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] });
    const first = await agent.post('/api/steps').set('x-csrf-token', csrfToken).send(body);
    const second = await agent.post('/api/steps').set('x-csrf-token', csrfToken).send(body);
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(second.body.step.id).not.toBe(first.body.step.id);
  });
});
