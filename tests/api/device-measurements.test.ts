import type { Role } from '../../shared/roles';
import type { DeviceMeasurement, DeviceMeasurementList } from '../../shared/schemas/device';
import { buildPerson } from '../helpers/factories';
import { focalLengthMeasurement, insertDevice, monolayerLensInput } from '../helpers/device-factories';
import { insertSample } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent, type SessionAgent } from '../helpers/session-agent';
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

const path = (code: string, rest = '') => `/api/samples/${encodeURIComponent(code)}/measurements${rest}`;

const post = (session: SessionAgent, code: string, body: object) =>
  session.agent.post(path(code)).set('x-csrf-token', session.csrfToken).send(body);

async function designedDevice(session: SessionAgent & { person: Awaited<ReturnType<typeof buildPerson>> }) {
  const { device } = await insertDevice(lab.knex, session.person);
  const response = await session.agent
    .put(`/api/samples/${encodeURIComponent(device)}/lens-design`)
    .set('x-csrf-token', session.csrfToken)
    .send(monolayerLensInput());
  if (response.status !== 200) throw new Error(`Designing failed: ${response.status} ${JSON.stringify(response.body)}`);
  return device;
}

describe('POST /api/samples/:code/measurements', () => {
  it('401 for a signed-out caller', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    expect((await agent.post(path(device)).set('x-csrf-token', csrfToken).send(focalLengthMeasurement())).status).toBe(401);
  });

  it('422 naming each impossible row', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    const wavelengths = await post(
      researcher,
      device,
      focalLengthMeasurement({
        rows: [
          { x: -532, y: 1186 },
          { x: 633, y: 0 },
        ],
      }),
    );
    expect(wavelengths.status).toBe(422);
    expect(wavelengths.body.error.fields).toEqual({
      'rows.0.x': ['The wavelength must be above zero.'],
      'rows.1.y': ['The focal length must be above zero.'],
    });
    const efficiency = await post(researcher, device, {
      ...focalLengthMeasurement(),
      kind: 'efficiency_vs_gate_voltage',
      rows: [{ x: 5000, y: 140 }],
    });
    expect(efficiency.body.error.fields).toEqual({
      'rows.0.x': ['The gate voltage must be within ±1000 V.'],
      'rows.0.y': ['An efficiency is between 0 and 100 %.'],
    });
    const empty = await post(researcher, device, focalLengthMeasurement({ rows: [] }));
    expect(empty.body.error.fields).toEqual({ rows: ['Enter at least one row.'] });
  });

  it('422 not_a_device for a flake', async () => {
    const researcher = await signedIn();
    const flake = await insertSample(lab.knex, researcher.person, { kind: 'flake', material: 'MoS2' });
    const response = await post(researcher, flake.code, focalLengthMeasurement());
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('not_a_device');
  });

  it('403 for a reviewer; 404 for an unknown device', async () => {
    const reviewer = await signedIn('reviewer');
    const { device } = await insertDevice(lab.knex, reviewer.person);
    expect((await post(reviewer, device, focalLengthMeasurement())).status).toBe(403);
    const researcher = await signedIn();
    expect((await post(researcher, 'DV-000000', focalLengthMeasurement())).status).toBe(404);
  });

  it('201 with the design prediction f(λ) = f₀λ₀/λ beside the measured focal lengths, logged in the history', async () => {
    const researcher = await signedIn();
    const device = await designedDevice(researcher);
    const response = await post(researcher, device, focalLengthMeasurement());
    expect(response.status).toBe(201);
    const measurement = response.body.measurement as DeviceMeasurement;
    expect(measurement).toMatchObject({
      deviceCode: device,
      kind: 'focal_length_vs_wavelength',
      instrument: 'Optical bench 2, knife-edge focus scan',
      measuredBy: { id: researcher.person.id },
      measuredAt: '2026-12-04T14:00:00.000Z',
    });
    expect(measurement.rows[1]).toEqual({ x: 632.8, y: 1003, note: 'design wavelength' });
    // A zone plate's focal length scales as 1/λ: f(λ) = f₀λ₀/λ (Attwood, Soft X-Rays and EUV
    // Radiation, ch. 9, chromatic aberration of zone plates). f₀ = 1000 µm at λ₀ = 632.8 nm.
    const curve = measurement.prediction?.curve ?? [];
    expect(curve[0]).toEqual({ x: 532, y: expect.any(Number) });
    expect(curve[0].y).toBeCloseTo((1000 * 632.8) / 532, 6);
    expect(curve[curve.length - 1].x).toBe(780);
    expect(curve[curve.length - 1].y).toBeCloseTo((1000 * 632.8) / 780, 6);
    for (const point of curve) expect(point.x * point.y).toBeCloseTo(632_800, 3);
    const event = await lab.knex('history_events').where({ type: 'measurement.added' }).first();
    expect(event).toMatchObject({ subjectCode: device, actorId: researcher.person.id });
    expect(event.payload).toMatchObject({ measurementId: measurement.id, kind: 'focal_length_vs_wavelength', rowCount: 3 });
  });

  it('efficiency against gate voltage is shown with the ideal amplitude (1/π²) and phase (4/π²) levels', async () => {
    const researcher = await signedIn();
    const device = await designedDevice(researcher);
    const response = await post(researcher, device, {
      kind: 'efficiency_vs_gate_voltage',
      rows: [
        { x: -20, y: 6.1 },
        { x: 0, y: 7.4 },
        { x: 20, y: 9.0 },
      ],
      measuredAt: '2026-12-05T10:00:00Z',
    });
    expect(response.status).toBe(201);
    const { prediction } = response.body.measurement as DeviceMeasurement;
    // 1/π² = 10.13 % and 4/π² = 40.53 % (Kirz 1974; Attwood ch. 9).
    expect(prediction?.levels.map((level) => level.label)).toEqual(['Ideal amplitude plate', 'Ideal phase plate']);
    expect(prediction?.levels[0].y).toBeCloseTo(100 / Math.PI ** 2, 9);
    expect(prediction?.levels[1].y).toBeCloseTo(400 / Math.PI ** 2, 9);
    expect(prediction?.curve).toEqual([]);
  });
});

describe('GET /api/samples/:code/measurements', () => {
  it('401 for a signed-out caller; 404 for an unknown device', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    expect((await agent.get(path(device))).status).toBe(401);
    const reviewer = await signedIn('reviewer');
    expect((await reviewer.agent.get(path('DV-000000'))).status).toBe(404);
  });

  it('every measurement by time, without a prediction while the device has no design', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    await post(researcher, device, focalLengthMeasurement({ measuredAt: '2026-12-06T09:00:00Z' }));
    await post(researcher, device, {
      kind: 'focal_length_vs_gate_voltage',
      rows: [{ x: 0, y: 1002 }],
      measuredAt: '2026-12-05T09:00:00Z',
    });
    const reviewer = await signedIn('reviewer');
    const { measurements } = (await reviewer.agent.get(path(device))).body as DeviceMeasurementList;
    expect(measurements.map((entry) => [entry.kind, entry.prediction])).toEqual([
      ['focal_length_vs_gate_voltage', null],
      ['focal_length_vs_wavelength', null],
    ]);
  });
});

describe('DELETE /api/samples/:code/measurements/:id', () => {
  it('401 signed out; 403 reviewer; 404 for a measurement of another device', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    const other = await insertDevice(lab.knex, researcher.person);
    const { measurement } = (await post(researcher, device, focalLengthMeasurement())).body as { measurement: DeviceMeasurement };
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    expect((await agent.delete(path(device, `/${measurement.id}`)).set('x-csrf-token', csrfToken)).status).toBe(401);
    const reviewer = await signedIn('reviewer');
    expect((await reviewer.agent.delete(path(device, `/${measurement.id}`)).set('x-csrf-token', reviewer.csrfToken)).status).toBe(
      403,
    );
    const wrong = await researcher.agent
      .delete(path(other.device, `/${measurement.id}`))
      .set('x-csrf-token', researcher.csrfToken);
    expect(wrong.status).toBe(404);
    expect(await lab.knex('device_measurements').count({ count: '*' }).first()).toEqual({ count: 1 });
  });

  it('204, and the deleted rows stay in the history', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    const { measurement } = (await post(researcher, device, focalLengthMeasurement())).body as { measurement: DeviceMeasurement };
    const response = await researcher.agent.delete(path(device, `/${measurement.id}`)).set('x-csrf-token', researcher.csrfToken);
    expect(response.status).toBe(204);
    expect((await researcher.agent.get(path(device))).body).toEqual({ measurements: [] });
    const event = await lab.knex('history_events').where({ type: 'measurement.deleted' }).first();
    expect(event.payload).toMatchObject({ measurementId: measurement.id, rows: focalLengthMeasurement().rows });
  });
});
