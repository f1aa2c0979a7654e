import type { Role } from '../../shared/roles';
import type { Sample } from '../../shared/schemas/sample';
import type { Step, StepCreateInput } from '../../shared/schemas/step';
import type { StepType } from '../../shared/steps';
import type { UserModel } from '../../server/models/user-model';
import { buildPerson } from '../helpers/factories';
import {
  codeWithBody,
  insertSample,
  insertStep,
  logStep,
  outputCodes,
  rowCounts,
  STEP_PARAMETERS,
  stepBody,
} from '../helpers/sample-factories';
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

const codes = (samples: { code: string }[]) => samples.map((sample) => sample.code);

async function sampleRow(code: string) {
  return lab.knex('samples').where({ code }).first();
}

describe('POST /api/steps', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('cvd_growth', { outputs: [{ kind: 'film', material: 'MoS2' }] }));
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  // Each case starts from a valid exfoliation of a real crystal and breaks one thing.
  it.each<{ case: string; field: string; breakIt: (valid: StepCreateInput) => object }>([
    {
      case: 'no peel at all',
      field: 'parameters.peelCycles',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, peelCycles: 0 } }),
    },
    {
      case: 'a fractional number of peels',
      field: 'parameters.peelCycles',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, peelCycles: 2.5 } }),
    },
    {
      case: 'peel cycles left out',
      field: 'parameters.peelCycles',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, peelCycles: undefined } }),
    },
    {
      case: 'a substrate not on the list',
      field: 'parameters.substrate',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, substrate: 'glass slide' } }),
    },
    {
      case: 'a transfer temperature given as text',
      field: 'parameters.transferTemperatureC',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, transferTemperatureC: '25' } }),
    },
    {
      case: 'a transfer temperature below absolute zero',
      field: 'parameters.transferTemperatureC',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, transferTemperatureC: -273.16 } }),
    },
    {
      case: 'a parameter the step type does not have',
      field: 'parameters',
      breakIt: (valid) => ({ ...valid, parameters: { ...STEP_PARAMETERS.exfoliation, twistAngleDeg: 1.1 } }),
    },
    {
      case: 'an end before the start',
      field: 'endedAt',
      breakIt: (valid) => ({ ...valid, startedAt: '2026-12-03T10:00:00Z', endedAt: '2026-12-03T09:59:59Z' }),
    },
    {
      case: 'a start that is not a date-time',
      field: 'startedAt',
      breakIt: (valid) => ({ ...valid, startedAt: '3 December, morning' }),
    },
    { case: 'an unknown step type', field: 'type', breakIt: (valid) => ({ ...valid, type: 'sputtering' }) },
    { case: 'no samples used, treated or made', field: 'inputs', breakIt: (valid) => ({ ...valid, inputs: [], outputs: [] }) },
    {
      case: 'an output count of zero',
      field: 'outputs.0.count',
      breakIt: (valid) => ({ ...valid, outputs: [{ kind: 'chip', count: 0 }] }),
    },
    {
      case: 'an output of an unknown kind',
      field: 'outputs.0.kind',
      breakIt: (valid) => ({ ...valid, outputs: [{ kind: 'wafer' }] }),
    },
    {
      case: 'an output with a negative oxide thickness',
      field: 'outputs.0.properties.oxideThicknessNm',
      breakIt: (valid) => ({ ...valid, outputs: [{ kind: 'chip', properties: { oxideThicknessNm: -90 } }] }),
    },
  ])('422 validation_failed naming $field for $case', async ({ breakIt, field }) => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'WSe2' });
    const valid = stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 2 }] });
    const before = await rowCounts(lab.knex);
    const response = await agent.post('/api/steps').set('x-csrf-token', csrfToken).send(breakIt(valid));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual([field]);
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  it.each<[string, StepType, Record<string, unknown>, string]>([
    ['a negative etch time', 'etching', { ...STEP_PARAMETERS.etching, durationS: -45 }, 'parameters.durationS'],
    ['a zero anneal time', 'annealing', { ...STEP_PARAMETERS.annealing, durationMin: 0 }, 'parameters.durationMin'],
    ['a negative hold time', 'cvd_growth', { ...STEP_PARAMETERS.cvd_growth, holdTimeMin: -5 }, 'parameters.holdTimeMin'],
    [
      'an anneal below absolute zero',
      'annealing',
      { ...STEP_PARAMETERS.annealing, temperatureC: -300 },
      'parameters.temperatureC',
    ],
    [
      'a furnace zone below absolute zero',
      'cvd_growth',
      { ...STEP_PARAMETERS.cvd_growth, zoneTemperaturesC: [750, -274] },
      'parameters.zoneTemperaturesC.1',
    ],
    ['no precursor', 'cvd_growth', { ...STEP_PARAMETERS.cvd_growth, precursors: [] }, 'parameters.precursors'],
    ['a blank resist', 'lithography', { ...STEP_PARAMETERS.lithography, resist: '  ' }, 'parameters.resist'],
    [
      'a negative metal thickness',
      'metal_deposition',
      { ...STEP_PARAMETERS.metal_deposition, thicknessNm: -65 },
      'parameters.thicknessNm',
    ],
    ['a transfer neither dry nor wet', 'transfer', { ...STEP_PARAMETERS.transfer, method: 'semi-dry' }, 'parameters.method'],
  ])('422 validation_failed for %s', async (_case, type, parameters, field) => {
    const { person, agent, csrfToken } = await signedIn();
    const flake = await insertSample(lab.knex, person);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody(type, { parameters, treated: [flake.code] }));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual([field]);
  });

  it('422 validation_failed naming inputs.0 for an input code nobody has, and the treated sample with a typo', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const flake = await insertSample(lab.knex, person);
    const unknown = codeWithBody('FK', '7Y2Q9D');
    const typo = flake.code.slice(0, -1) + (flake.code.endsWith('0') ? '1' : '0');
    const before = await rowCounts(lab.knex);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('annealing', { inputs: [{ code: unknown }], treated: [typo], outputs: [{ kind: 'flake' }] }));
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['inputs.0', 'treated.0']);
    expect(response.body.error.fields['inputs.0'].join(' ')).toContain(unknown);
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  it('422 validation_failed for a sample named twice in one step', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const flake = await insertSample(lab.knex, person);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(
        stepBody('stacking', {
          inputs: [{ code: flake.code }, { code: flake.code.toLowerCase() }],
          outputs: [{ kind: 'stack' }],
        }),
      );
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['inputs.1']);
  });

  it('403 forbidden for a reviewer; nothing is written', async () => {
    const { person, agent, csrfToken } = await signedIn('reviewer');
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    const before = await rowCounts(lab.knex);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }));
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  it('404 not_found for an operator who does not exist', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('exfoliation', { operatorId: 424_242, inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }));
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it.each(['used_up', 'discarded', 'missing'] as const)('409 sample_unavailable for an input that is %s', async (status) => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', status });
    const before = await rowCounts(lab.knex);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }));
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('sample_unavailable');
    expect(response.body.error.message).toContain(crystal.code);
    expect(await rowCounts(lab.knex)).toEqual(before);
  });

  it('409 sample_unavailable for a retired input, and for a retired sample to treat', async () => {
    const { person, agent, csrfToken } = await signedIn('manager');
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    await agent
      .post(`/api/samples/${crystal.code}/retirement`)
      .set('x-csrf-token', csrfToken)
      .send({ version: 1, reason: 'Oxidised beyond use' })
      .expect(200);
    const asInput = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }));
    const treated = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('annealing', { treated: [crystal.code] }));
    for (const response of [asInput, treated]) {
      expect(response.status).toBe(409);
      expect(response.body.error.code).toBe('sample_unavailable');
      expect(response.body.error.message).toContain(`${crystal.code} is retired`);
    }
  });

  it('409 sample_unavailable for a crystal used up by an earlier step', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    await logStep(
      agent,
      csrfToken,
      stepBody('cleaving', { inputs: [{ code: crystal.code, consumed: true }], outputs: [{ kind: 'crystal', count: 2 }] }),
    );
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }));
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('sample_unavailable');
    expect(response.body.error.message).toContain(`${crystal.code} is used up`);
  });

  describe('201 for each step type with realistic parameters', () => {
    interface Scenario {
      body: StepCreateInput;
      inputs: string[];
      treated: string[];
      outputs: number;
    }
    const scenarios: Record<StepType, (owner: UserModel) => Promise<Scenario>> = {
      exfoliation: async (owner) => {
        const crystal = await insertSample(lab.knex, owner, { kind: 'crystal', material: 'hBN' });
        const body = stepBody('exfoliation', {
          inputs: [{ code: crystal.code }],
          outputs: [{ kind: 'chip', count: 4, name: 'hBN chip', properties: { substrate: 'si_sio2', oxideThicknessNm: 285 } }],
        });
        return { body, inputs: [crystal.code], treated: [], outputs: 4 };
      },
      cvd_growth: async (owner) => {
        const chip = await insertSample(lab.knex, owner, { kind: 'chip', material: 'sapphire' });
        const body = stepBody('cvd_growth', {
          instrument: 'Two-zone tube furnace',
          inputs: [{ code: chip.code, consumed: true }],
          outputs: [{ kind: 'film', material: 'MoS2', properties: { substrate: 'sapphire' } }],
        });
        return { body, inputs: [chip.code], treated: [], outputs: 1 };
      },
      transfer: async (owner) => {
        const film = await insertSample(lab.knex, owner, { kind: 'film', material: 'MoS2' });
        const body = stepBody('transfer', {
          inputs: [{ code: film.code, consumed: true }],
          outputs: [{ kind: 'film', properties: { substrate: 'si_sio2', oxideThicknessNm: 90 } }],
        });
        return { body, inputs: [film.code], treated: [], outputs: 1 };
      },
      stacking: async (owner) => {
        const bottom = await insertSample(lab.knex, owner, { kind: 'flake', material: 'hBN' });
        const top = await insertSample(lab.knex, owner, { kind: 'flake', material: 'graphene' });
        const body = stepBody('stacking', {
          inputs: [
            { code: bottom.code, consumed: true },
            { code: top.code, consumed: true },
          ],
          outputs: [{ kind: 'stack', material: 'graphene/hBN' }],
        });
        return { body, inputs: [bottom.code, top.code], treated: [], outputs: 1 };
      },
      lithography: async (owner) => {
        const stack = await insertSample(lab.knex, owner, { kind: 'stack', material: 'graphene/hBN' });
        return {
          body: stepBody('lithography', { instrument: 'EBL system', treated: [stack.code] }),
          inputs: [],
          treated: [stack.code],
          outputs: 0,
        };
      },
      etching: async (owner) => {
        const stack = await insertSample(lab.knex, owner, { kind: 'stack', material: 'graphene/hBN' });
        return {
          body: stepBody('etching', { instrument: 'RIE chamber', treated: [stack.code] }),
          inputs: [],
          treated: [stack.code],
          outputs: 0,
        };
      },
      annealing: async (owner) => {
        const flake = await insertSample(lab.knex, owner, { kind: 'flake', material: 'WSe2' });
        return {
          body: stepBody('annealing', { instrument: 'Tube furnace', treated: [flake.code] }),
          inputs: [],
          treated: [flake.code],
          outputs: 0,
        };
      },
      encapsulation: async (owner) => {
        const device = await insertSample(lab.knex, owner, { kind: 'device', material: 'graphene/hBN' });
        return { body: stepBody('encapsulation', { treated: [device.code] }), inputs: [], treated: [device.code], outputs: 0 };
      },
      metal_deposition: async (owner) => {
        const stack = await insertSample(lab.knex, owner, { kind: 'stack', material: 'graphene/hBN' });
        const body = stepBody('metal_deposition', {
          instrument: 'E-beam evaporator',
          inputs: [{ code: stack.code, consumed: true }],
          outputs: [{ kind: 'device', name: 'Hall bar D1', properties: { deviceType: 'Hall bar' } }],
        });
        return { body, inputs: [stack.code], treated: [], outputs: 1 };
      },
      cleaving: async (owner) => {
        const crystal = await insertSample(lab.knex, owner, { kind: 'crystal', material: 'graphite' });
        const body = stepBody('cleaving', {
          inputs: [{ code: crystal.code, consumed: true }],
          outputs: [{ kind: 'crystal', count: 2, name: 'Graphite half' }],
        });
        return { body, inputs: [crystal.code], treated: [], outputs: 2 };
      },
      flake_search: async (owner) => {
        const chip = await insertSample(lab.knex, owner, { kind: 'chip', material: 'MoS2' });
        const body = stepBody('flake_search', {
          instrument: 'Upright microscope 2',
          inputs: [{ code: chip.code }],
          outputs: [{ kind: 'flake', name: 'Monolayer near the chip corner' }],
        });
        return { body, inputs: [chip.code], treated: [], outputs: 1 };
      },
    };

    it.each(Object.keys(scenarios) as StepType[])('%s', async (type) => {
      const { person, agent, csrfToken } = await signedIn();
      const scenario = await scenarios[type](person);
      const response = await agent.post('/api/steps').set('x-csrf-token', csrfToken).send(scenario.body);
      expect(response.status).toBe(201);
      const step = response.body.step as Step;
      expect(step).toMatchObject({
        type,
        operator: { id: person.id, displayName: person.displayName },
        startedAt: '2026-12-03T09:30:00.000Z',
        endedAt: '2026-12-03T10:10:00.000Z',
        instrument: scenario.body.instrument,
        parameters: STEP_PARAMETERS[type],
      });
      expect(codes(step.inputs)).toEqual(scenario.inputs);
      expect(codes(step.treated)).toEqual(scenario.treated);
      expect(step.outputs).toHaveLength(scenario.outputs);
      const fetched = await agent.get(`/api/steps/${step.id}`);
      expect(fetched.status).toBe(200);
      expect(fetched.body.step).toEqual(step);
    });
  });

  it('201 fills in parameter defaults: no pretreatment, no hydrogen flow', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'MoTe2' });
    const { pretreatment: _pretreatment, ...exfoliation } = STEP_PARAMETERS.exfoliation;
    const exfoliated = await logStep(
      agent,
      csrfToken,
      stepBody('exfoliation', { parameters: exfoliation, inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip' }] }),
    );
    expect(exfoliated.parameters.pretreatment).toBe('none');
    const { hydrogenFlowSccm: _hydrogen, ...growth } = STEP_PARAMETERS.cvd_growth;
    const grown = await logStep(
      agent,
      csrfToken,
      stepBody('cvd_growth', { parameters: growth, outputs: [{ kind: 'film', material: 'WS2' }] }),
    );
    expect(grown.parameters.hydrogenFlowSccm).toBe(0);
  });

  it('201 accepts a temperature of exactly absolute zero, the bound itself', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const flake = await insertSample(lab.knex, person);
    const step = await logStep(
      agent,
      csrfToken,
      stepBody('stacking', {
        parameters: { temperatureC: -273.15 },
        inputs: [{ code: flake.code }],
        outputs: [{ kind: 'stack' }],
      }),
    );
    expect(step.parameters.temperatureC).toBe(-273.15);
  });

  it('201 exfoliating a crystal onto 3 chips makes 3 chip records of its material, linked to it, each with a created event naming the step', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'WSe2', name: 'WSe2 boule 4' });
    const step = await logStep(
      agent,
      csrfToken,
      stepBody('exfoliation', {
        inputs: [{ code: crystal.code }],
        outputs: [{ kind: 'chip', count: 3, name: 'WSe2 chip', properties: { substrate: 'si_sio2', oxideThicknessNm: 285 } }],
      }),
    );
    expect(step.outputs).toHaveLength(3);
    for (const output of step.outputs) {
      expect(output.code).toMatch(/^CH-[0-9A-HJKMNP-TV-Z]{6}[0-9A-HJKMNP-TV-Z*~$=U]$/);
      expect(output).toMatchObject({ kind: 'chip', material: 'WSe2', status: 'ready' });
    }
    expect(step.outputs.map((output) => output.name).sort()).toEqual(['WSe2 chip 1', 'WSe2 chip 2', 'WSe2 chip 3']);
    expect(step.inputs).toEqual([expect.objectContaining({ code: crystal.code, consumed: false })]);

    const links = await lab.knex('lineage_links').where({ stepId: step.id }).select('parentId', 'childId');
    const chipIds = (await lab.knex('samples').whereIn('code', codes(step.outputs)).select('id')).map((row) => row.id);
    expect(links).toHaveLength(3);
    expect(links.map((link) => link.parentId)).toEqual([crystal.id, crystal.id, crystal.id]);
    expect(links.map((link) => link.childId).sort()).toEqual([...chipIds].sort());

    const chip = (await agent.get(`/api/samples/${step.outputs[0].code}`)).body.sample as Sample;
    expect(chip).toMatchObject({
      owner: { id: person.id },
      properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
      madeBy: { stepId: step.id, type: 'exfoliation' },
      parents: [expect.objectContaining({ code: crystal.code })],
    });
    const created = await lab.knex('history_events').where({ type: 'sample.created', stepId: step.id });
    expect(created.map((event) => event.subjectCode).sort()).toEqual(codes(step.outputs).sort());
    for (const event of created) expect(event.payload).toMatchObject({ kind: 'chip', material: 'WSe2', ownerId: person.id });
    expect(await sampleRow(crystal.code)).toMatchObject({ status: 'ready', version: 1 });
  });

  it('201 with consumed: true marks the input used up, with a status event naming the step', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const film = await insertSample(lab.knex, person, { kind: 'film', material: 'MoS2' });
    const step = await logStep(
      agent,
      csrfToken,
      stepBody('transfer', { inputs: [{ code: film.code, consumed: true }], outputs: [{ kind: 'film' }] }),
    );
    expect(step.inputs).toEqual([expect.objectContaining({ code: film.code, consumed: true, status: 'used_up' })]);
    expect(await sampleRow(film.code)).toMatchObject({ status: 'used_up', version: 2 });
    const statusEvents = await lab.knex('history_events').where({ subjectCode: film.code, type: 'sample.status_changed' });
    expect(statusEvents).toEqual([
      expect.objectContaining({ stepId: step.id, actorId: person.id, payload: { from: 'ready', to: 'used_up' } }),
    ]);
  });

  it('422 for a step that fails part-way leaves no trace: no samples, step, participation, links, history or status change', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const hbn = await insertSample(lab.knex, person, { kind: 'flake', material: 'hBN' });
    const graphene = await insertSample(lab.knex, person, { kind: 'flake', material: 'graphene' });
    const before = await rowCounts(lab.knex);
    const response = await agent
      .post('/api/steps')
      .set('x-csrf-token', csrfToken)
      .send(
        stepBody('stacking', {
          inputs: [
            { code: hbn.code, consumed: true },
            { code: graphene.code, consumed: true },
          ],
          // The first output names its material; the second cannot inherit one from mixed inputs.
          outputs: [
            { kind: 'stack', material: 'graphene/hBN', count: 2 },
            { kind: 'flake', count: 3 },
          ],
        }),
      );
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['outputs.1.material']);
    expect(await rowCounts(lab.knex)).toEqual(before);
    expect(await sampleRow(hbn.code)).toMatchObject({ status: 'ready', version: 1 });
    expect(await sampleRow(graphene.code)).toMatchObject({ status: 'ready', version: 1 });
    expect((await agent.get('/api/history/verify')).body).toMatchObject({ intact: true, checked: before.history_events });
  });

  it('201 stacking two flakes makes one stack with both as parents, bottom first', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const bottom = await insertSample(lab.knex, person, { kind: 'flake', material: 'hBN', name: 'Bottom hBN' });
    const top = await insertSample(lab.knex, person, { kind: 'flake', material: 'hBN', name: 'Top hBN' });
    const step = await logStep(
      agent,
      csrfToken,
      stepBody('stacking', {
        inputs: [
          { code: bottom.code, consumed: true },
          { code: top.code, consumed: true },
        ],
        outputs: [{ kind: 'stack', name: 'hBN/hBN stack' }],
      }),
    );
    expect(codes(step.inputs)).toEqual([bottom.code, top.code]);
    expect(step.outputs).toEqual([expect.objectContaining({ kind: 'stack', material: 'hBN', name: 'hBN/hBN stack' })]);
    const stack = (await agent.get(`/api/samples/${step.outputs[0].code}`)).body.sample as Sample;
    expect(codes(stack.parents)).toEqual([bottom.code, top.code].sort());
    expect(await lab.knex('lineage_links').where({ stepId: step.id }).count({ count: '*' }).first()).toEqual({ count: 2 });
  });

  it('201 reads input codes forgivingly: lower case, no hyphen', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'graphite' });
    const step = await logStep(
      agent,
      csrfToken,
      stepBody('exfoliation', { inputs: [{ code: crystal.code.toLowerCase().replace('-', '') }], outputs: [{ kind: 'chip' }] }),
    );
    expect(codes(step.inputs)).toEqual([crystal.code]);
  });

  it('201 records another person as the operator when named; the caller otherwise', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const colleague = await buildPerson(lab.knex);
    const flake = await insertSample(lab.knex, person);
    const theirs = await logStep(agent, csrfToken, stepBody('annealing', { operatorId: colleague.id, treated: [flake.code] }));
    expect(theirs.operator).toEqual({ id: colleague.id, displayName: colleague.displayName });
    const row = await lab.knex('steps').where({ id: theirs.id }).first();
    expect(row).toMatchObject({ operatorId: colleague.id, createdById: person.id });
    const mine = await logStep(agent, csrfToken, stepBody('annealing', { treated: [flake.code] }));
    expect(mine.operator).toEqual({ id: person.id, displayName: person.displayName });
  });
});

describe('POST /api/steps from two people at the same moment, naming the same samples in opposite order', () => {
  // Each round fires both requests at once; several rounds make an unlucky interleaving likely.
  const ROUNDS = 5;

  it('201 for both when neither uses the samples up', async () => {
    const alice = await signedIn();
    const bob = await signedIn();
    for (let round = 1; round <= ROUNDS; round += 1) {
      const left = await insertSample(lab.knex, alice.person, { kind: 'chip', name: `Left chip ${round}` });
      const right = await insertSample(lab.knex, alice.person, { kind: 'chip', name: `Right chip ${round}` });
      const responses = await Promise.all([
        alice.agent
          .post('/api/steps')
          .set('x-csrf-token', alice.csrfToken)
          .send(stepBody('annealing', { treated: [left.code, right.code] })),
        bob.agent
          .post('/api/steps')
          .set('x-csrf-token', bob.csrfToken)
          .send(stepBody('etching', { treated: [right.code, left.code] })),
      ]);
      expect(responses.map((response) => [response.status, response.body.error?.code])).toEqual([
        [201, undefined],
        [201, undefined],
      ]);
    }
  });

  it('201 for one and 409 sample_unavailable for the other when both would use up the same two flakes', async () => {
    const alice = await signedIn();
    const bob = await signedIn();
    for (let round = 1; round <= ROUNDS; round += 1) {
      const hbn = await insertSample(lab.knex, alice.person, { material: 'hBN' });
      const graphene = await insertSample(lab.knex, alice.person, { material: 'graphene' });
      const stacking = (first: string, second: string) =>
        stepBody('stacking', {
          inputs: [
            { code: first, consumed: true },
            { code: second, consumed: true },
          ],
          outputs: [{ kind: 'stack', material: 'graphene/hBN' }],
        });
      const responses = await Promise.all([
        alice.agent.post('/api/steps').set('x-csrf-token', alice.csrfToken).send(stacking(hbn.code, graphene.code)),
        bob.agent.post('/api/steps').set('x-csrf-token', bob.csrfToken).send(stacking(graphene.code, hbn.code)),
      ]);
      expect(responses.map((response) => [response.status, response.body.error?.code]).sort()).toEqual([
        [201, undefined],
        [409, 'sample_unavailable'],
      ]);
      expect(await lab.knex('samples').where({ kind: 'stack' }).count({ count: '*' }).first()).toEqual({ count: round });
    }
  });
});

describe('GET /api/steps/:id', () => {
  it('401 unauthenticated when signed out', async () => {
    const { person } = await signedIn();
    const flake = await insertSample(lab.knex, person);
    const step = await insertStep(lab.knex, person, stepBody('annealing', { treated: [flake.code] }));
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get(`/api/steps/${step.id}`);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it.each(['abc', '0x10', '1e3', '007'])('422 validation_failed for the id %s', async (id) => {
    const { agent } = await signedIn('reviewer');
    const response = await agent.get(`/api/steps/${id}`);
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['params.id']);
  });

  it('404 not_found for a step that does not exist', async () => {
    const { agent } = await signedIn('reviewer');
    const response = await agent.get('/api/steps/4242');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('200 for a reviewer, with the samples the step used, treated and made', async () => {
    const { person, agent } = await signedIn('reviewer');
    const stack = await insertSample(lab.knex, person, { kind: 'stack', material: 'graphene/hBN' });
    const hbn = await insertSample(lab.knex, person, { kind: 'flake', material: 'hBN' });
    const step = await insertStep(
      lab.knex,
      person,
      stepBody('encapsulation', {
        notes: 'Top hBN covers the whole channel',
        inputs: [{ code: hbn.code, consumed: true }],
        treated: [stack.code],
        outputs: [{ kind: 'device', material: 'graphene/hBN' }],
      }),
    );
    const [device] = await outputCodes(lab.knex, step.id);
    const response = await agent.get(`/api/steps/${step.id}`);
    expect(response.status).toBe(200);
    expect(response.body.step).toMatchObject({
      id: step.id,
      type: 'encapsulation',
      notes: 'Top hBN covers the whole channel',
      parameters: STEP_PARAMETERS.encapsulation,
      inputs: [expect.objectContaining({ code: hbn.code, consumed: true, status: 'used_up' })],
      treated: [expect.objectContaining({ code: stack.code })],
      outputs: [expect.objectContaining({ code: device, kind: 'device' })],
    });
  });
});

describe('POST /api/steps: CVD growth from precursor lots', () => {
  it('201 with the precursor lots as inputs, still ready, and the film descended from them', async () => {
    const { person, agent, csrfToken } = await signedIn();
    const created = await agent
      .post('/api/samples')
      .set('x-csrf-token', csrfToken)
      .send({ kind: 'precursor', material: 'MoO3', name: 'MoO3 powder, 99.97 %', properties: { supplierLot: 'L-2291' } });
    expect(created.status).toBe(201);
    const moo3 = created.body.sample as Sample;
    expect(moo3.code).toMatch(/^PR-/);
    const sulfur = await insertSample(lab.knex, person, { kind: 'precursor', material: 'S' });

    const step = await logStep(
      agent,
      csrfToken,
      stepBody('cvd_growth', {
        inputs: [{ code: moo3.code }, { code: sulfur.code }],
        outputs: [{ kind: 'film', material: 'MoS2' }],
      }),
    );
    expect(codes(step.inputs)).toEqual([moo3.code, sulfur.code]);
    expect(step.inputs.map((input) => input.consumed)).toEqual([false, false]);
    expect(await sampleRow(moo3.code)).toMatchObject({ status: 'ready' });
    const ancestors = await agent.get(`/api/samples/${step.outputs[0].code}/ancestors`);
    expect(ancestors.status).toBe(200);
    expect(ancestors.body.relatives.map((relative: { code: string }) => relative.code).sort()).toEqual(
      [moo3.code, sulfur.code].sort(),
    );
  });
});
