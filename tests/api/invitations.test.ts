import net from 'node:net';
import request from 'supertest';
import type { Role } from '../../shared/roles';
import { buildManager, buildPerson } from '../helpers/factories';
import { anonymousAgent, linkIn, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp();
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const NEW_PASSWORD = 'graphene on hBN, twice';
let sequence = 0;

/** An invitation form as a manager fills it in, with an address no other test uses. */
function newcomer(overrides: { email?: string; displayName?: string; role?: Role } = {}) {
  sequence += 1;
  return {
    email: `newcomer${sequence}@lab.flakeline.test`,
    displayName: `New Person ${sequence}`,
    role: 'researcher' as Role,
    ...overrides,
  };
}

async function signedInManager(app = lab.app) {
  const manager = await buildManager(lab.knex);
  return { manager, ...(await signedInAgent(app, manager.email)) };
}

/** Every invitation token mailed to an address, newest first. */
async function invitationTokensFor(email: string): Promise<string[]> {
  const messages = (await lab.mail()).filter((message) => message.to.includes(email));
  return messages.map((message) => linkIn(message.text).token);
}

/** A manager invites a newcomer through the API; returns the invited person and the mailed token. */
async function invite(overrides: { role?: Role } = {}) {
  const { manager, agent, csrfToken } = await signedInManager();
  const input = newcomer(overrides);
  const response = await agent.post('/api/users/invitations').set('x-csrf-token', csrfToken).send(input).expect(201);
  const [token] = await invitationTokensFor(input.email);
  return { manager, agent, csrfToken, person: response.body.user as { id: number; email: string }, token };
}

/** The invited person opens the link in a fresh browser and chooses a password. */
async function accept(token: string, body: { displayName?: string; password?: string } = {}) {
  const visitor = await anonymousAgent(lab.app);
  const response = await visitor.agent
    .post('/api/auth/invitations/accept')
    .set('x-csrf-token', visitor.csrfToken)
    .send({ token, displayName: 'Accepted Person', password: NEW_PASSWORD, ...body });
  return { ...visitor, response };
}

const expireAllLinks = () => lab.knex.raw("update link_tokens set expires_at = now() - interval '1 minute'");

/** A loopback port nothing listens on. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/** A second app on the same database whose mail server refuses connections. */
async function startAppWithoutMail(): Promise<TestApp> {
  return startTestApp({
    knex: lab.knex,
    config: { smtp: { host: '127.0.0.1', port: await closedPort(), from: 'x <x@x.test>' } },
  });
}

describe('POST /api/users/invitations', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.post('/api/users/invitations').set('x-csrf-token', csrfToken).send(newcomer());
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed naming a bad e-mail and an unknown role', async () => {
    const { agent, csrfToken } = await signedInManager();
    const response = await agent
      .post('/api/users/invitations')
      .set('x-csrf-token', csrfToken)
      .send({ email: 'not-an-address', displayName: 'Somebody', role: 'administrator' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['email', 'role']);
  });

  it.each(['researcher', 'reviewer'] as const)('403 forbidden for a %s', async (role) => {
    const person = await buildPerson(lab.knex, { role });
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    const input = newcomer();
    const response = await agent.post('/api/users/invitations').set('x-csrf-token', csrfToken).send(input);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await lab.knex('users').where({ email: input.email }).first()).toBeUndefined();
  });

  it('409 email_taken for an address that already has an account, whatever its case', async () => {
    const existing = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInManager();
    const response = await agent
      .post('/api/users/invitations')
      .set('x-csrf-token', csrfToken)
      .send(newcomer({ email: existing.email.toUpperCase() }));
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('email_taken');
    expect(await invitationTokensFor(existing.email)).toEqual([]);
  });

  it('503 mail_unavailable when the mail server cannot be reached, and nothing is saved', async () => {
    const withoutMail = await startAppWithoutMail();
    try {
      const { agent, csrfToken } = await signedInManager(withoutMail.app);
      const input = newcomer();
      const response = await agent.post('/api/users/invitations').set('x-csrf-token', csrfToken).send(input);
      expect(response.status).toBe(503);
      expect(response.body.error.code).toBe('mail_unavailable');
      expect(await lab.knex('users').where({ email: input.email }).first()).toBeUndefined();
      expect(await lab.knex('link_tokens').count({ count: '*' }).first()).toEqual({ count: 0 });
    } finally {
      await withoutMail.close();
    }
  });

  it('201 with the invited person; the e-mail reaches them with a one-time accept link', async () => {
    const { manager, agent, csrfToken } = await signedInManager();
    const input = newcomer({ email: 'Mixed.Case@Lab.Flakeline.test', role: 'reviewer' });
    const response = await agent.post('/api/users/invitations').set('x-csrf-token', csrfToken).send(input);
    expect(response.status).toBe(201);
    expect(response.body.user).toMatchObject({
      email: 'mixed.case@lab.flakeline.test',
      role: 'reviewer',
      status: 'invited',
      lastSignInAt: null,
    });
    expect(response.body.user.passwordHash).toBeUndefined();

    const [message, ...others] = (await lab.mail()).filter((mail) => mail.to.includes('mixed.case@lab.flakeline.test'));
    expect(others).toEqual([]);
    expect(message.to).toEqual(['mixed.case@lab.flakeline.test']);
    expect(message.subject).toBe('Your Flakeline invitation');
    expect(message.text).toContain(manager.displayName);
    const { url, token } = linkIn(message.text);
    expect(url).toBe(`http://flakeline.test/accept-invite?token=${token}`);

    const row = await lab.knex('link_tokens').where({ user_id: response.body.user.id }).first();
    expect(row).toMatchObject({ purpose: 'invitation', usedAt: null, revokedAt: null });
    expect(row.tokenHash).not.toContain(token);
    expect(await lab.knex('users').where({ id: response.body.user.id }).first()).toMatchObject({
      invitedById: manager.id,
      passwordHash: null,
    });
  });
});

describe('GET /api/auth/invitations/:token', () => {
  it('422 validation_failed for a token that cannot be one', async () => {
    const response = await request(lab.app).get('/api/auth/invitations/too-short');
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['params.token']);
  });

  it('404 link_invalid for a well-formed token nobody issued', async () => {
    await invite();
    const response = await request(lab.app).get(`/api/auth/invitations/${'A'.repeat(43)}`);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('link_invalid');
  });

  it('410 link_expired once the link is past its expiry', async () => {
    const { token } = await invite();
    await expireAllLinks();
    const response = await request(lab.app).get(`/api/auth/invitations/${token}`);
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_expired');
  });

  it('410 link_used once the invitation has been accepted', async () => {
    const { token } = await invite();
    expect((await accept(token)).response.status).toBe(200);
    const response = await request(lab.app).get(`/api/auth/invitations/${token}`);
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_used');
  });

  it('200 with who the invitation is for, without spending the link', async () => {
    const { token, person } = await invite({ role: 'reviewer' });
    const response = await request(lab.app).get(`/api/auth/invitations/${token}`);
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      email: person.email,
      displayName: expect.stringMatching(/^New Person \d+$/),
      role: 'reviewer',
    });
    expect((await request(lab.app).get(`/api/auth/invitations/${token}`)).status).toBe(200);
  });
});

describe('POST /api/auth/invitations/accept', () => {
  it('422 validation_failed naming a password that is too short', async () => {
    const { token } = await invite();
    const { response } = await accept(token, { password: 'short' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['password']);
  });

  it('404 link_invalid for a well-formed token nobody issued', async () => {
    const { response } = await accept('B'.repeat(43));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('link_invalid');
  });

  it('409 conflict when the person was deactivated after the invitation was sent', async () => {
    const { token, person } = await invite();
    await lab.knex('users').where({ id: person.id }).update({ status: 'deactivated' });
    const { response } = await accept(token);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await lab.knex('link_tokens').whereNotNull('used_at').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('410 link_expired once the link is past its expiry', async () => {
    const { token, person } = await invite();
    await expireAllLinks();
    const { response } = await accept(token);
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_expired');
    expect(await lab.knex('users').where({ id: person.id }).first()).toMatchObject({ status: 'invited', passwordHash: null });
  });

  it('410 link_used the second time: the link works exactly once', async () => {
    const { token } = await invite();
    expect((await accept(token)).response.status).toBe(200);
    const { response } = await accept(token, { password: 'someone else tries again' });
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_used');
  });

  it('200 activates the account with the chosen name and password and signs the person in', async () => {
    const { token, person } = await invite({ role: 'reviewer' });
    const { agent, csrfToken, response } = await accept(token, { displayName: '  Dr. Mo S2  ' });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({
      id: person.id,
      email: person.email,
      displayName: 'Dr. Mo S2',
      role: 'reviewer',
      status: 'active',
    });
    expect(response.body.csrfToken).not.toBe(csrfToken);

    const session = await agent.get('/api/auth/session');
    expect(session.status).toBe(200);
    expect(session.body.user.id).toBe(person.id);
    // The returned token belongs to the new session: a mutating request with it is accepted.
    await agent.post('/api/auth/sign-out').set('x-csrf-token', response.body.csrfToken).expect(204);

    await signedInAgent(lab.app, person.email, NEW_PASSWORD);
  });
});

describe('POST /api/users/:id/invitation', () => {
  it('401 unauthenticated when signed out', async () => {
    const { person } = await invite();
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.post(`/api/users/${person.id}/invitation`).set('x-csrf-token', csrfToken);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 validation_failed for an id that is not a number', async () => {
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.post('/api/users/abc/invitation').set('x-csrf-token', csrfToken);
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['params.id']);
  });

  it('403 forbidden for a researcher', async () => {
    const { person } = await invite();
    const researcher = await buildPerson(lab.knex, { role: 'researcher' });
    const { agent, csrfToken } = await signedInAgent(lab.app, researcher.email);
    const response = await agent.post(`/api/users/${person.id}/invitation`).set('x-csrf-token', csrfToken);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('404 not_found for an unknown person', async () => {
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.post('/api/users/999999/invitation').set('x-csrf-token', csrfToken);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('409 conflict for a person who is already active', async () => {
    const active = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInManager();
    const response = await agent.post(`/api/users/${active.id}/invitation`).set('x-csrf-token', csrfToken);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await invitationTokensFor(active.email)).toEqual([]);
  });

  it('503 mail_unavailable when the mail server cannot be reached; the earlier link keeps working', async () => {
    const { person, token } = await invite();
    const withoutMail = await startAppWithoutMail();
    try {
      const { agent, csrfToken } = await signedInManager(withoutMail.app);
      const response = await agent.post(`/api/users/${person.id}/invitation`).set('x-csrf-token', csrfToken);
      expect(response.status).toBe(503);
      expect(response.body.error.code).toBe('mail_unavailable');
    } finally {
      await withoutMail.close();
    }
    expect((await request(lab.app).get(`/api/auth/invitations/${token}`)).status).toBe(200);
  });

  it('202 sends a fresh link; the earlier link is refused (410 link_expired) and the new one works', async () => {
    const { agent, csrfToken, person, token: oldToken } = await invite();
    const response = await agent.post(`/api/users/${person.id}/invitation`).set('x-csrf-token', csrfToken);
    expect(response.status).toBe(202);
    expect(response.body.message).toContain(person.email);

    const tokens = await invitationTokensFor(person.email);
    expect(tokens).toHaveLength(2);
    const newToken = tokens.find((token) => token !== oldToken) as string;

    const old = await accept(oldToken);
    expect(old.response.status).toBe(410);
    expect(old.response.body.error.code).toBe('link_expired');
    const fresh = await accept(newToken);
    expect(fresh.response.status).toBe(200);
    expect(fresh.response.body.user).toMatchObject({ id: person.id, status: 'active' });
  });
});
