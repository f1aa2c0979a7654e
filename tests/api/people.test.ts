import { buildManager, buildPerson, TEST_PASSWORD } from '../helpers/factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

async function signedInManager() {
  const manager = await buildManager(lab.knex);
  return { manager, ...(await signedInAgent(lab.app, manager.email)) };
}

async function signInStatus(email: string, password: string) {
  const { agent, csrfToken } = await anonymousAgent(lab.app);
  return (await agent.post('/api/auth/sign-in').set('x-csrf-token', csrfToken).send({ email, password })).status;
}

describe('GET /api/users', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/users');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it.each(['researcher', 'reviewer'] as const)('403 forbidden for a %s', async (role) => {
    const person = await buildPerson(lab.knex, { role });
    const { agent } = await signedInAgent(lab.app, person.email);
    const response = await agent.get('/api/users');
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('200 lists everyone, whatever their status, and never a password hash', async () => {
    const { manager, agent } = await signedInManager();
    const researcher = await buildPerson(lab.knex, { role: 'researcher' });
    const invited = await buildPerson(lab.knex, { role: 'reviewer', status: 'invited' });
    const deactivated = await buildPerson(lab.knex, { status: 'deactivated' });
    const response = await agent.get('/api/users');
    expect(response.status).toBe(200);
    expect(response.body.users.map((user: { id: number }) => user.id).sort()).toEqual(
      [manager.id, researcher.id, invited.id, deactivated.id].sort(),
    );
    expect(response.body.users.find((user: { id: number }) => user.id === invited.id)).toEqual({
      id: invited.id,
      email: invited.email,
      displayName: invited.displayName,
      role: 'reviewer',
      status: 'invited',
      createdAt: expect.any(String),
      lastSignInAt: null,
    });
    const text = JSON.stringify(response.body);
    expect(text).not.toMatch(/password/i);
    expect(text).not.toContain('$argon2');
  });
});

describe('PATCH /api/users/:id', () => {
  it('401 unauthenticated when signed out', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.patch(`/api/users/${person.id}`).set('x-csrf-token', csrfToken).send({ role: 'reviewer' });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed for an id that is not a number', async () => {
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.patch('/api/users/abc').set('x-csrf-token', csrfToken).send({ role: 'reviewer' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['params.id']);
  });

  it('422 validation_failed for an empty body: say what to change', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.patch(`/api/users/${person.id}`).set('x-csrf-token', csrfToken).send({});
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['_']);
  });

  it('422 validation_failed for an id too large to be one, rather than a database error', async () => {
    const { agent, csrfToken } = await signedInManager();
    const response = await agent
      .patch('/api/users/99999999999999999999')
      .set('x-csrf-token', csrfToken)
      .send({ role: 'reviewer' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['params.id']);
  });

  it('422 validation_failed naming an unknown role and status', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInManager();
    const response = await agent
      .patch(`/api/users/${person.id}`)
      .set('x-csrf-token', csrfToken)
      .send({ role: 'administrator', status: 'invited' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['role', 'status']);
  });

  it('403 forbidden for a researcher, even on themself', async () => {
    const researcher = await buildPerson(lab.knex, { role: 'researcher' });
    const { agent, csrfToken } = await signedInAgent(lab.app, researcher.email);
    const response = await agent.patch(`/api/users/${researcher.id}`).set('x-csrf-token', csrfToken).send({ role: 'manager' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('users').where({ id: researcher.id }).first()).toMatchObject({ role: 'researcher' });
  });

  it('404 not_found for an unknown id', async () => {
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.patch('/api/users/999999').set('x-csrf-token', csrfToken).send({ role: 'reviewer' });
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('409 last_manager when the only active manager demotes themself', async () => {
    const { manager, agent, csrfToken } = await signedInManager();
    await buildPerson(lab.knex, { role: 'manager', status: 'deactivated' });
    await buildPerson(lab.knex, { role: 'manager', status: 'invited' });
    const response = await agent.patch(`/api/users/${manager.id}`).set('x-csrf-token', csrfToken).send({ role: 'researcher' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('last_manager');
    expect(await lab.knex('users').where({ id: manager.id }).first()).toMatchObject({ role: 'manager', status: 'active' });
  });

  it('409 last_manager when the only active manager deactivates themself', async () => {
    const { manager, agent, csrfToken } = await signedInManager();
    const response = await agent.patch(`/api/users/${manager.id}`).set('x-csrf-token', csrfToken).send({ status: 'deactivated' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('last_manager');
    expect((await agent.get('/api/auth/session')).status).toBe(200);
  });

  it('409 last_manager for a manager acting on themself once the other manager was demoted', async () => {
    const { manager, agent, csrfToken } = await signedInManager();
    const other = await buildManager(lab.knex);
    await agent.patch(`/api/users/${other.id}`).set('x-csrf-token', csrfToken).send({ role: 'reviewer' }).expect(200);
    const response = await agent.patch(`/api/users/${manager.id}`).set('x-csrf-token', csrfToken).send({ role: 'reviewer' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('last_manager');
  });

  it('409 last_manager (never a 500) when two managers demote each other at the same moment', async () => {
    const first = await signedInManager();
    const second = await signedInManager();
    const demote = (by: typeof first, target: { id: number }) =>
      by.agent.patch(`/api/users/${target.id}`).set('x-csrf-token', by.csrfToken).send({ role: 'reviewer' });
    // A few rounds, so the two transactions overlap at least once.
    for (let round = 0; round < 8; round += 1) {
      await lab.knex('users').update({ role: 'manager', status: 'active' });
      const responses = await Promise.all([demote(first, second.manager), demote(second, first.manager)]);
      const outcome = responses.map((response) => `${response.status} ${response.body.error?.code ?? 'ok'}`).sort();
      // One demotion wins; the other either finds itself the last manager or, if it arrives after
      // its sender was demoted, is no longer a manager's request at all.
      expect([
        ['200 ok', '409 last_manager'],
        ['200 ok', '403 forbidden'],
      ]).toContainEqual(outcome);
      expect(await lab.knex('users').where({ role: 'manager', status: 'active' }).count({ count: '*' }).first()).toEqual({
        count: 1,
      });
    }
  });

  it('409 conflict when reactivating someone who never accepted the invitation', async () => {
    const invited = await buildPerson(lab.knex, { status: 'invited' });
    const { agent, csrfToken } = await signedInManager();
    await agent.patch(`/api/users/${invited.id}`).set('x-csrf-token', csrfToken).send({ status: 'deactivated' }).expect(200);
    const response = await agent.patch(`/api/users/${invited.id}`).set('x-csrf-token', csrfToken).send({ status: 'active' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
  });

  it('200 changes a role, which applies to the person at once', async () => {
    const researcher = await buildPerson(lab.knex, { role: 'researcher' });
    const theirs = await signedInAgent(lab.app, researcher.email);
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.patch(`/api/users/${researcher.id}`).set('x-csrf-token', csrfToken).send({ role: 'manager' });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ id: researcher.id, role: 'manager', status: 'active' });
    expect((await theirs.agent.get('/api/users')).status).toBe(200);
  });

  it('200 lets a manager demote themself while another active manager remains', async () => {
    const { manager, agent, csrfToken } = await signedInManager();
    await buildManager(lab.knex);
    const response = await agent.patch(`/api/users/${manager.id}`).set('x-csrf-token', csrfToken).send({ role: 'researcher' });
    expect(response.status).toBe(200);
    expect(response.body.user.role).toBe('researcher');
    expect((await agent.get('/api/users')).status).toBe(403);
  });

  it('200 deactivates: the person is signed out and cannot sign in', async () => {
    const person = await buildPerson(lab.knex);
    const theirs = await signedInAgent(lab.app, person.email);
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.patch(`/api/users/${person.id}`).set('x-csrf-token', csrfToken).send({ status: 'deactivated' });
    expect(response.status).toBe(200);
    expect(response.body.user.status).toBe('deactivated');
    expect((await theirs.agent.get('/api/auth/session')).status).toBe(401);
    expect(await signInStatus(person.email, TEST_PASSWORD)).toBe(403);
  });

  it('200 reactivates: the person signs in again, while a session from before the deactivation stays ended', async () => {
    const person = await buildPerson(lab.knex);
    const before = await signedInAgent(lab.app, person.email);
    const { agent, csrfToken } = await signedInManager();
    await agent.patch(`/api/users/${person.id}`).set('x-csrf-token', csrfToken).send({ status: 'deactivated' }).expect(200);
    const response = await agent.patch(`/api/users/${person.id}`).set('x-csrf-token', csrfToken).send({ status: 'active' });
    expect(response.status).toBe(200);
    expect(response.body.user.status).toBe('active');
    expect(await signInStatus(person.email, TEST_PASSWORD)).toBe(200);
    expect((await before.agent.get('/api/auth/session')).status).toBe(401);
  });
});

describe('PATCH /api/account', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.patch('/api/account').set('x-csrf-token', csrfToken).send({ displayName: 'Nobody' });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed for an empty name', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    const response = await agent.patch('/api/account').set('x-csrf-token', csrfToken).send({ displayName: '   ' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['displayName']);
  });

  it('200 changes your own display name and nothing else', async () => {
    const person = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    const response = await agent
      .patch('/api/account')
      .set('x-csrf-token', csrfToken)
      .send({ displayName: '  Dr. W. Se2  ', role: 'manager' });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ id: person.id, displayName: 'Dr. W. Se2', role: 'reviewer' });
    expect((await agent.get('/api/auth/session')).body.user.displayName).toBe('Dr. W. Se2');
  });
});

describe('POST /api/account/password', () => {
  const NEW_PASSWORD = 'a twisted bilayer at 1.1 degrees';

  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post('/api/account/password')
      .set('x-csrf-token', csrfToken)
      .send({ currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming a new password that is too short', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    const response = await agent
      .post('/api/account/password')
      .set('x-csrf-token', csrfToken)
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'short' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['newPassword']);
  });

  it('401 invalid_credentials for a wrong current password; nothing changes', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    const response = await agent
      .post('/api/account/password')
      .set('x-csrf-token', csrfToken)
      .send({ currentPassword: 'not my password', newPassword: NEW_PASSWORD });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('invalid_credentials');
    expect((await agent.get('/api/auth/session')).status).toBe(200);
    expect(await signInStatus(person.email, TEST_PASSWORD)).toBe(200);
  });

  it('429 too_many_attempts after repeated wrong current passwords, so a borrowed session cannot guess it', async () => {
    const strict = await startTestApp({
      knex: lab.knex,
      config: { signInLimits: { windowMs: 60_000, perAccount: 2, perAddress: 100 } },
    });
    try {
      const person = await buildPerson(lab.knex);
      const { agent, csrfToken } = await signedInAgent(strict.app, person.email);
      const attempt = () =>
        agent
          .post('/api/account/password')
          .set('x-csrf-token', csrfToken)
          .send({ currentPassword: 'a guess', newPassword: NEW_PASSWORD });
      expect((await attempt()).status).toBe(401);
      expect((await attempt()).status).toBe(401);
      const response = await attempt();
      expect(response.status).toBe(429);
      expect(response.body.error.code).toBe('too_many_attempts');
    } finally {
      await strict.close();
    }
  });

  it('200 changes the password; this session stays signed in, the other sessions are signed out', async () => {
    const person = await buildPerson(lab.knex);
    const here = await signedInAgent(lab.app, person.email);
    const elsewhere = await signedInAgent(lab.app, person.email);
    const colleague = await buildPerson(lab.knex);
    const colleagues = await signedInAgent(lab.app, colleague.email);

    const response = await here.agent
      .post('/api/account/password')
      .set('x-csrf-token', here.csrfToken)
      .send({ currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD });
    expect(response.status).toBe(200);

    expect((await here.agent.get('/api/auth/session')).status).toBe(200);
    expect((await elsewhere.agent.get('/api/auth/session')).status).toBe(401);
    expect((await colleagues.agent.get('/api/auth/session')).status).toBe(200);
    expect(await signInStatus(person.email, TEST_PASSWORD)).toBe(401);
    expect(await signInStatus(person.email, NEW_PASSWORD)).toBe(200);
  });
});
