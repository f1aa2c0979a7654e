import type { Knex } from 'knex';
import type { Evidence, MicroscopeCalibration, StoredFileRef } from '../../shared/schemas/evidence';
import type { SampleSummary } from '../../shared/schemas/sample';
import type { StepType } from '../../shared/steps';
import type { EvidenceModel, MicroscopeCalibrationModel, StoredFileModel } from '../models/evidence-models';
import { estimateOf } from '../services/evidence-analyser';
import { presentSampleSummary } from './sample-presenter';

/** Where a stored file and its thumbnail are served, after their checksums are checked again. */
export function presentStoredFile(file: StoredFileModel): StoredFileRef {
  return {
    sha256: file.sha256,
    byteSize: file.byteSize,
    mediaType: file.mediaType,
    widthPx: file.widthPx,
    heightPx: file.heightPx,
    url: `/api/files/${file.sha256}`,
    thumbnailUrl: file.thumbnailSha256 ? `/api/files/${file.sha256}/thumbnail` : null,
  };
}

const sameBox = (a: { x: number; y: number; width: number; height: number }, b: unknown) => {
  const box = b as { x?: number; y?: number; width?: number; height?: number } | undefined;
  return !!box && a.x === box.x && a.y === box.y && a.width === box.width && a.height === box.height;
};

/**
 * For each chip micrograph, its candidates already made into flakes: the flake's copy of the
 * micrograph names the source and carries the candidate's box as its flake region (matched by box,
 * since "look again" renumbers candidates).
 */
async function candidateFlakesOf(knex: Knex, items: EvidenceModel[]): Promise<Map<number, { index: number; code: string }[]>> {
  const micrographs = items.filter((item) => item.kind === 'micrograph' && item.analysis.candidates?.candidates.length);
  const result = new Map<number, { index: number; code: string }[]>();
  if (micrographs.length === 0) return result;
  const copies: { sourceId: number; flakeRegion: unknown; code: string }[] = await knex('evidence')
    .join('samples', 'samples.id', 'evidence.sampleId')
    .whereRaw(`(evidence.analysis -> 'fromCandidate' ->> 'evidenceId')::bigint = any(?)`, [micrographs.map((item) => item.id)])
    .select(
      knex.raw(`(evidence.analysis -> 'fromCandidate' ->> 'evidenceId')::bigint as "sourceId"`),
      knex.raw(`evidence.metadata -> 'flakeRegion' as "flakeRegion"`),
      'samples.code',
    );
  for (const item of micrographs) {
    const made = (item.analysis.candidates?.candidates ?? []).flatMap((candidate, index) => {
      const copy = copies.find((row) => Number(row.sourceId) === item.id && sameBox(candidate.boxPx, row.flakeRegion));
      return copy ? [{ index, code: copy.code }] : [];
    });
    result.set(item.id, made);
  }
  return result;
}

/**
 * Evidence items as the API returns them. The file, author, sample and step of every item are
 * read in one query each, however many items there are.
 */
export async function presentEvidenceList(knex: Knex, items: EvidenceModel[]): Promise<Evidence[]> {
  if (items.length === 0) return [];
  const fileIds = [...new Set(items.map((item) => item.fileId))];
  const sampleIds = [...new Set(items.flatMap((item) => (item.sampleId ? [item.sampleId] : [])))];
  const stepIds = [...new Set(items.flatMap((item) => (item.stepId ? [item.stepId] : [])))];
  const userIds = [...new Set(items.flatMap((item) => (item.createdById ? [item.createdById] : [])))];

  const files: StoredFileModel[] = await knex('stored_files').whereIn('id', fileIds);
  const samples: (SampleSummary & { id: number })[] = sampleIds.length
    ? await knex('samples').whereIn('id', sampleIds).select('id', 'code', 'kind', 'material', 'name', 'status', 'layerEstimate')
    : [];
  const steps: { id: number; type: StepType }[] = stepIds.length
    ? await knex('steps').whereIn('id', stepIds).select('id', 'type')
    : [];
  const users: { id: number; displayName: string }[] = userIds.length
    ? await knex('users').whereIn('id', userIds).select('id', 'displayName')
    : [];

  const candidateFlakes = await candidateFlakesOf(knex, items);
  const fileById = new Map(files.map((file) => [Number(file.id), file]));
  const sampleById = new Map(samples.map((sample) => [sample.id, sample]));
  const stepById = new Map(steps.map((step) => [step.id, step]));
  const userById = new Map(users.map((user) => [user.id, user]));

  return items.map((item) => {
    const file = fileById.get(item.fileId);
    if (!file) throw new Error(`Evidence ${item.id} names stored file ${item.fileId}, which is not there.`);
    const sample = item.sampleId ? sampleById.get(item.sampleId) : undefined;
    const step = item.stepId ? stepById.get(item.stepId) : undefined;
    const author = item.createdById ? userById.get(item.createdById) : undefined;
    return {
      id: item.id,
      kind: item.kind,
      sample: sample ? presentSampleSummary(sample) : null,
      step: step ? { id: step.id, type: step.type } : null,
      file: presentStoredFile(file),
      originalName: item.originalName,
      metadata: item.metadata,
      analysis: item.analysis,
      // The columns mirror this estimate for queries; the analysis holds it whole.
      estimate: estimateOf(item.kind, item.analysis),
      candidateFlakes: candidateFlakes.get(item.id) ?? [],
      createdBy: author ? { id: author.id, displayName: author.displayName } : null,
      createdAt: item.createdAt.toISOString(),
      updatedAt: item.updatedAt.toISOString(),
      version: item.version,
    } as Evidence;
  });
}

export async function presentEvidence(knex: Knex, item: EvidenceModel): Promise<Evidence> {
  const [presented] = await presentEvidenceList(knex, [item]);
  return presented;
}

export function presentCalibration(calibration: MicroscopeCalibrationModel): MicroscopeCalibration {
  return {
    id: calibration.id,
    microscope: calibration.microscope,
    objectiveMagnification: calibration.objectiveMagnification,
    umPerPixel: calibration.umPerPixel,
    note: calibration.note,
    createdBy: calibration.createdBy ? { id: calibration.createdBy.id, displayName: calibration.createdBy.displayName } : null,
    createdAt: calibration.createdAt.toISOString(),
    retiredAt: calibration.retiredAt ? calibration.retiredAt.toISOString() : null,
  };
}
