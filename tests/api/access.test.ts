import type { Response, Test } from 'supertest';
import { issueLinkToken } from '../../server/services/link-tokens';
import { insertDeviceScene } from '../helpers/device-factories';
import { createFileStore, type FileStore } from '../../server/files/file-store';
import { insertCalibration, insertChipMicrograph, smallChipPng } from '../helpers/evidence-factories';
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
  /** A chip of `other` with a micrograph whose candidates were found, its file's checksum, and a calibration. */
  evidence: () => Promise<{ chipMicrographId: number; sha256: string; calibrationId: number }>;
  /** A device of `other` with a lens design, one measurement and an open share link (and its token). */
  device: () => Promise<{ code: string; measurementId: number; shareLinkId: number; shareToken: string }>;
}

interface AccessRow {
  route: string;
  expected: Record<Caller, number>;
  send: (scene: Scene) => PromiseLike<Response>;
}

function row(
  route: string,
  anonymous: number,
  reviewer: number,
  researcher: number,
  manager: number,
  send: (scene: Scene) => PromiseLike<Response>,
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
  row('GET /lab-settings',                       401,     200,     200,      200, (s) => s.get('/api/lab-settings')),
  row('PATCH /lab-settings',                     401,     403,     403,      200, (s) => s.patch('/api/lab-settings', { minFeatureNm: 80 })),
  row('GET /samples/:code/lens-design',          401,     200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/lens-design`)),
  row('PUT /samples/:code/lens-design',          401,     403,     200,      200, async (s) => s.put(`/api/samples/${(await s.device()).code}/lens-design`, { wavelengthNm: 632.8, focalLengthUm: 1500, zoneCount: 40 })),
  row('GET /samples/:code/lens-design/radii.csv', 401,    200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/lens-design/radii.csv`)),
  row('GET /samples/:code/measurements',         401,     200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/measurements`)),
  row('POST /samples/:code/measurements',        401,     403,     201,      201, async (s) => s.post(`/api/samples/${(await s.device()).code}/measurements`, { kind: 'focal_length_vs_gate_voltage', rows: [{ x: 0, y: 1001 }], measuredAt: '2026-12-05T10:00:00Z' })),
  row('DELETE /samples/:code/measurements/:id',  401,     403,     204,      204, async (s) => s.delete(`/api/samples/${(await s.device()).code}/measurements/${(await s.device()).measurementId}`)),
  row('GET /samples/:code/lineage-graph',        401,     200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/lineage-graph`)),
  row('GET /samples/:code/audit',                401,     200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/audit`)),
  row('GET /samples/:code/audit.pdf',            401,     200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/audit.pdf`)),
  row('GET /samples/:code/audit.jsonld',         401,     200,     200,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/audit.jsonld`)),
  row('POST /samples/:code/share-links',         401,     403,     403,      201, async (s) => s.post(`/api/samples/${(await s.device()).code}/share-links`, { expiresInDays: 30 })),
  row('GET /samples/:code/share-links',          401,     403,     403,      200, async (s) => s.get(`/api/samples/${(await s.device()).code}/share-links`)),
  row('POST /share-links/:id/revoke',            401,     403,     403,      200, async (s) => s.post(`/api/share-links/${(await s.device()).shareLinkId}/revoke`)),
  row('GET /shared/:token',                      200,     200,     200,      200, async (s) => s.get(`/api/shared/${(await s.device()).shareToken}`)),
  row('GET /shared/:token/audit.pdf',            200,     200,     200,      200, async (s) => s.get(`/api/shared/${(await s.device()).shareToken}/audit.pdf`)),
  row('GET /shared/:token/audit.jsonld',         200,     200,     200,      200, async (s) => s.get(`/api/shared/${(await s.device()).shareToken}/audit.jsonld`)),
  row('POST /samples/:code/evidence',            401,     403,     201,      201, (s) => s.post(`/api/samples/${s.sample.code}/evidence`).field('kind', 'micrograph').attach('file', ACCESS_PNG, 'scan.png')),
  row('POST /steps/:id/evidence',                401,     403,     201,      201, (s) => s.post(`/api/steps/${s.stepId}/evidence`).field('kind', 'micrograph').attach('file', ACCESS_PNG, 'scan.png')),
  row('GET /samples/:code/evidence',             401,     200,     200,      200, (s) => s.get(`/api/samples/${s.sample.code}/evidence`)),
  row('GET /steps/:id/evidence',                 401,     200,     200,      200, (s) => s.get(`/api/steps/${s.stepId}/evidence`)),
  row('GET /evidence/:id',                       401,     200,     200,      200, async (s) => s.get(`/api/evidence/${(await s.evidence()).chipMicrographId}`)),
  row('PATCH /evidence/:id',                     401,     403,     200,      200, async (s) => s.patch(`/api/evidence/${(await s.evidence()).chipMicrographId}`, { version: 1, metadata: { exposureMs: 20 } })),
  row('POST /evidence/:id/contrast',             401,     403,     200,      200, async (s) => s.post(`/api/evidence/${(await s.evidence()).chipMicrographId}/contrast`, { flakeRegion: { shape: 'box', x: 70, y: 50, width: 40, height: 30 }, substrateRegion: { shape: 'points', points: [{ x: 20, y: 20 }, { x: 180, y: 130 }], radiusPx: 8 } })),
  row('POST /evidence/:id/candidates',           401,     403,     200,      200, async (s) => s.post(`/api/evidence/${(await s.evidence()).chipMicrographId}/candidates`)),
  row('POST /evidence/:id/candidates/:index/flake', 401,   403,     201,      201, async (s) => s.post(`/api/evidence/${(await s.evidence()).chipMicrographId}/candidates/0/flake`)),
  row('GET /files/:sha256',                      401,     200,     200,      200, async (s) => s.get(`/api/files/${(await s.evidence()).sha256}`)),
  row('GET /files/:sha256/thumbnail',            401,     200,     200,      200, async (s) => s.get(`/api/files/${(await s.evidence()).sha256}/thumbnail`)),
  row('GET /microscope-calibrations',            401,     200,     200,      200, (s) => s.get('/api/microscope-calibrations')),
  row('POST /microscope-calibrations',           401,     403,     201,      201, (s) => s.post('/api/microscope-calibrations', { microscope: 'Upright microscope 2', objectiveMagnification: 20, umPerPixel: 0.32 })),
  row('POST /microscope-calibrations/:id/retire', 401,    403,     200,      200, async (s) => s.post(`/api/microscope-calibrations/${(await s.evidence()).calibrationId}/retire`)),
];

/** A small micrograph for the upload rows; uploads go to the test app's own file store. */
const ACCESS_PNG = smallChipPng();
/** The test app's file store, seen from outside the app (same folder). */
let files: FileStore | undefined;

async function issueToken(userId: number, purpose: 'invitation' | 'password_reset'): Promise<string> {
  return lab.knex.transaction((trx) => issueLinkToken({ trx, userId, purpose, ttlMs: 3_600_000 }));
}

/** A function that runs its body on the first call and hands every caller that first result. */
function once<T>(make: () => Promise<T>): () => Promise<T> {
  let made: Promise<T> | undefined;
  return () => (made ??= make());
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
  // Built only for the rows that use them: a device scene and a micrograph cost more than the rest together.
  const device = once(async () => {
    const scene = await insertDeviceScene(lab.knex, other);
    return {
      code: scene.device,
      measurementId: scene.measurementId,
      shareLinkId: scene.shareLinkId,
      shareToken: scene.shareToken,
    };
  });
  const evidence = once(async () => {
    files ??= createFileStore(lab.config.storage);
    const chipMicrograph = await insertChipMicrograph(lab.knex, files, other);
    const calibrationId = await insertCalibration(lab.knex, other);
    return { chipMicrographId: chipMicrograph.evidence.id, sha256: chipMicrograph.sha256, calibrationId };
  });
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
    evidence,
    device,
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
