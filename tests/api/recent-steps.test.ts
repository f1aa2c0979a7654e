import type { Role } from '../../shared/roles';
import type { Step } from '../../shared/schemas/step';
import { buildPerson } from '../helpers/factories';
import { insertSample, insertStep, stepBody } from '../helpers/sample-factories';
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

type Person = Awaited<ReturnType<typeof buildPerson>>;

/** An exfoliation by `person` of a fresh crystal, logged `minutesAgo` before now. */
async function exfoliation(person: Person, minutesAgo: number) {
  const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'WSe2' });
  const step = await insertStep(
    lab.knex,
    person,
    stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 2 }] }),
  );
  await lab
    .knex('steps')
    .where({ id: step.id })
    .update({ createdAt: new Date(Date.now() - minutesAgo * 60_000) });
  return step.id;
}

const ids = (steps: Step[]) => steps.map((step) => step.id);

describe('GET /api/steps', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/steps?mine=true');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it.each([
    ['mine=yes', 'query.mine'],
    ['type=sputtering', 'query.type'],
    ['limit=0', 'query.limit'],
    ['limit=51', 'query.limit'],
    ['limit=ten', 'query.limit'],
  ])('422 validation_failed for %s', async (query, field) => {
    const { agent } = await signedIn();
    const response = await agent.get(`/api/steps?${query}`);
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual([field]);
  });

  it("200 with only the caller's steps of one type, newest first, up to the limit", async () => {
    const { person, agent } = await signedIn();
    const other = await buildPerson(lab.knex);
    const oldest = await exfoliation(person, 30);
    const middle = await exfoliation(person, 20);
    const newest = await exfoliation(person, 10);
    await exfoliation(other, 5);
    const film = await insertSample(lab.knex, person, { kind: 'film', material: 'MoS2' });
    await insertStep(lab.knex, person, stepBody('annealing', { treated: [film.code] }));

    const response = await agent.get('/api/steps?mine=true&type=exfoliation&limit=10');
    expect(response.status).toBe(200);
    expect(ids(response.body.steps)).toEqual([newest, middle, oldest]);

    const limited = await agent.get('/api/steps?mine=true&type=exfoliation&limit=2');
    expect(ids(limited.body.steps)).toEqual([newest, middle]);
  });

  it('200 with a step someone else logged with the caller as operator counted as mine', async () => {
    const { person, agent } = await signedIn('reviewer');
    const manager = await buildPerson(lab.knex, { role: 'manager' });
    const crystal = await insertSample(lab.knex, manager, { kind: 'crystal', material: 'hBN' });
    const step = await insertStep(
      lab.knex,
      manager,
      stepBody('exfoliation', { operatorId: person.id, inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }),
    );
    const response = await agent.get('/api/steps?mine=true');
    expect(response.status).toBe(200);
    expect(ids(response.body.steps)).toEqual([step.id]);
  });

  it("200 with everyone's steps without mine", async () => {
    const { person, agent } = await signedIn();
    const other = await buildPerson(lab.knex);
    const mine = await exfoliation(person, 10);
    const theirs = await exfoliation(other, 5);
    const response = await agent.get('/api/steps');
    expect(response.status).toBe(200);
    expect(ids(response.body.steps)).toEqual([theirs, mine]);
  });
});

describe('GET /api/samples?awaitingSearch=true', () => {
  it('422 validation_failed for a value that is not true or false', async () => {
    const { agent } = await signedIn();
    const response = await agent.get('/api/samples?awaitingSearch=yes');
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['query.awaitingSearch']);
  });

  it('200 with ready chips that nothing has been made from', async () => {
    const { person, agent } = await signedIn();
    const waiting = await insertSample(lab.knex, person, { kind: 'chip', material: 'WSe2' });
    const searched = await insertSample(lab.knex, person, { kind: 'chip', material: 'WSe2' });
    await insertStep(
      lab.knex,
      person,
      stepBody('exfoliation', { inputs: [{ code: searched.code }], outputs: [{ kind: 'flake', name: 'Monolayer' }] }),
    );
    await insertSample(lab.knex, person, { kind: 'chip', material: 'WSe2', status: 'missing' });
    await insertSample(lab.knex, person, { kind: 'crystal', material: 'WSe2' });

    const response = await agent.get('/api/samples?awaitingSearch=true');
    expect(response.status).toBe(200);
    expect(response.body.samples.map((sample: { code: string }) => sample.code)).toEqual([waiting.code]);
    expect(response.body.total).toBe(1);
  });
});
