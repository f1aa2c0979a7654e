import type { Knex } from 'knex';
import { combineLayerEstimates } from '../../shared/evidence/layer-call';
import type { EvidenceAnalysis, EvidenceKind, EvidenceMetadata } from '../../shared/schemas/evidence';
import type { LayerCall, LayerEstimate } from '../../shared/schemas/evidence-analysis';
import type { HistoryEventType } from '../../shared/schemas/history';
import { notFound, StaleVersionError } from '../errors';
import { EvidenceModel, StoredFileModel } from '../models/evidence-models';
import { SampleModel } from '../models/sample-model';
import type { StepModel } from '../models/step-model';
import type { UserModel } from '../models/user-model';
import { presentEvidence } from '../presenters/evidence-presenter';
import { estimateOf } from './evidence-analyser';
import type { IngestedFile } from './evidence-ingest';
import { appendHistory } from './history-chain';

const estimateColumns = (estimate: LayerEstimate | null) => ({
  layerCount: estimate?.layers ?? null,
  layerUncertainty: estimate?.uncertainty ?? null,
  layerMethod: estimate?.method ?? null,
});

/** The combined layer call of a sample from all the evidence attached to it. */
export async function layerCallOf(knex: Knex, sampleId: number): Promise<LayerCall> {
  const items = await EvidenceModel.query(knex).where('sampleId', sampleId).orderBy('id');
  return combineLayerEstimates(
    items.flatMap((item) => {
      const estimate = estimateOf(item.kind, item.analysis);
      return estimate ? [{ evidenceId: item.id, kind: item.kind, estimate }] : [];
    }),
  );
}

/**
 * Recomputes a sample's combined call into `samples.layer_estimate` (what lists filter on), in
 * the caller's transaction, so the call never disagrees with the evidence behind it. The sample
 * row must already be locked by the caller.
 */
async function refreshLayerCall(trx: Knex.Transaction, sampleId: number): Promise<LayerCall> {
  const call = await layerCallOf(trx, sampleId);
  await trx('samples').where('id', sampleId).update({ layerEstimate: call.layers });
  return call;
}

const callSummary = (call: LayerCall) => ({ layers: call.layers, status: call.status, summary: call.summary });

async function lockSample(trx: Knex.Transaction, sampleId: number): Promise<SampleModel> {
  const sample = await SampleModel.query(trx).findById(sampleId).forUpdate();
  if (!sample) throw notFound(`There is no sample with id ${sampleId}.`);
  return sample;
}

/** The stored_files row of a content, made once however many items share the content. */
async function storedFileFor(trx: Knex.Transaction, file: IngestedFile['file'], actorId: number): Promise<StoredFileModel> {
  await trx('stored_files')
    .insert({ ...file, createdById: actorId })
    .onConflict('sha256')
    .merge({ thumbnailSha256: trx.raw('coalesce(stored_files.thumbnail_sha256, excluded.thumbnail_sha256)') });
  const row = await StoredFileModel.query(trx).findOne({ sha256: file.sha256 });
  if (!row) throw new Error(`stored_files row for ${file.sha256} vanished inside its transaction`);
  return row;
}

/** Records an ingested file as evidence on a sample or a step, with its history and the sample's new call. */
export async function addEvidence(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  target: { sample: SampleModel } | { step: StepModel };
  kind: EvidenceKind;
  originalName: string | null;
  metadata: EvidenceMetadata;
  ingested: Pick<IngestedFile, 'file' | 'analysis' | 'estimate'>;
}): Promise<EvidenceModel> {
  const { trx, actor, target, kind, ingested } = props;
  const sample = 'sample' in target ? await lockSample(trx, target.sample.id) : null;
  const step = 'step' in target ? target.step : null;
  const file = await storedFileFor(trx, ingested.file, actor.id);
  const evidence = await EvidenceModel.query(trx).insertAndFetch({
    sampleId: sample?.id ?? null,
    stepId: step?.id ?? null,
    kind,
    fileId: file.id,
    originalName: props.originalName,
    metadata: props.metadata,
    analysis: ingested.analysis,
    ...estimateColumns(ingested.estimate),
    createdById: actor.id,
  });
  const call = sample ? await refreshLayerCall(trx, sample.id) : null;
  await appendHistory(trx, [
    {
      type: 'evidence.added',
      actorId: actor.id,
      subjectCode: sample?.code ?? null,
      stepId: step?.id ?? null,
      payload: {
        evidenceId: evidence.id,
        kind,
        sha256: file.sha256,
        originalName: props.originalName,
        metadata: props.metadata,
        estimate: ingested.estimate,
        ...(call ? { layerCall: callSummary(call) } : {}),
      },
    },
  ]);
  return evidence;
}

/** An evidence item or 404. */
export async function findEvidence(knex: Knex, id: number, options: { lock?: boolean } = {}): Promise<EvidenceModel> {
  const query = EvidenceModel.query(knex).findById(id);
  const evidence = await (options.lock ? query.forUpdate() : query);
  if (!evidence) throw notFound(`There is no evidence with id ${id}.`);
  return evidence;
}

/**
 * Saves new metadata and analysis of an item computed from the version the caller read: a
 * change by someone else in between is refused as stale, with the item as it is now.
 */
export async function saveAnalysis(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  evidenceId: number;
  version: number;
  metadata: EvidenceMetadata;
  analysis: EvidenceAnalysis;
  event: Extract<HistoryEventType, 'evidence.edited' | 'evidence.analysed'>;
  what: string;
}): Promise<EvidenceModel> {
  const { trx, actor } = props;
  const unlocked = await findEvidence(trx, props.evidenceId);
  // Sample first, then evidence: the order every writer of both takes.
  const sample = unlocked.sampleId ? await lockSample(trx, unlocked.sampleId) : null;
  const current = await findEvidence(trx, props.evidenceId, { lock: true });
  if (current.version !== props.version) {
    throw new StaleVersionError(
      `Evidence ${current.id} was changed by someone else since you opened it (version ${props.version}, now ${current.version}). Review it and try again.`,
      await presentEvidence(trx, current),
    );
  }
  const estimate = estimateOf(current.kind, props.analysis);
  const updated = await EvidenceModel.query(trx).patchAndFetchById(current.id, {
    metadata: props.metadata,
    analysis: props.analysis,
    ...estimateColumns(estimate),
    version: current.version + 1,
  });
  const call = sample ? await refreshLayerCall(trx, sample.id) : null;
  await appendHistory(trx, [
    {
      type: props.event,
      actorId: actor.id,
      subjectCode: sample?.code ?? null,
      stepId: current.stepId,
      payload: {
        evidenceId: current.id,
        kind: current.kind,
        what: props.what,
        version: updated.version,
        metadata: props.metadata,
        estimate,
        ...(call ? { layerCall: callSummary(call) } : {}),
      },
    },
  ]);
  return updated;
}
