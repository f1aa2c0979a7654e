import request from 'supertest';
import { buildPerson, TEST_PASSWORD } from '../helpers/factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 3, perAddress: 100 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

describe('POST /api/auth/sign-in', () => {
  it('400 malformed_json for a body that is not JSON', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .set('content-type', 'application/json')
      .send('{"email": ');
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('malformed_json');
  });

  it('403 csrf_invalid without the session token', async () => {
    const person = await buildPerson(lab.knex);
    const response = await request(lab.app).post('/api/auth/sign-in').send({ email: person.email, password: TEST_PASSWORD });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_invalid');
  });

  it('422 validation_failed naming each bad field', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrfToken).send({ email: 'not-an-address' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['email', 'password']);
  });

  it('401 invalid_credentials for a wrong password and for an unknown address alike', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const wrongPassword = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: person.email, password: 'not the password' });
    const unknown = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: 'nobody@lab.flakeline.test', password: TEST_PASSWORD });
    expect([wrongPassword.status, unknown.status]).toEqual([401, 401]);
    expect(wrongPassword.body.error).toEqual(unknown.body.error);
    expect(unknown.body.error.code).toBe('invalid_credentials');
  });

  it('403 account_deactivated for a deactivated account with the right password', async () => {
    const person = await buildPerson(lab.knex, { status: 'deactivated' });
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: person.email, password: TEST_PASSWORD });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('account_deactivated');
  });

  it('429 too_many_attempts after repeated failures, even with the right password', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    for (let attempt = 0; attempt < 3; attempt += 1) {
      await agent
        .post('/api/auth/sign-in')
        .set('x-csrf-token', csrfToken)
        .send({ email: person.email, password: 'wrong guess' })
        .expect(401);
    }
    const response = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: person.email, password: TEST_PASSWORD });
    expect(response.status).toBe(429);
    expect(response.body.error.code).toBe('too_many_attempts');
    expect(response.headers['ratelimit-policy']).toBeDefined();
  });

  it('200 with the person, a fresh CSRF token and an HttpOnly SameSite session cookie; e-mail case does not matter', async () => {
    const person = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: person.email.toUpperCase(), password: TEST_PASSWORD });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ email: person.email, role: 'reviewer', status: 'active' });
    expect(response.body.user.passwordHash).toBeUndefined();
    expect(response.body.csrfToken).not.toBe(csrfToken);
    const cookie = String(response.headers['set-cookie']);
    expect(cookie).toMatch(/flakeline\.sid=/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    const session = await agent.get('/api/auth/session').expect(200);
    expect(session.body.user.email).toBe(person.email);
  });
});

describe('GET /api/auth/session', () => {
  it('401 unauthenticated when signed out', async () => {
    const response = await request(lab.app).get('/api/auth/session');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('survives a server restart: a second app on the same database knows the cookie', async () => {
    const person = await buildPerson(lab.knex);
    const { agent } = await signedInAgent(lab.app, person.email);
    const cookies = await new Promise<string>((resolve) => {
      agent.get('/api/auth/session').end((_error, response) => resolve(String(response.request.cookies)));
    });
    const restarted = await startTestApp({ knex: lab.knex });
    try {
      const response = await request(restarted.app).get('/api/auth/session').set('cookie', cookies);
      expect(response.status).toBe(200);
      expect(response.body.user.email).toBe(person.email);
    } finally {
      await restarted.close();
    }
  });

  it('ends when the person is deactivated', async () => {
    const person = await buildPerson(lab.knex);
    const { agent } = await signedInAgent(lab.app, person.email);
    await lab.knex('users').where({ id: person.id }).update({ status: 'deactivated' });
    expect((await agent.get('/api/auth/session')).status).toBe(401);
  });
});

describe('POST /api/auth/sign-out', () => {
  it('401 when not signed in', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    expect((await agent.post('/api/auth/sign-out').set('x-csrf-token', csrfToken)).status).toBe(401);
  });

  it('204, and the session no longer works', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    await agent.post('/api/auth/sign-out').set('x-csrf-token', csrfToken).expect(204);
    expect((await agent.get('/api/auth/session')).status).toBe(401);
    expect(await lab.knex('session').count({ count: '*' }).first()).toEqual({ count: 0 });
  });
});
