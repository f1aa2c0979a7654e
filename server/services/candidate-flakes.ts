import type { Knex } from 'knex';
import type { MicrographMetadata } from '../../shared/schemas/evidence';
import type { SampleProperties } from '../../shared/schemas/sample';
import { StepCreateInput } from '../../shared/schemas/step';
import { conflict, invalid, notFound } from '../errors';
import { EvidenceModel, MicroscopeCalibrationModel, StoredFileModel } from '../models/evidence-models';
import { SampleModel } from '../models/sample-model';
import type { StepModel } from '../models/step-model';
import type { UserModel } from '../models/user-model';
import { addEvidence, findEvidence } from './evidence-records';
import { logStep } from './step-logger';

const LAYER_WORDS: Record<number, string> = { 1: 'Monolayer', 2: 'Bilayer' };

/** The flake's substrate in the words of sample properties. */
function substrateProperties(metadata: MicrographMetadata): SampleProperties {
  const substrate = metadata.substrate;
  if (!substrate) return {};
  if (substrate.kind === 'oxide-on-silicon') return { substrate: 'si_sio2', oxideThicknessNm: substrate.oxideThicknessNm };
  return { substrate: substrate.kind };
}

/**
 * Turns candidate `index` of a chip micrograph into a flake: a `flake_search` step from the chip
 * (which is not used up) makes a new flake of the chip's material, and the micrograph is attached
 * to the flake with the candidate's box as its flake region. All in one transaction.
 */
export async function makeFlakeFromCandidate(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  evidenceId: number;
  index: number;
}): Promise<{ flake: SampleModel; step: StepModel; evidence: EvidenceModel }> {
  const { trx, actor, evidenceId, index } = props;
  const unlocked = await findEvidence(trx, evidenceId);
  // Chip first, then its micrograph: the lock order of every evidence change.
  const chip = unlocked.sampleId ? await SampleModel.query(trx).findById(unlocked.sampleId).forUpdate() : undefined;
  const source = await findEvidence(trx, evidenceId, { lock: true });
  if (source.kind !== 'micrograph' || !chip || chip.kind !== 'chip') {
    throw invalid({ _: ['Flakes are made from candidates on a micrograph of a chip.'] });
  }
  const candidate = source.analysis.candidates?.candidates[index];
  if (!candidate) {
    const count = source.analysis.candidates?.candidates.length ?? 0;
    throw notFound(`Micrograph ${source.id} has no candidate ${index}; it lists ${count} (numbered from 0).`);
  }
  const metadata = source.metadata as MicrographMetadata;
  const flakeRegion = { shape: 'box' as const, ...candidate.boxPx };

  // A second tap on the same candidate should not make a second flake.
  const earlier = await EvidenceModel.query(trx)
    .where('fileId', source.fileId)
    .whereRaw('analysis @> ?::jsonb', [JSON.stringify({ fromCandidate: { evidenceId: source.id } })])
    .whereRaw('metadata @> ?::jsonb', [JSON.stringify({ flakeRegion })])
    .first();
  if (earlier?.sampleId) {
    const flake = await SampleModel.query(trx).findById(earlier.sampleId);
    throw conflict('conflict', `This candidate is already flake ${flake?.code ?? earlier.sampleId}.`);
  }

  const calibration = metadata.calibrationId
    ? await MicroscopeCalibrationModel.query(trx).findById(metadata.calibrationId)
    : undefined;
  const sizeUm = metadata.umPerPixel
    ? Math.round(Math.max(candidate.boxPx.width, candidate.boxPx.height) * metadata.umPerPixel * 10) / 10
    : undefined;
  const layerWord = LAYER_WORDS[candidate.layers] ?? `${candidate.layers}-layer`;
  const input = StepCreateInput.parse({
    type: 'flake_search',
    startedAt: new Date().toISOString(),
    instrument: calibration?.microscope,
    parameters: {
      ...(calibration ? { microscope: calibration.microscope } : {}),
      ...(metadata.objectiveMagnification ? { objectiveMagnification: metadata.objectiveMagnification } : {}),
      evidenceId: source.id,
    },
    notes: `${layerWord} candidate ${index} of micrograph ${source.id}: ${candidate.areaUm2.toFixed(1)} µm², box at (${Math.round(candidate.boxPx.x)}, ${Math.round(candidate.boxPx.y)}) px, ${Math.round(candidate.boxPx.width)} × ${Math.round(candidate.boxPx.height)} px.`,
    inputs: [{ code: chip.code, consumed: false }],
    outputs: [
      {
        kind: 'flake',
        material: chip.material,
        name: `${layerWord} candidate`,
        properties: { ...substrateProperties(metadata), ...(sizeUm && sizeUm > 0 ? { flakeSizeUm: sizeUm } : {}) },
      },
    ],
  });
  const step = await logStep({ trx, actor, input });
  const output = await trx('step_samples').where({ stepId: step.id, role: 'output' }).first('sampleId');
  const flake = await SampleModel.query(trx).findById(output.sampleId);
  if (!flake) throw new Error(`Step ${step.id} made no flake`);

  const file = await StoredFileModel.query(trx).findById(source.fileId);
  if (!file) throw new Error(`Evidence ${source.id} names stored file ${source.fileId}, which is not there.`);
  const { substrateRegion: _chipSubstrateRegion, ...chipMetadata } = metadata;
  const evidence = await addEvidence({
    trx,
    actor,
    target: { sample: flake },
    kind: 'micrograph',
    originalName: source.originalName,
    metadata: { ...chipMetadata, flakeRegion },
    ingested: {
      file: {
        sha256: file.sha256,
        byteSize: file.byteSize,
        mediaType: file.mediaType,
        widthPx: file.widthPx,
        heightPx: file.heightPx,
        thumbnailSha256: file.thumbnailSha256,
      },
      // The flake's layer count is measured once its bare substrate is marked too.
      analysis: { fromCandidate: { evidenceId: source.id, index } },
      estimate: null,
    },
  });
  return { flake: (await SampleModel.query(trx).findById(flake.id)) as SampleModel, step, evidence };
}
