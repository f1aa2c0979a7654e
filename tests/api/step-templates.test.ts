import type { Role } from '../../shared/roles';
import type { StepTemplateCreateInput } from '../../shared/schemas/step-template';
import { buildPerson } from '../helpers/factories';
import { STEP_PARAMETERS } from '../helpers/sample-factories';
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

/** The usual MoS2 growth, saved so the next run needs only the precursor lots and the start time. */
const growthTemplate = (name = 'MoS2 at 750 °C'): StepTemplateCreateInput => ({
  name,
  type: 'cvd_growth',
  body: {
    parameters: { ...STEP_PARAMETERS.cvd_growth },
    instrument: 'Tube furnace 2',
    outputs: [{ kind: 'film', material: 'MoS2' }],
  },
});

type Session = Awaited<ReturnType<typeof signedIn>>;
const save = (session: Session, body: object) =>
  session.agent.post('/api/step-templates').set('x-csrf-token', session.csrfToken).send(body);

describe('GET /api/step-templates', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/step-templates');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it("200 with only the caller's own templates, by name", async () => {
    const alice = await signedIn();
    const bob = await signedIn();
    expect((await save(alice, growthTemplate('b growth'))).status).toBe(201);
    expect((await save(alice, growthTemplate('A growth'))).status).toBe(201);
    expect((await save(bob, growthTemplate('Bob growth'))).status).toBe(201);
    const response = await alice.agent.get('/api/step-templates');
    expect(response.status).toBe(200);
    expect(response.body.templates.map((template: { name: string }) => template.name)).toEqual(['A growth', 'b growth']);
  });
});

describe('POST /api/step-templates', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.post('/api/step-templates').set('x-csrf-token', csrfToken).send(growthTemplate());
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it.each<[string, (valid: StepTemplateCreateInput) => object, string]>([
    ['a blank name', (valid) => ({ ...valid, name: '  ' }), 'name'],
    ['an unknown step type', (valid) => ({ ...valid, type: 'sputtering' }), 'type'],
    ['no parameters', (valid) => ({ ...valid, body: { instrument: 'Tube furnace 2' } }), 'body.parameters'],
    [
      'a zone below absolute zero',
      (valid) => ({ ...valid, body: { parameters: { zoneTemperaturesC: [-300] } } }),
      'body.parameters.zoneTemperaturesC.0',
    ],
    ['a parameter of another step type', (valid) => ({ ...valid, body: { parameters: { peelCycles: 6 } } }), 'body.parameters'],
  ])('422 validation_failed naming %s', async (_case, breakIt, field) => {
    const session = await signedIn();
    const response = await save(session, breakIt(growthTemplate()));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual([field]);
    expect(await lab.knex('step_templates').count({ count: '*' })).toEqual([{ count: 0 }]);
  });

  it('403 forbidden for a reviewer', async () => {
    const session = await signedIn('reviewer');
    const response = await save(session, growthTemplate());
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('409 conflict for a name the person already uses, whatever its case', async () => {
    const session = await signedIn();
    expect((await save(session, growthTemplate('MoS2 standard'))).status).toBe(201);
    const response = await save(session, growthTemplate('mos2 STANDARD'));
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
  });

  it('201 with a template keeping parameters, instrument and outputs but dropping per-run fields', async () => {
    const session = await signedIn();
    const response = await save(session, {
      name: 'Quick WSe2 peel',
      type: 'exfoliation',
      body: {
        parameters: { method: 'adhesive_tape', peelCycles: 6 },
        startedAt: '2026-12-03T09:30:00.000Z',
        inputs: [{ code: 'CR-0000000' }],
        existingOutputs: ['CH-0000000'],
        outputs: [{ kind: 'chip', count: 4 }],
      },
    });
    expect(response.status).toBe(201);
    expect(response.body.template).toMatchObject({ name: 'Quick WSe2 peel', type: 'exfoliation' });
    expect(response.body.template.body).toEqual({
      parameters: { method: 'adhesive_tape', peelCycles: 6, pretreatment: 'none' },
      outputs: [{ kind: 'chip', count: 4 }],
    });
  });

  it('201 for a name someone else already uses', async () => {
    const alice = await signedIn();
    const bob = await signedIn('manager');
    expect((await save(alice, growthTemplate('Standard'))).status).toBe(201);
    expect((await save(bob, growthTemplate('Standard'))).status).toBe(201);
  });
});

describe('DELETE /api/step-templates/:id', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.delete('/api/step-templates/1').set('x-csrf-token', csrfToken);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed for an id that is not a number', async () => {
    const session = await signedIn();
    const response = await session.agent.delete('/api/step-templates/latest').set('x-csrf-token', session.csrfToken);
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
  });

  it("404 not_found for someone else's template, which stays", async () => {
    const alice = await signedIn();
    const bob = await signedIn('manager');
    const saved = await save(alice, growthTemplate());
    const response = await bob.agent.delete(`/api/step-templates/${saved.body.template.id}`).set('x-csrf-token', bob.csrfToken);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    expect(await lab.knex('step_templates').where({ id: saved.body.template.id })).toHaveLength(1);
  });

  it('204 and the template is gone for its owner', async () => {
    const session = await signedIn();
    const saved = await save(session, growthTemplate());
    const response = await session.agent
      .delete(`/api/step-templates/${saved.body.template.id}`)
      .set('x-csrf-token', session.csrfToken);
    expect(response.status).toBe(204);
    expect((await session.agent.get('/api/step-templates')).body.templates).toEqual([]);
  });
});
