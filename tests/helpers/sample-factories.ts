import type { Knex } from 'knex';
import { decodeBase32, formatCode } from '../../shared/codes';
import type { SampleKind, SampleStatus } from '../../shared/samples';
import type { Sample, SampleCreateInput, SampleProperties } from '../../shared/schemas/sample';
import { StepCreateInput, type Step } from '../../shared/schemas/step';
import type { StepType } from '../../shared/steps';
import type { SampleModel } from '../../server/models/sample-model';
import type { StepModel } from '../../server/models/step-model';
import type { UserModel } from '../../server/models/user-model';
import { appendHistory } from '../../server/services/history-chain';
import { createdEvent, insertSamples } from '../../server/services/sample-registry';
import { logStep as logStepInTransaction } from '../../server/services/step-logger';
import type { Agent } from './session-agent';

let sequence = 0;
const next = () => (sequence += 1);

// ---------------------------------------------------------------------------------------------
// Request bodies with realistic values (units as the names in shared/schemas/step.ts say).
// ---------------------------------------------------------------------------------------------

/** Typical parameters of each step type: what a lab would actually write down. */
export const STEP_PARAMETERS = {
  exfoliation: {
    method: 'adhesive_tape',
    tapeType: 'low-residue blue tape',
    peelCycles: 6,
    substrate: 'si_sio2',
    oxideThicknessNm: 285,
    pretreatment: 'o2_plasma',
    transferTemperatureC: 25,
  },
  cvd_growth: {
    precursors: ['MoO3 powder', 'sulfur powder'],
    zoneTemperaturesC: [750, 180],
    rampRateCPerMin: 25,
    holdTimeMin: 15,
    carrierGas: 'Ar',
    carrierFlowSccm: 80,
    hydrogenFlowSccm: 0,
    pressureTorr: 760,
    outcome: 'Triangular monolayer domains near the precursor boat',
  },
  transfer: { method: 'dry', stampPolymer: 'PDMS/PC', temperatureC: 110 },
  stacking: { stampPolymer: 'PC on PDMS', temperatureC: 90 },
  lithography: {
    resist: 'PMMA',
    doseUCPerCm2: 350,
    acceleratingVoltageKV: 30,
    patternReference: 'Hall bar, 2 µm channel',
  },
  etching: { gas: 'CHF3/O2', powerW: 60, pressureMTorr: 40, durationS: 45 },
  annealing: { atmosphere: 'Ar/H2 forming gas', temperatureC: 350, durationMin: 180 },
  encapsulation: { material: 'hBN', method: 'dry pick-up' },
  metal_deposition: { metal: 'Cr/Au', thicknessNm: 65, method: 'electron-beam evaporation' },
  cleaving: { method: 'razor blade along the basal plane' },
  flake_search: { microscope: 'Upright microscope 2', objectiveMagnification: 50 },
} satisfies Record<StepType, Record<string, unknown>>;

/** A crystal as a lab registers one that arrived from a grower or supplier. */
export function crystalInput(overrides: Partial<SampleCreateInput> = {}): SampleCreateInput {
  const n = next();
  return {
    kind: 'crystal',
    material: 'WSe2',
    name: `WSe2 boule ${n}`,
    note: 'Stored in the nitrogen cabinet, shelf 2',
    properties: { supplier: 'Crystal growth group', supplierLot: `L-${100 + n}`, growthMethod: 'flux' },
    ...overrides,
  };
}

/** A step body of `type` with its typical parameters, started in the morning and ended 40 min later. */
export function stepBody(type: StepType, fields: Partial<StepCreateInput> = {}): StepCreateInput {
  return {
    type,
    parameters: STEP_PARAMETERS[type],
    startedAt: '2026-12-03T09:30:00.000Z',
    endedAt: '2026-12-03T10:10:00.000Z',
    instrument: 'Transfer station B',
    ...fields,
  } as StepCreateInput;
}

// ---------------------------------------------------------------------------------------------
// Through the API, as a signed-in person.
// ---------------------------------------------------------------------------------------------

/** POST /api/samples; fails the test set-up unless it answers 201. */
export async function registerSample(agent: Agent, csrfToken: string, body: SampleCreateInput): Promise<Sample> {
  const response = await agent.post('/api/samples').set('x-csrf-token', csrfToken).send(body);
  if (response.status !== 201)
    throw new Error(`Registering a sample failed: ${response.status} ${JSON.stringify(response.body)}`);
  return response.body.sample as Sample;
}

export const registerCrystal = (agent: Agent, csrfToken: string, overrides: Partial<SampleCreateInput> = {}) =>
  registerSample(agent, csrfToken, crystalInput(overrides));

/** POST /api/steps; fails the test set-up unless it answers 201. */
export async function logStep(agent: Agent, csrfToken: string, body: StepCreateInput): Promise<Step> {
  const response = await agent.post('/api/steps').set('x-csrf-token', csrfToken).send(body);
  if (response.status !== 201) throw new Error(`Logging a step failed: ${response.status} ${JSON.stringify(response.body)}`);
  return response.body.step as Step;
}

// ---------------------------------------------------------------------------------------------
// Straight into the database through the services (so the history chain stays consistent):
// fast enough for long chains and big graphs.
// ---------------------------------------------------------------------------------------------

export interface SampleFields {
  kind?: SampleKind;
  material?: string;
  name?: string | null;
  note?: string | null;
  status?: Exclude<SampleStatus, 'retired'>;
  properties?: SampleProperties;
  /** A chosen code (see `codeWithBody`); random otherwise. */
  code?: string;
  /** Columns the API does not set: written after the insert. */
  layerEstimate?: number;
  createdAt?: string;
}

/** A registered sample owned by `owner`, with its `sample.created` event. */
export async function insertSample(knex: Knex, owner: UserModel, fields: SampleFields = {}): Promise<SampleModel> {
  const { layerEstimate, createdAt, ...rest } = fields;
  const n = next();
  const sample = await knex.transaction(async (trx) => {
    const [created] = await insertSamples(trx, owner.id, [
      { kind: 'flake', material: 'graphene', name: `Sample ${n}`, ownerId: owner.id, ...rest },
    ]);
    await appendHistory(trx, [createdEvent(owner.id, created)]);
    if (layerEstimate !== undefined || createdAt !== undefined) {
      await trx('samples')
        .where({ id: created.id })
        .update({
          ...(layerEstimate !== undefined ? { layerEstimate } : {}),
          ...(createdAt !== undefined ? { createdAt: new Date(createdAt) } : {}),
        });
    }
    return created;
  });
  return sample.$query(knex);
}

/** A step logged by `actor` through the step logger itself, in its own transaction. */
export async function insertStep(knex: Knex, actor: UserModel, body: StepCreateInput): Promise<StepModel> {
  const input = StepCreateInput.parse(body);
  return knex.transaction((trx) => logStepInTransaction({ trx, actor, input }));
}

/** The codes a step made, in output order. */
export async function outputCodes(knex: Knex, stepId: number): Promise<string[]> {
  const rows = await knex('step_samples as ss')
    .join('samples as s', 's.id', 'ss.sample_id')
    .where({ 'ss.step_id': stepId, 'ss.role': 'output' })
    .orderBy('ss.position')
    .select('s.code');
  return rows.map((row: { code: string }) => row.code);
}

/**
 * A flake moved on by `generations` dry transfers, each making a new flake record from the
 * last: [root, first transfer's output, …]. One transaction for the whole chain.
 */
export async function insertChain(knex: Knex, actor: UserModel, generations: number): Promise<string[]> {
  const root = await insertSample(knex, actor, { kind: 'flake', material: 'graphene', name: 'Chain root' });
  return knex.transaction(async (trx) => {
    const codes = [root.code];
    for (let generation = 1; generation <= generations; generation += 1) {
      const step = await logStepInTransaction({
        trx,
        actor,
        input: StepCreateInput.parse(
          stepBody('transfer', {
            inputs: [{ code: codes[codes.length - 1], consumed: true }],
            outputs: [{ kind: 'flake', name: `Transfer ${generation}` }],
          }),
        ),
      });
      const [code] = await outputCodes(trx, step.id);
      codes.push(code);
    }
    return codes;
  });
}

/**
 * A densely connected graph: `width` flakes, then `generations` stacking steps, each taking all
 * `width` samples of the generation before as inputs and making `width` stacks. Every sample
 * after the first generation has `width` parents, so there are width^generations paths from a
 * root to a leaf. Returns the codes per generation, [0] being the first flakes.
 */
export async function insertLattice(knex: Knex, actor: UserModel, generations: number, width: number): Promise<string[][]> {
  const first: string[] = [];
  for (let i = 0; i < width; i += 1) {
    first.push((await insertSample(knex, actor, { kind: 'flake', material: 'hBN', name: `Lattice root ${i + 1}` })).code);
  }
  return knex.transaction(async (trx) => {
    const layers = [first];
    for (let generation = 1; generation <= generations; generation += 1) {
      const step = await logStepInTransaction({
        trx,
        actor,
        input: StepCreateInput.parse(
          stepBody('stacking', {
            inputs: layers[layers.length - 1].map((code) => ({ code })),
            outputs: [{ kind: 'stack', count: width, name: `Layer ${generation}` }],
          }),
        ),
      });
      layers.push(await outputCodes(trx, step.id));
    }
    return layers;
  });
}

/** A valid code with the given six-symbol body, e.g. `codeWithBody('CR', '4F0K1M')`. */
export const codeWithBody = (prefix: string, body: string) => formatCode(prefix, decodeBase32(body));

const COUNTED_TABLES = ['samples', 'steps', 'step_samples', 'lineage_links', 'history_events'] as const;

/** Row counts of the tables a step writes, to show that a refused step wrote nothing. */
export async function rowCounts(knex: Knex): Promise<Record<(typeof COUNTED_TABLES)[number], number>> {
  const entries = await Promise.all(
    COUNTED_TABLES.map(async (table) => {
      const row = await knex(table).count<{ count: number }[]>({ count: '*' }).first();
      return [table, Number(row?.count ?? 0)] as const;
    }),
  );
  return Object.fromEntries(entries) as Record<(typeof COUNTED_TABLES)[number], number>;
}
