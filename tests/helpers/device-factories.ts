import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { MeasurementCreateInput } from '../../shared/schemas/device';
import { ZonePlateDesignInput } from '../../shared/schemas/zone-plate';
import { StepCreateInput } from '../../shared/schemas/step';
import type { FileStore } from '../../server/files/file-store';
import type { SampleModel } from '../../server/models/sample-model';
import type { UserModel } from '../../server/models/user-model';
import { addMeasurement } from '../../server/services/device-measurements';
import { saveLensDesign } from '../../server/services/lens-designs';
import { findSampleByCode } from '../../server/services/sample-lookup';
import { createShareLink } from '../../server/services/share-links';
import { logStep } from '../../server/services/step-logger';
import { insertSample, outputCodes, stepBody } from './sample-factories';

// ---------------------------------------------------------------------------------------------
// Request bodies with realistic values.
// ---------------------------------------------------------------------------------------------

/**
 * A monolayer lens about half a millimetre across with a focal length of about a millimetre,
 * for red HeNe light (633 nm): a realistic case (common practice, no source).
 */
export function monolayerLensInput(overrides: Partial<ZonePlateDesignInput> = {}): ZonePlateDesignInput {
  return { wavelengthNm: 632.8, focalLengthUm: 1000, apertureDiameterUm: 500, ...overrides };
}

/** Focal length measured at three laser lines on an optical bench (invented numbers). */
export function focalLengthMeasurement(overrides: Partial<MeasurementCreateInput> = {}): MeasurementCreateInput {
  return {
    kind: 'focal_length_vs_wavelength',
    rows: [
      { x: 532, y: 1186 },
      { x: 632.8, y: 1003, note: 'design wavelength' },
      { x: 780, y: 809 },
    ],
    instrument: 'Optical bench 2, knife-edge focus scan',
    measuredAt: '2026-12-04T14:00:00.000Z',
    ...overrides,
  };
}

// ---------------------------------------------------------------------------------------------
// Straight into the database through the services.
// ---------------------------------------------------------------------------------------------

const log = (trx: Knex.Transaction, actor: UserModel, body: StepCreateInput) =>
  logStep({ trx, actor, input: StepCreateInput.parse(body) });

export interface SimpleDevice {
  crystal: string;
  flake: string;
  device: string;
  exfoliationStepId: number;
  lithographyStepId: number;
}

/** Crystal → exfoliated flake → device patterned by e-beam lithography: the shortest real ancestry. */
export async function insertDevice(knex: Knex, actor: UserModel, material = 'MoS2'): Promise<SimpleDevice> {
  const crystal = await insertSample(knex, actor, { kind: 'crystal', material, name: `${material} bulk crystal` });
  return knex.transaction(async (trx) => {
    const exfoliation = await log(
      trx,
      actor,
      stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'flake', name: 'Monolayer flake' }] }),
    );
    const [flake] = await outputCodes(trx, exfoliation.id);
    const lithography = await log(
      trx,
      actor,
      stepBody('lithography', {
        startedAt: '2026-12-03T13:00:00.000Z',
        endedAt: '2026-12-03T15:00:00.000Z',
        instrument: 'E-beam writer',
        inputs: [{ code: flake, consumed: true }],
        outputs: [{ kind: 'device', name: 'Zone-plate lens' }],
      }),
    );
    const [device] = await outputCodes(trx, lithography.id);
    return { crystal: crystal.code, flake, device, exfoliationStepId: exfoliation.id, lithographyStepId: lithography.id };
  });
}

export interface DeepDevice {
  device: string;
  /** Every ancestor of the device, each once. */
  ancestors: string[];
  crystals: string[];
  /** The stack made at each generation, oldest first. */
  stacks: string[];
  /** Flakes added to the stack at each generation. */
  sideFlakes: string[];
  /** Generations between the device and its farthest ancestor (the root flake). */
  depth: number;
}

/**
 * A device with a deep, multi-parent ancestry: two crystals are exfoliated into flakes; a root
 * flake is stacked `generations` times, each time with one more flake (alternately from either
 * crystal), and the last stack is patterned into a device. Every stack has two parents, and both
 * crystals are reached along many paths, so an audit must list each record once.
 */
export async function insertDeepDevice(knex: Knex, actor: UserModel, generations = 30): Promise<DeepDevice> {
  const crystals = [
    await insertSample(knex, actor, { kind: 'crystal', material: 'hBN', name: 'hBN flux crystal' }),
    await insertSample(knex, actor, { kind: 'crystal', material: 'graphite', name: 'Natural graphite crystal' }),
  ];
  return knex.transaction(async (trx) => {
    const flakesOf: string[][] = [];
    for (const [index, crystal] of crystals.entries()) {
      const count = index === 0 ? Math.ceil(generations / 2) + 1 : Math.floor(generations / 2);
      const step = await log(
        trx,
        actor,
        stepBody('exfoliation', {
          inputs: [{ code: crystal.code }],
          outputs: [{ kind: 'flake', count, name: `${crystal.material} flake` }],
        }),
      );
      flakesOf.push(await outputCodes(trx, step.id));
    }
    const root = flakesOf[0].shift() as string;
    const stacks: string[] = [];
    const sideFlakes: string[] = [];
    let top = root;
    for (let generation = 1; generation <= generations; generation += 1) {
      const side = (generation % 2 === 1 ? flakesOf[0] : flakesOf[1]).shift() as string;
      sideFlakes.push(side);
      const step = await log(
        trx,
        actor,
        stepBody('stacking', {
          inputs: [
            { code: top, consumed: true },
            { code: side, consumed: true },
          ],
          outputs: [{ kind: 'stack', material: 'graphene/hBN', name: `Stack layer ${generation}` }],
        }),
      );
      [top] = await outputCodes(trx, step.id);
      stacks.push(top);
    }
    const lithography = await log(
      trx,
      actor,
      stepBody('lithography', {
        inputs: [{ code: top, consumed: true }],
        outputs: [{ kind: 'device', name: 'Deep stack lens' }],
      }),
    );
    const [device] = await outputCodes(trx, lithography.id);
    return {
      device,
      ancestors: [...crystals.map((crystal) => crystal.code), root, ...sideFlakes, ...stacks],
      crystals: crystals.map((crystal) => crystal.code),
      stacks,
      sideFlakes,
      // device ← stacks (generations) ← root flake; the crystals are nearer along the side flakes.
      depth: generations + 1,
    };
  });
}

export const sha256Hex = (data: Buffer) => createHash('sha256').update(data).digest('hex');

/** Invented bytes standing for an uploaded file; distinct per label. */
export const fakeFileBytes = (label: string) => Buffer.from(`Flakeline test evidence file: ${label}\n`, 'utf8');

/**
 * A thickness evidence row written directly (as the evidence upload would leave it): a stored
 * file row for `bytes`, saved to `files` unless `stored` is false, and the evidence on `sample`.
 */
export async function insertEvidence(
  knex: Knex,
  props: {
    sample: SampleModel | { id: number };
    createdBy: UserModel;
    kind?: 'micrograph' | 'raman' | 'pl' | 'afm';
    layerCount?: number | null;
    layerMethod?: string;
    bytes?: Buffer;
    mediaType?: string;
    thumbnail?: Buffer;
    files?: FileStore;
    stored?: boolean;
  },
): Promise<{ id: number; sha256: string }> {
  const kind = props.kind ?? 'raman';
  const bytes = props.bytes ?? fakeFileBytes(`${kind} ${Math.random()}`);
  const sha256 = sha256Hex(bytes);
  if (props.files && props.stored !== false) {
    await props.files.save(bytes);
    if (props.thumbnail) await props.files.save(props.thumbnail);
  }
  const [file] = await knex('stored_files')
    .insert({
      sha256,
      byteSize: bytes.length,
      mediaType: props.mediaType ?? 'text/csv',
      thumbnailSha256: props.thumbnail ? sha256Hex(props.thumbnail) : null,
      createdById: props.createdBy.id,
    })
    .onConflict('sha256')
    .merge()
    .returning('id');
  const layerCount = props.layerCount === undefined ? 1 : props.layerCount;
  const [row] = await knex('evidence')
    .insert({
      sampleId: props.sample.id,
      kind,
      fileId: file.id,
      originalName: `${kind}-${sha256.slice(0, 6)}.${kind === 'micrograph' ? 'png' : 'csv'}`,
      layerCount,
      layerUncertainty: layerCount === null ? null : 0.3,
      layerMethod: layerCount === null ? null : (props.layerMethod ?? (kind === 'micrograph' ? 'optical_contrast' : kind)),
      createdById: props.createdBy.id,
    })
    .returning('id');
  return { id: row.id, sha256 };
}

export interface DeviceScene {
  device: string;
  measurementId: number;
  shareLinkId: number;
  shareToken: string;
}

/**
 * A designed device with one measurement and an open share link, written through the services
 * in one transaction: what every device, audit and share-link route needs to answer 200.
 */
export async function insertDeviceScene(knex: Knex, owner: UserModel): Promise<DeviceScene> {
  const { device } = await insertDevice(knex, owner);
  return knex.transaction(async (trx) => {
    const sample = await findSampleByCode(device, { trx });
    await saveLensDesign({ trx, actor: owner, device: sample, input: ZonePlateDesignInput.parse(monolayerLensInput()) });
    const measurement = await addMeasurement({
      trx,
      actor: owner,
      device: sample,
      input: MeasurementCreateInput.parse(focalLengthMeasurement()),
    });
    const { link, token } = await createShareLink({ trx, actor: owner, sample, expiresInDays: 7 });
    return { device, measurementId: measurement.id, shareLinkId: link.id, shareToken: token };
  });
}
