import type { Role } from '../../shared/roles';
import type { LabSettings, LensDesignEnvelope } from '../../shared/schemas/device';
import { ZONE_PLATE_MESSAGES } from '../../shared/zone-plate/validation';
import { buildPerson } from '../helpers/factories';
import { insertDevice, monolayerLensInput } from '../helpers/device-factories';
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

const path = (code: string, rest = '') => `/api/samples/${encodeURIComponent(code)}/lens-design${rest}`;

async function putDesign(session: SessionAgent, code: string, body: object) {
  return session.agent.put(path(code)).set('x-csrf-token', session.csrfToken).send(body);
}

async function setLabLimit(minFeatureNm: number) {
  const manager = await signedIn('manager');
  const response = await manager.agent.patch('/api/lab-settings').set('x-csrf-token', manager.csrfToken).send({ minFeatureNm });
  if (response.status !== 200)
    throw new Error(`Setting the lab limit failed: ${response.status} ${JSON.stringify(response.body)}`);
}

/**
 * Exact zone radii, r_n = √(nλf + (nλ/2)²), in µm (Attwood, Soft X-Rays and Extreme Ultraviolet
 * Radiation, ch. 9, zone-plate radii), written out here independently of shared/zone-plate/.
 */
const exactRadiusUm = (n: number, wavelengthUm: number, focalLengthUm: number) =>
  Math.sqrt(n * wavelengthUm * focalLengthUm + ((n * wavelengthUm) / 2) ** 2);

describe('GET /api/lab-settings and PATCH /api/lab-settings', () => {
  it('401 for a signed-out caller', async () => {
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get('/api/lab-settings')).status).toBe(401);
  });

  it('422 for a limit that is not a positive length', async () => {
    const manager = await signedIn('manager');
    const response = await manager.agent
      .patch('/api/lab-settings')
      .set('x-csrf-token', manager.csrfToken)
      .send({ minFeatureNm: -5 });
    expect(response.status).toBe(422);
    expect(response.body.error.fields.minFeatureNm).toEqual(['The smallest feature your lithography writes must be above zero.']);
  });

  it('403 for a researcher changing the limit', async () => {
    const researcher = await signedIn('researcher');
    const response = await researcher.agent
      .patch('/api/lab-settings')
      .set('x-csrf-token', researcher.csrfToken)
      .send({ minFeatureNm: 50 });
    expect(response.status).toBe(403);
  });

  it('the default (100 nm) until a manager sets it; the change is in the history', async () => {
    const reviewer = await signedIn('reviewer');
    const before = (await reviewer.agent.get('/api/lab-settings')).body.settings as LabSettings;
    expect(before).toEqual({ minFeatureNm: 100, isDefault: true, updatedAt: null, updatedBy: null });

    await setLabLimit(80);
    const after = (await reviewer.agent.get('/api/lab-settings')).body.settings as LabSettings;
    expect(after).toMatchObject({ minFeatureNm: 80, isDefault: false, updatedBy: { displayName: expect.any(String) } });
    const event = await lab.knex('history_events').where({ type: 'lab_settings.changed' }).first();
    expect(event.payload).toEqual({ minFeatureNm: { from: 100, to: 80 } });
  });
});

describe('PUT /api/samples/:code/lens-design', () => {
  it('401 for a signed-out caller', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent.put(path(device)).set('x-csrf-token', csrfToken).send(monolayerLensInput());
    expect(response.status).toBe(401);
  });

  it.each([
    ['a zero wavelength', { wavelengthNm: 0 }, 'wavelengthNm', ZONE_PLATE_MESSAGES.wavelengthPositive],
    ['a negative focal length', { focalLengthUm: -1000 }, 'focalLengthUm', ZONE_PLATE_MESSAGES.focalLengthPositive],
    // The central disc alone needs 2√(λf + λ²/4) ≈ 50.315 µm at 632.8 nm and f = 1 mm.
    [
      'an aperture too small for one zone',
      { apertureDiameterUm: 40 },
      'apertureDiameterUm',
      'Aperture too small for one zone: the first zone needs 50.32 µm.',
    ],
    [
      'more zones than the aperture holds',
      { zoneCount: 120 },
      'zoneCount',
      '120 zones need an aperture of 556.3 µm; the 500 µm aperture holds 97 zones.',
    ],
    [
      'neither aperture nor zone count',
      { apertureDiameterUm: undefined },
      'apertureDiameterUm',
      ZONE_PLATE_MESSAGES.apertureOrZoneCount,
    ],
  ])('422 for %s, with the field message', async (_case, change, field, message) => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    const response = await putDesign(researcher, device, { ...monolayerLensInput(), ...change });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(response.body.error.fields[field]).toEqual([message]);
    expect(await lab.knex('lens_designs').count({ count: '*' }).first()).toEqual({ count: 0 });
  });

  it('422 not_a_device for a flake', async () => {
    const researcher = await signedIn();
    const flake = await insertSample(lab.knex, researcher.person, { kind: 'flake', material: 'MoS2' });
    const response = await putDesign(researcher, flake.code, monolayerLensInput());
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('not_a_device');
    expect(response.body.error.message).toMatch(/only a device can carry a lens design/);
  });

  it('403 for a reviewer', async () => {
    const reviewer = await signedIn('reviewer');
    const { device } = await insertDevice(lab.knex, reviewer.person);
    expect((await putDesign(reviewer, device, monolayerLensInput())).status).toBe(403);
  });

  it('404 for an unknown device', async () => {
    const researcher = await signedIn();
    expect((await putDesign(researcher, 'DV-000000', monolayerLensInput())).status).toBe(404);
  });

  it('stores a monolayer lens 0.5 mm across, f = 1 mm at 632.8 nm, on the lithography step that made the device', async () => {
    const researcher = await signedIn();
    const { device, lithographyStepId } = await insertDevice(lab.knex, researcher.person);
    const response = await putDesign(researcher, device, monolayerLensInput());
    expect(response.status).toBe(200);
    const { design, earlier } = response.body as LensDesignEnvelope;
    expect(earlier).toEqual([]);
    expect(design).toMatchObject({ deviceCode: device, lithographyStepId, labMinFeatureNm: 100, warnings: [] });
    const wavelengthUm = 0.6328;
    // The most zones a 500 µm aperture holds: the largest N with 2 r_N ≤ 500 µm.
    let zones = 0;
    while (2 * exactRadiusUm(zones + 1, wavelengthUm, 1000) <= 500) zones += 1;
    expect(zones).toBe(97);
    const summary = design?.summary;
    expect(summary?.zoneCount).toBe(zones);
    expect(summary?.lensDiameterUm).toBeCloseTo(2 * exactRadiusUm(zones, wavelengthUm, 1000), 9);
    expect(summary?.outermostZoneWidthUm).toBeCloseTo(
      exactRadiusUm(zones, wavelengthUm, 1000) - exactRadiusUm(zones - 1, wavelengthUm, 1000),
      9,
    );
    // Ideal binary-plate efficiencies 1/π² ≈ 10.1 % and 4/π² ≈ 40.5 % (Attwood, ch. 9).
    expect(summary?.idealFirstOrderEfficiency.amplitudePlate).toBeCloseTo(0.1013, 4);
    expect(summary?.idealFirstOrderEfficiency.phasePlate).toBeCloseTo(0.4053, 4);

    const stored = await lab.knex('lens_designs').where({ id: design?.id }).first();
    expect(stored.stepId).toBe(lithographyStepId);
    const event = await lab.knex('history_events').where({ type: 'lens_design.saved' }).first();
    expect(event).toMatchObject({ subjectCode: device, stepId: lithographyStepId });
    expect(event.payload).toMatchObject({ designId: design?.id, zoneCount: 97 });
  });

  it("the lab's lithography setting replaces the form's limit; a second design keeps the first as earlier", async () => {
    await setLabLimit(1500);
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    await putDesign(researcher, device, monolayerLensInput({ minFeatureNm: 10 }));
    const response = await putDesign(researcher, device, monolayerLensInput({ focalLengthUm: 2000 }));
    const { design, earlier } = response.body as LensDesignEnvelope;
    expect(design?.input.minFeatureNm).toBe(1500);
    expect(design?.input.focalLengthUm).toBe(2000);
    expect(earlier).toEqual([expect.objectContaining({ focalLengthUm: 1000, zoneCount: 97 })]);
  });
});

describe('GET /api/samples/:code/lens-design', () => {
  it('401 for a signed-out caller', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(path(device))).status).toBe(401);
  });

  it('404 for an unknown record', async () => {
    const reviewer = await signedIn('reviewer');
    expect((await reviewer.agent.get(path('DV-000000'))).status).toBe(404);
  });

  it('null for a device without a design', async () => {
    const reviewer = await signedIn('reviewer');
    const { device } = await insertDevice(lab.knex, reviewer.person);
    expect((await reviewer.agent.get(path(device))).body).toEqual({ design: null, earlier: [] });
  });

  it('warns when the outermost zone is narrower than what the lab writes, against the current setting', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    await putDesign(researcher, device, monolayerLensInput());
    const reviewer = await signedIn('reviewer');
    expect(((await reviewer.agent.get(path(device))).body as LensDesignEnvelope).design?.warnings).toEqual([]);

    // The outermost zone is about 1.27 µm wide (λf/(2r_N), Attwood ch. 9); a 2 µm process cannot write it.
    await setLabLimit(2000);
    const { design } = (await reviewer.agent.get(path(device))).body as LensDesignEnvelope;
    expect(design?.labMinFeatureNm).toBe(2000);
    expect(design?.warnings).toEqual([
      {
        code: 'zone-narrower-than-lithography',
        message: expect.stringMatching(/^The outermost zone is 1\d{3}(\.\d+)? nm wide; your lithography writes 2000 nm\./),
      },
    ]);
    // What was stored keeps the check made when it was saved.
    expect(design?.summary.warnings).toEqual([]);
  });
});

describe('GET /api/samples/:code/lens-design/radii.csv', () => {
  it('401 for a signed-out caller', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(path(device, '/radii.csv'))).status).toBe(401);
  });

  it('404 for a device without a design', async () => {
    const reviewer = await signedIn('reviewer');
    const { device } = await insertDevice(lab.knex, reviewer.person);
    const response = await reviewer.agent.get(path(device, '/radii.csv'));
    expect(response.status).toBe(404);
    expect(response.body.error.message).toBe(`${device} has no lens design yet.`);
  });

  it('the etched zones with exact radii, first rows against r_n = √(nλf + (nλ/2)²)', async () => {
    const researcher = await signedIn();
    const { device } = await insertDevice(lab.knex, researcher.person);
    await putDesign(researcher, device, monolayerLensInput());
    const response = await researcher.agent.get(path(device, '/radii.csv'));
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^text\/csv/);
    expect(response.headers['content-disposition']).toMatch(/attachment; filename=".*-zone-radii\.csv"/);
    const lines = response.text.trimEnd().split('\n');
    expect(lines[0]).toBe('zone,inner_radius_um,outer_radius_um,width_nm');
    // Odd zones are etched by default: 1 (the central disc), 3, 5 … 97 → 49 rows.
    expect(lines).toHaveLength(1 + 49);
    const r = (n: number) => (n === 0 ? 0 : exactRadiusUm(n, 0.6328, 1000));
    for (const [index, zone] of [1, 3, 5].entries()) {
      const [number, inner, outer, width] = lines[index + 1].split(',').map(Number);
      expect(number).toBe(zone);
      expect(inner).toBeCloseTo(r(zone - 1), 6);
      expect(outer).toBeCloseTo(r(zone), 6);
      expect(width).toBeCloseTo((r(zone) - r(zone - 1)) * 1000, 3);
    }
    // r_1 = √(λf + λ²/4) = √(632.8 + 0.1001) µm ≈ 25.1575 µm.
    expect(Number(lines[1].split(',')[2])).toBeCloseTo(25.1575, 4);
  });
});
