import { buildManager, buildPerson, TEST_PASSWORD } from '../helpers/factories';
import { anonymousAgent, linkIn, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

// Generous limits here: the rate limit has its own app below.
const GENEROUS_LIMITS = { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 };
const NEW_PASSWORD = 'exfoliated with blue tape';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: GENEROUS_LIMITS } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const mailTo = async (email: string) => (await lab.mail()).filter((message) => message.to.includes(email));

async function requestReset(email: string, app = lab.app) {
  const { agent, csrfToken } = await anonymousAgent(app);
  return agent.post('/api/auth/password-reset-requests').set('x-csrf-token', csrfToken).send({ email });
}

/** An active person who asked for a reset, and the token from the mail they received. */
async function personWithResetLink() {
  const person = await buildPerson(lab.knex);
  expect((await requestReset(person.email)).status).toBe(202);
  const [message] = await mailTo(person.email);
  return { person, token: linkIn(message.text).token };
}

async function resetPassword(token: string, password = NEW_PASSWORD) {
  const { agent, csrfToken } = await anonymousAgent(lab.app);
  return agent.post('/api/auth/password-resets').set('x-csrf-token', csrfToken).send({ token, password });
}

async function signInStatus(email: string, password: string) {
  const { agent, csrfToken } = await anonymousAgent(lab.app);
  return (await agent.post('/api/auth/sign-in').set('x-csrf-token', csrfToken).send({ email, password })).status;
}

describe('POST /api/auth/password-reset-requests', () => {
  it('422 validation_failed for something that is not an e-mail address', async () => {
    const response = await requestReset('not-an-address');
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['email']);
  });

  it('429 too_many_attempts after too many requests from one client', async () => {
    const strict = await startTestApp({
      knex: lab.knex,
      config: { signInLimits: { windowMs: 60_000, perAccount: 2, perAddress: 100 } },
    });
    try {
      expect((await requestReset('first@lab.flakeline.test', strict.app)).status).toBe(202);
      expect((await requestReset('second@lab.flakeline.test', strict.app)).status).toBe(202);
      const response = await requestReset('third@lab.flakeline.test', strict.app);
      expect(response.status).toBe(429);
      expect(response.body.error.code).toBe('too_many_attempts');
    } finally {
      await strict.close();
    }
  });

  it('202 with the same answer for a known and an unknown address; only the active account gets mail', async () => {
    const person = await buildPerson(lab.knex);
    const invited = await buildPerson(lab.knex, { status: 'invited' });
    const deactivated = await buildPerson(lab.knex, { status: 'deactivated' });

    const known = await requestReset(person.email.toUpperCase());
    const unknown = await requestReset('nobody@lab.flakeline.test');
    const notActive = [await requestReset(invited.email), await requestReset(deactivated.email)];

    expect([known, unknown, ...notActive].map((response) => response.status)).toEqual([202, 202, 202, 202]);
    expect(unknown.body).toEqual(known.body);
    expect(notActive.map((response) => response.body)).toEqual([known.body, known.body]);

    const [message, ...others] = await mailTo(person.email);
    expect(others).toEqual([]);
    expect(message.subject).toBe('Reset your Flakeline password');
    const { url, token } = linkIn(message.text);
    expect(url).toBe(`http://flakeline.test/reset-password?token=${token}`);
    expect(await mailTo('nobody@lab.flakeline.test')).toEqual([]);
    expect(await mailTo(invited.email)).toEqual([]);
    expect(await mailTo(deactivated.email)).toEqual([]);
  });
  it('202 with the same answer when the mail server is down, so an outage does not reveal who has an account', async () => {
    const person = await buildPerson(lab.knex);
    const mailDown = await startTestApp({
      knex: lab.knex,
      config: {
        signInLimits: GENEROUS_LIMITS,
        smtp: { host: '127.0.0.1', port: 1, from: 'Flakeline <flakeline@flakeline.test>' },
      },
    });
    try {
      const known = await requestReset(person.email, mailDown.app);
      const unknown = await requestReset('nobody@lab.flakeline.test', mailDown.app);
      expect([known.status, unknown.status]).toEqual([202, 202]);
      expect(known.body).toEqual(unknown.body);
      expect(await lab.knex('link_tokens').where({ userId: person.id })).toHaveLength(0);
    } finally {
      await mailDown.close();
    }
  });
});

describe('POST /api/auth/password-resets', () => {
  it('422 validation_failed naming a password that is too short', async () => {
    const { token } = await personWithResetLink();
    const response = await resetPassword(token, 'short');
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['password']);
  });

  it('404 link_invalid for a well-formed token nobody issued', async () => {
    await personWithResetLink();
    const response = await resetPassword('C'.repeat(43));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('link_invalid');
  });

  it('404 link_invalid for an invitation token: a link only works for its own purpose', async () => {
    const manager = await buildManager(lab.knex);
    const { agent, csrfToken } = await signedInAgent(lab.app, manager.email);
    await agent
      .post('/api/users/invitations')
      .set('x-csrf-token', csrfToken)
      .send({ email: 'invited@lab.flakeline.test', displayName: 'Invited', role: 'researcher' })
      .expect(201);
    const [invitation] = await mailTo('invited@lab.flakeline.test');
    const response = await resetPassword(linkIn(invitation.text).token);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('link_invalid');
  });

  it('410 link_expired once the link is past its expiry, and the password stays as it was', async () => {
    const { person, token } = await personWithResetLink();
    await lab.knex.raw("update link_tokens set expires_at = now() - interval '1 minute'");
    const response = await resetPassword(token);
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_expired');
    expect(await signInStatus(person.email, TEST_PASSWORD)).toBe(200);
  });

  it('410 link_expired for an earlier link once a newer one was requested', async () => {
    const { person, token: earlier } = await personWithResetLink();
    expect((await requestReset(person.email)).status).toBe(202);
    const response = await resetPassword(earlier);
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_expired');
  });

  it('410 link_used the second time: the link works exactly once', async () => {
    const { token } = await personWithResetLink();
    expect((await resetPassword(token)).status).toBe(200);
    const response = await resetPassword(token, 'a third password, please');
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_used');
  });

  it('200 sets the new password: it signs in, the old one does not, and earlier sessions end', async () => {
    const { person, token } = await personWithResetLink();
    const earlier = await signedInAgent(lab.app, person.email);
    const bystander = await buildPerson(lab.knex);
    const bystanderSession = await signedInAgent(lab.app, bystander.email);

    const response = await resetPassword(token);
    expect(response.status).toBe(200);
    expect(response.body.message).toEqual(expect.any(String));

    expect((await earlier.agent.get('/api/auth/session')).status).toBe(401);
    expect((await bystanderSession.agent.get('/api/auth/session')).status).toBe(200);
    expect(await signInStatus(person.email, TEST_PASSWORD)).toBe(401);
    expect(await signInStatus(person.email, NEW_PASSWORD)).toBe(200);
  });
});
