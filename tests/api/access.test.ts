import type { Test } from 'supertest';
import { issueLinkToken } from '../../server/services/link-tokens';
import { buildManager, buildPerson, TEST_PASSWORD } from '../helpers/factories';
import { crystalInput, insertSample, insertStep, STEP_PARAMETERS, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { boxInput, insertBox, labelTemplateInput, putAway } from '../helpers/storage-factories';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const CALLERS = ['anonymous', 'reviewer', 'researcher', 'manager'] as const;
type Caller = (typeof CALLERS)[number];

/** What a row's request may use: the caller's session (with its CSRF token) and people to act on. */
interface Scene {
  get: (path: string) => Test;
  post: (path: string, body?: object) => Test;
  patch: (path: string, body: object) => Test;
  put: (path: string, body: object) => Test;
  delete: (path: string) => Test;
  postCsv: (path: string, csv: string) => Test;
  /** An active researcher who is not the caller. */
  other: { id: number; email: string };
  /** A person with an open invitation, and its token. */
  invited: { id: number; email: string };
  invitationToken: string;
  /** An unused password reset token for `other`. */
  resetToken: string;
  /** A ready crystal owned by `other`, and the step that exfoliated it (without using it up). */
  sample: { code: string; version: number };
  stepId: number;
  /** A 4 × 5 box whose slot B3 holds `sample`, and a built-in label template. */
  box: { code: string };
  templateId: number;
  /** A step template owned by the caller (by `other` when the caller is anonymous). */
  stepTemplateId: number;
}

interface AccessRow {
  route: string;
  expected: Record<Caller, number>;
  send: (scene: Scene) => Test;
}

function row(
  route: string,
  anonymous: number,
  reviewer: number,
  researcher: number,
  manager: number,
  send: (scene: Scene) => Test,
): AccessRow {
  return { route, expected: { anonymous, reviewer, researcher, manager }, send };
}

const NEW_PASSWORD = 'mechanically exfoliated';

/**
 * Every API route × who calls it → the status they get. The requests are valid, so a status
 * shows access, not validation: allowed callers get the route's success status.
 */
// prettier-ignore
const ACCESS_TABLE: AccessRow[] = [
  //   route                                  anonymous reviewer researcher manager
  row('GET /health',                             200,     200,     200,      200, (s) => s.get('/api/health')),
  row('GET /openapi.json',                       200,     200,     200,      200, (s) => s.get('/api/openapi.json')),
  row('GET /auth/csrf',                          200,     200,     200,      200, (s) => s.get('/api/auth/csrf')),
  row('POST /auth/sign-in',                      200,     200,     200,      200, (s) => s.post('/api/auth/sign-in', { email: s.other.email, password: TEST_PASSWORD })),
  row('POST /auth/sign-out',                     401,     204,     204,      204, (s) => s.post('/api/auth/sign-out')),
  row('GET /auth/session',                       401,     200,     200,      200, (s) => s.get('/api/auth/session')),
  row('POST /auth/password-reset-requests',      202,     202,     202,      202, (s) => s.post('/api/auth/password-reset-requests', { email: s.other.email })),
  row('POST /auth/password-resets',              200,     200,     200,      200, (s) => s.post('/api/auth/password-resets', { token: s.resetToken, password: NEW_PASSWORD })),
  row('GET /auth/invitations/:token',            200,     200,     200,      200, (s) => s.get(`/api/auth/invitations/${s.invitationToken}`)),
  row('POST /auth/invitations/accept',           200,     200,     200,      200, (s) => s.post('/api/auth/invitations/accept', { token: s.invitationToken, displayName: 'Accepted', password: NEW_PASSWORD })),
  row('PATCH /account',                          401,     200,     200,      200, (s) => s.patch('/api/account', { displayName: 'Renamed' })),
  row('POST /account/password',                  401,     200,     200,      200, (s) => s.post('/api/account/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD })),
  row('GET /users',                              401,     403,     403,      200, (s) => s.get('/api/users')),
  row('POST /users/invitations',                 401,     403,     403,      201, (s) => s.post('/api/users/invitations', { email: 'newcomer@lab.flakeline.test', displayName: 'Newcomer', role: 'researcher' })),
  row('PATCH /users/:id',                        401,     403,     403,      200, (s) => s.patch(`/api/users/${s.other.id}`, { role: 'reviewer' })),
  row('POST /users/:id/invitation',              401,     403,     403,      202, (s) => s.post(`/api/users/${s.invited.id}/invitation`)),
  row('GET /mail-sink/messages',                 401,     403,     403,      200, (s) => s.get('/api/mail-sink/messages')),
  row('GET /samples',                            401,     200,     200,      200, (s) => s.get('/api/samples?kind=crystal,chip&sort=code')),
  row('POST /samples',                           401,     403,     201,      201, (s) => s.post('/api/samples', crystalInput())),
  row('GET /samples/:code',                      401,     200,     200,      200, (s) => s.get(`/api/samples/${s.sample.code}`)),
  row('PATCH /samples/:code',                    401,     403,     200,      200, (s) => s.patch(`/api/samples/${s.sample.code}`, { version: s.sample.version, note: 'Basal plane scratched' })),
  row('POST /samples/:code/retirement',          401,     403,     403,      200, (s) => s.post(`/api/samples/${s.sample.code}/retirement`, { version: s.sample.version, reason: 'Duplicate record' })),
  row('GET /samples/:code/ancestors',            401,     200,     200,      200, (s) => s.get(`/api/samples/${s.sample.code}/ancestors`)),
  row('GET /samples/:code/descendants',          401,     200,     200,      200, (s) => s.get(`/api/samples/${s.sample.code}/descendants`)),
  row('GET /samples/:code/history',              401,     200,     200,      200, (s) => s.get(`/api/samples/${s.sample.code}/history`)),
  row('GET /samples.csv',                        401,     200,     200,      200, (s) => s.get('/api/samples.csv?kind=crystal')),
  row('POST /samples/imports',                   401,     403,     200,      200, (s) => s.postCsv('/api/samples/imports?mode=preview', 'kind,material\ncrystal,MoS2\n')),
  row('POST /steps',                             401,     403,     201,      201, (s) => s.post('/api/steps', stepBody('exfoliation', { inputs: [{ code: s.sample.code }], outputs: [{ kind: 'chip', count: 2 }] }))),
  row('GET /steps',                              401,     200,     200,      200, (s) => s.get('/api/steps?mine=true&type=exfoliation&limit=10')),
  row('GET /step-templates',                     401,     200,     200,      200, (s) => s.get('/api/step-templates')),
  row('POST /step-templates',                    401,     403,     201,      201, (s) => s.post('/api/step-templates', { name: 'Usual peel', type: 'exfoliation', body: { parameters: STEP_PARAMETERS.exfoliation } })),
  row('DELETE /step-templates/:id',              401,     403,     204,      204, (s) => s.delete(`/api/step-templates/${s.stepTemplateId}`)),
  row('GET /steps/:id',                          401,     200,     200,      200, (s) => s.get(`/api/steps/${s.stepId}`)),
  row('GET /history/verify',                     401,     200,     200,      200, (s) => s.get('/api/history/verify')),
  row('GET /places',                             401,     200,     200,      200, (s) => s.get('/api/places')),
  row('POST /places',                            401,     403,     403,      201, (s) => s.post('/api/places', { name: 'Lab 2.14', kind: 'room' })),
  row('GET /boxes',                              401,     200,     200,      200, (s) => s.get('/api/boxes')),
  row('POST /boxes',                             401,     403,     403,      201, (s) => s.post('/api/boxes', boxInput())),
  row('GET /boxes/:code',                        401,     200,     200,      200, (s) => s.get(`/api/boxes/${s.box.code}`)),
  row('GET /samples/:code/location',             401,     200,     200,      200, (s) => s.get(`/api/samples/${s.sample.code}/location`)),
  row('PUT /samples/:code/location',             401,     403,     200,      200, (s) => s.put(`/api/samples/${s.sample.code}/location`, { boxCode: s.box.code, slot: 'A1' })),
  row('DELETE /samples/:code/location',          401,     403,     200,      200, (s) => s.delete(`/api/samples/${s.sample.code}/location`)),
  row('GET /label-templates',                    401,     200,     200,      200, (s) => s.get('/api/label-templates')),
  row('POST /label-templates',                   401,     403,     403,      201, (s) => s.post('/api/label-templates', labelTemplateInput())),
  row('GET /labels.pdf',                         401,     200,     200,      200, (s) => s.get(`/api/labels.pdf?template=${s.templateId}&samples=${s.sample.code}`)),
];

async function issueToken(userId: number, purpose: 'invitation' | 'password_reset'): Promise<string> {
  return lab.knex.transaction((trx) => issueLinkToken({ trx, userId, purpose, ttlMs: 3_600_000 }));
}

async function sceneFor(caller: Caller): Promise<Scene> {
  const me = caller === 'anonymous' ? undefined : await buildPerson(lab.knex, { role: caller });
  const session = me ? await signedInAgent(lab.app, me.email) : await anonymousAgent(lab.app);
  const { agent, csrfToken } = session;
  const other = await buildPerson(lab.knex, { role: 'researcher' });
  // Written directly: a reviewer cannot save one through the API, yet must be refused deleting it.
  const [stepTemplate] = await lab
    .knex('step_templates')
    .insert({ userId: (me ?? other).id, name: 'Usual growth', type: 'cvd_growth', body: { parameters: {} } })
    .returning('id');
  const invited = await buildPerson(lab.knex, { role: 'reviewer', status: 'invited' });
  const crystal = await insertSample(lab.knex, other, { kind: 'crystal', material: 'WSe2' });
  const step = await insertStep(
    lab.knex,
    other,
    stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 2 }] }),
  );
  const box = await insertBox(lab.knex);
  await putAway(lab.knex, other, crystal.code, box.code, 'B3');
  const template = await lab.knex('label_templates').where({ builtIn: true }).orderBy('id').first('id');
  return {
    get: (path) => agent.get(path),
    post: (path, body) => {
      const test = agent.post(path).set('x-csrf-token', csrfToken);
      return body ? test.send(body) : test;
    },
    patch: (path, body) => agent.patch(path).set('x-csrf-token', csrfToken).send(body),
    put: (path, body) => agent.put(path).set('x-csrf-token', csrfToken).send(body),
    delete: (path) => agent.delete(path).set('x-csrf-token', csrfToken),
    postCsv: (path, csv) => agent.post(path).set('x-csrf-token', csrfToken).set('content-type', 'text/csv').send(csv),
    other,
    invited,
    invitationToken: await issueToken(invited.id, 'invitation'),
    resetToken: await issueToken(other.id, 'password_reset'),
    sample: { code: crystal.code, version: crystal.version },
    stepId: step.id,
    box: { code: box.code },
    templateId: template.id,
    stepTemplateId: stepTemplate.id,
  };
}

const ERROR_CODE_FOR: Record<number, string> = { 401: 'unauthenticated', 403: 'forbidden' };

describe('route × role access table', () => {
  it('has exactly one row for every route the API mounts', () => {
    const mounted = lab.specs.map((spec) => `${spec.method.toUpperCase()} ${spec.path}`).sort();
    const listed = ACCESS_TABLE.map((entry) => entry.route).sort();
    expect(new Set(listed).size).toBe(listed.length);
    expect(listed).toEqual(mounted);
  });

  const cases = ACCESS_TABLE.flatMap((entry) =>
    CALLERS.map((caller) => ({ route: entry.route, caller, status: entry.expected[caller], send: entry.send })),
  );

  it.each(cases)('$route as $caller → $status', async ({ caller, status, send }) => {
    const response = await send(await sceneFor(caller));
    expect({ status: response.status, code: response.body?.error?.code }).toEqual({ status, code: ERROR_CODE_FOR[status] });
  });
});

describe('CSRF protection', () => {
  it('403 csrf_invalid for a signed-in manager whose mutating request has no x-csrf-token', async () => {
    const manager = await buildManager(lab.knex);
    const other = await buildPerson(lab.knex, { role: 'researcher' });
    const { agent } = await signedInAgent(lab.app, manager.email);
    const response = await agent.patch(`/api/users/${other.id}`).send({ role: 'reviewer' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_invalid');
    expect(await lab.knex('users').where({ id: other.id }).first()).toMatchObject({ role: 'researcher' });
  });

  it('403 csrf_invalid for a token from another session', async () => {
    const manager = await buildManager(lab.knex);
    const { agent } = await signedInAgent(lab.app, manager.email);
    const { csrfToken: foreignToken } = await anonymousAgent(lab.app);
    const response = await agent.post('/api/users/invitations').set('x-csrf-token', foreignToken).send({
      email: 'newcomer@lab.flakeline.test',
      displayName: 'Newcomer',
      role: 'researcher',
    });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_invalid');
    expect(await lab.knex('users').where({ email: 'newcomer@lab.flakeline.test' }).first()).toBeUndefined();
  });
});
