import { createHash, randomBytes } from 'node:crypto';
import type { Role } from '../../shared/roles';
import type { ShareLink, ShareLinkCreated, SharedAudit } from '../../shared/schemas/share-link';
import { buildPerson } from '../helpers/factories';
import { insertDevice } from '../helpers/device-factories';
import { anonymousAgent, signedInAgent, type SessionAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

async function signedIn(role: Role) {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

const linksPath = (code: string) => `/api/samples/${encodeURIComponent(code)}/share-links`;
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');
const unknownToken = () => randomBytes(32).toString('base64url');

const create = (session: SessionAgent, code: string, body: object = { expiresInDays: 14 }) =>
  session.agent.post(linksPath(code)).set('x-csrf-token', session.csrfToken).send(body);

async function sharedDevice() {
  const manager = await signedIn('manager');
  const { device } = await insertDevice(lab.knex, manager.person);
  const response = await create(manager, device);
  if (response.status !== 201) throw new Error(`Creating a link failed: ${response.status} ${JSON.stringify(response.body)}`);
  return { manager, device, created: response.body as ShareLinkCreated };
}

describe('POST /api/samples/:code/share-links', () => {
  it('401 for a signed-out caller', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    expect((await agent.post(linksPath(device)).set('x-csrf-token', csrfToken).send({ expiresInDays: 7 })).status).toBe(401);
  });

  it('422 for an expiry of no days or more than 90', async () => {
    const manager = await signedIn('manager');
    const { device } = await insertDevice(lab.knex, manager.person);
    expect((await create(manager, device, { expiresInDays: 0 })).body.error.fields).toEqual({
      expiresInDays: ['The link must work for at least one day.'],
    });
    expect((await create(manager, device, { expiresInDays: 91 })).body.error.fields).toEqual({
      expiresInDays: ['A link can work for at most 90 days.'],
    });
  });

  it.each(['reviewer', 'researcher'] as const)('403 for a %s', async (role) => {
    const session = await signedIn(role);
    const { device } = await insertDevice(lab.knex, session.person);
    const response = await create(session, device);
    expect(response.status).toBe(403);
    expect(await lab.knex('share_links').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('404 for an unknown record', async () => {
    const manager = await signedIn('manager');
    expect((await create(manager, 'DV-000000')).status).toBe(404);
  });

  it('201 with the token shown once; only its SHA-256 is stored, and the history names the link, not the token', async () => {
    const { manager, device, created } = await sharedDevice();
    expect(created.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(created.url).toBe(`${lab.config.publicBaseUrl}/shared/${created.token}`);
    expect(created.shareLink).toMatchObject({
      sampleCode: device,
      status: 'active',
      createdBy: { id: manager.person.id },
      revokedAt: null,
      openCount: 0,
    });
    const days = (Date.parse(created.shareLink.expiresAt) - Date.parse(created.shareLink.createdAt)) / 86_400_000;
    expect(days).toBe(14);
    const row = await lab.knex('share_links').where({ id: created.shareLink.id }).first();
    expect(row.tokenSha256).toBe(sha256(created.token));
    expect(JSON.stringify(row)).not.toContain(created.token);
    const events = await lab.knex('history_events').where({ type: 'share_link.created' });
    expect(events).toHaveLength(1);
    expect(events[0].payload).toMatchObject({ linkId: created.shareLink.id });
    expect(events[0].body).not.toContain(created.token);
  });
});

describe('GET /api/samples/:code/share-links', () => {
  it('401 signed out; 403 for a researcher', async () => {
    const { device } = await sharedDevice();
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(linksPath(device))).status).toBe(401);
    const researcher = await signedIn('researcher');
    expect((await researcher.agent.get(linksPath(device))).status).toBe(403);
  });

  it('the links of a record, newest first, with their openings', async () => {
    const { manager, device, created } = await sharedDevice();
    const second = (await create(manager, device, { expiresInDays: 90 })).body as ShareLinkCreated;
    await (await anonymousAgent(lab.app)).agent.get(`/api/shared/${created.token}`);
    const response = await manager.agent.get(linksPath(device));
    expect(response.status).toBe(200);
    const links = response.body.shareLinks as ShareLink[];
    expect(links.map((link) => [link.id, link.openCount])).toEqual([
      [second.shareLink.id, 0],
      [created.shareLink.id, 1],
    ]);
    expect(links[1].lastOpenedAt).toEqual(expect.any(String));
  });
});

describe('POST /api/share-links/:id/revoke', () => {
  it('401 signed out; 403 for a researcher; 404 for an unknown link', async () => {
    const { manager, created } = await sharedDevice();
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    expect((await agent.post(`/api/share-links/${created.shareLink.id}/revoke`).set('x-csrf-token', csrfToken)).status).toBe(401);
    const researcher = await signedIn('researcher');
    const refused = await researcher.agent
      .post(`/api/share-links/${created.shareLink.id}/revoke`)
      .set('x-csrf-token', researcher.csrfToken);
    expect(refused.status).toBe(403);
    expect((await manager.agent.post('/api/share-links/999999/revoke').set('x-csrf-token', manager.csrfToken)).status).toBe(404);
  });

  it('revokes at once; revoking again changes nothing', async () => {
    const { manager, created } = await sharedDevice();
    const revoke = () =>
      manager.agent.post(`/api/share-links/${created.shareLink.id}/revoke`).set('x-csrf-token', manager.csrfToken);
    const first = await revoke();
    expect(first.status).toBe(200);
    expect(first.body.shareLink).toMatchObject({ status: 'revoked', revokedBy: { id: manager.person.id } });
    const second = await revoke();
    expect(second.body.shareLink.revokedAt).toBe(first.body.shareLink.revokedAt);
    expect(await lab.knex('history_events').where({ type: 'share_link.revoked' })).toHaveLength(1);
  });
});

describe('GET /api/shared/:token (signed out)', () => {
  it('422 for a malformed token; 404 for an unknown one', async () => {
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get('/api/shared/not-a-token')).status).toBe(422);
    const unknown = await agent.get(`/api/shared/${unknownToken()}`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
  });

  it('410 share_link_expired once the link has expired', async () => {
    const { created } = await sharedDevice();
    await lab
      .knex('share_links')
      .where({ id: created.shareLink.id })
      .update({ createdAt: new Date(Date.now() - 20 * 86_400_000), expiresAt: new Date(Date.now() - 1000) });
    const response = await (await anonymousAgent(lab.app)).agent.get(`/api/shared/${created.token}`);
    expect(response.status).toBe(410);
    expect(response.body.error).toEqual({ code: 'share_link_expired', message: expect.stringMatching(/expired/) });
    expect(await lab.knex('history_events').where({ type: 'share_link.opened' })).toHaveLength(0);
  });

  it('410 share_link_revoked for a revoked link, in each format', async () => {
    const { manager, created } = await sharedDevice();
    await manager.agent.post(`/api/share-links/${created.shareLink.id}/revoke`).set('x-csrf-token', manager.csrfToken);
    const { agent } = await anonymousAgent(lab.app);
    for (const suffix of ['', '/audit.pdf', '/audit.jsonld']) {
      const response = await agent.get(`/api/shared/${created.token}${suffix}`);
      expect({ suffix, status: response.status, code: response.body.error?.code }).toEqual({
        suffix,
        status: 410,
        code: 'share_link_revoked',
      });
    }
  });

  it('opens the audit signed out, as JSON, PDF and JSON-LD, and logs each opening by link id', async () => {
    const { device, created } = await sharedDevice();
    const { agent } = await anonymousAgent(lab.app);
    const json = await agent.get(`/api/shared/${created.token}`);
    expect(json.status).toBe(200);
    const shared = json.body as SharedAudit;
    expect(shared.sampleCode).toBe(device);
    expect(shared.expiresAt).toBe(created.shareLink.expiresAt);
    expect(shared.audit.subject.code).toBe(device);
    const pdf = await agent.get(`/api/shared/${created.token}/audit.pdf`).buffer(true);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toMatch(/^application\/pdf/);
    const ld = await agent.get(`/api/shared/${created.token}/audit.jsonld`).buffer(true);
    expect(ld.status).toBe(200);
    expect(JSON.parse(ld.text)['@context'].prov).toBe('http://www.w3.org/ns/prov#');

    const openings = await lab.knex('history_events').where({ type: 'share_link.opened' }).orderBy('id');
    expect(openings.map((event) => [event.subjectCode, event.actorId, event.payload])).toEqual([
      [device, null, { linkId: created.shareLink.id, format: 'json' }],
      [device, null, { linkId: created.shareLink.id, format: 'pdf' }],
      [device, null, { linkId: created.shareLink.id, format: 'jsonld' }],
    ]);
    for (const event of openings) expect(event.body).not.toContain(created.token);
    expect(await lab.knex('share_links').where({ id: created.shareLink.id }).first('openCount')).toEqual({ openCount: 3 });
  });

  it('429 after too many openings from one address in a minute', async () => {
    // A fresh app (same database): its counts start at zero, whatever the tests above opened.
    const fresh = await startTestApp({ knex: lab.knex });
    try {
      const { agent } = await anonymousAgent(fresh.app);
      const statuses: number[] = [];
      for (let attempt = 0; attempt < 31; attempt += 1) statuses.push((await agent.get(`/api/shared/${unknownToken()}`)).status);
      expect(statuses.slice(0, 30).every((status) => status === 404)).toBe(true);
      expect(statuses[30]).toBe(429);
    } finally {
      await fresh.close();
    }
  });
});
