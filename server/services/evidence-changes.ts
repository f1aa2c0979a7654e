import type { Knex } from 'knex';
import type {
  ContrastInput,
  EvidenceAnalysis,
  EvidenceKind,
  EvidenceMetadata,
  MicrographMetadata,
} from '../../shared/schemas/evidence';
import { ORIGINAL_NAME_MAX_LENGTH } from '../../shared/schemas/evidence';
import { invalid, notFound } from '../errors';
import type { FileStore } from '../files/file-store';
import { decodeImage } from '../files/images';
import { decodeStrictText, sniffUpload } from '../files/sniff';
import { type EvidenceModel, StoredFileModel } from '../models/evidence-models';
import { SampleModel } from '../models/sample-model';
import { StepModel } from '../models/step-model';
import type { UserModel } from '../models/user-model';
import { analyseMicrograph, analyseSpectrum, candidateFinderGaps, parseSpectrumText } from './evidence-analyser';
import { ingestEvidenceFile } from './evidence-ingest';
import { completeMetadata, parseMetadata, parseMetadataJson } from './evidence-metadata';
import { addEvidence, findEvidence, saveAnalysis } from './evidence-records';
import { findSampleByCode } from './sample-lookup';

/** The candidate finder searches whole chips; other samples are single flakes or stacks already. */
const searchesForCandidates = (kind: EvidenceKind, sample: SampleModel | null) =>
  kind === 'micrograph' && sample?.kind === 'chip';

/** A client's file name without any folder part, kept only to show people. */
function cleanName(name: string | undefined): string | null {
  const base = (name ?? '').split(/[\\/]/).pop()?.trim() ?? '';
  return base ? base.slice(0, ORIGINAL_NAME_MAX_LENGTH) : null;
}

/** Upload → checked, analysed, stored file → evidence row, history and the sample's new call. */
export async function uploadEvidence(props: {
  knex: Knex;
  files: FileStore;
  actor: UserModel;
  target: { sampleCode: string } | { stepId: number };
  kind: EvidenceKind;
  metadataJson: string;
  file: { buffer: Buffer; originalname: string; mimetype: string };
}): Promise<EvidenceModel> {
  const { knex, files, actor, kind, target } = props;
  let sample: SampleModel | null = null;
  let step: StepModel | null = null;
  if ('sampleCode' in target) {
    sample = await findSampleByCode(target.sampleCode);
  } else {
    step = (await StepModel.query(knex).findById(target.stepId)) ?? null;
    if (!step) throw notFound(`There is no step with id ${target.stepId}.`);
  }
  const metadata = await completeMetadata({ knex, kind, metadata: parseMetadataJson(kind, props.metadataJson), sample });
  const ingested = await ingestEvidenceFile({
    files,
    data: props.file.buffer,
    originalName: props.file.originalname,
    declaredType: props.file.mimetype,
    kind,
    metadata,
    findCandidates: searchesForCandidates(kind, sample),
  });
  return knex.transaction((trx) =>
    addEvidence({
      trx,
      actor,
      target: sample ? { sample } : { step: step as StepModel },
      kind,
      originalName: cleanName(props.file.originalname),
      metadata,
      ingested,
    }),
  );
}

/**
 * Analyses an item's stored file again with new metadata. The file is read through the file
 * store, so an altered or missing file stops the analysis with `file_altered` / `file_missing`.
 */
async function reanalyse(props: {
  knex: Knex;
  files: FileStore;
  evidence: EvidenceModel;
  metadata: EvidenceMetadata;
  findCandidates: boolean;
}): Promise<EvidenceAnalysis> {
  const { evidence, metadata } = props;
  const stored = await StoredFileModel.query(props.knex).findById(evidence.fileId);
  if (!stored) throw new Error(`Evidence ${evidence.id} names stored file ${evidence.fileId}, which is not there.`);
  const data = await props.files.read(stored.sha256);
  const { fromCandidate, candidates } = evidence.analysis;
  if (evidence.kind === 'micrograph') {
    // Stored sizes are after EXIF orientation; the header's come again from sniffing the stored bytes.
    const sniffed = sniffUpload({ data, kind: 'micrograph' });
    if (sniffed.family !== 'image')
      throw new Error(`Stored micrograph ${stored.sha256} is no longer an image, yet it matches its checksum.`);
    const image = await decodeImage(data, sniffed);
    return analyseMicrograph(image, metadata as MicrographMetadata, {
      findCandidates: props.findCandidates,
      keep: props.findCandidates ? { fromCandidate } : { fromCandidate, candidates },
    });
  }
  const text = decodeStrictText(data);
  if (text === null) throw new Error(`Stored spectrum ${stored.sha256} is no longer text, yet it matches its checksum.`);
  const points = parseSpectrumText(text);
  const analysis = analyseSpectrum(evidence.kind, metadata, points);
  if (points.notes.length) analysis.notes = [...points.notes, ...(analysis.notes ?? [])];
  return analysis;
}

const sampleOf = async (knex: Knex, evidence: EvidenceModel) =>
  evidence.sampleId ? ((await SampleModel.query(knex).findById(evidence.sampleId)) ?? null) : null;

/** New metadata from the version the editor read; the analysis is run again with it. */
export async function editEvidenceMetadata(props: {
  knex: Knex;
  files: FileStore;
  actor: UserModel;
  id: number;
  version: number;
  metadata: unknown;
}): Promise<EvidenceModel> {
  const { knex, files } = props;
  const evidence = await findEvidence(knex, props.id);
  const sample = await sampleOf(knex, evidence);
  const metadata = await completeMetadata({
    knex,
    kind: evidence.kind,
    metadata: parseMetadata(evidence.kind, props.metadata),
    sample,
  });
  const analysis = await reanalyse({
    knex,
    files,
    evidence,
    metadata,
    findCandidates: searchesForCandidates(evidence.kind, sample),
  });
  return knex.transaction((trx) =>
    saveAnalysis({
      trx,
      actor: props.actor,
      evidenceId: evidence.id,
      version: props.version,
      metadata,
      analysis,
      event: 'evidence.edited',
      what: 'metadata',
    }),
  );
}

async function micrographOf(knex: Knex, id: number): Promise<EvidenceModel> {
  const evidence = await findEvidence(knex, id);
  if (evidence.kind !== 'micrograph') {
    throw invalid({ _: ['Regions and candidates are found on micrographs; this evidence is a spectrum or profile.'] });
  }
  return evidence;
}

/** Contrast of a marked flake region against a marked bare-substrate region, compared with predictions. */
export async function measureContrast(props: {
  knex: Knex;
  files: FileStore;
  actor: UserModel;
  id: number;
  input: ContrastInput;
}): Promise<EvidenceModel> {
  const { knex, files, input } = props;
  const evidence = await micrographOf(knex, props.id);
  const sample = await sampleOf(knex, evidence);
  const given: MicrographMetadata = {
    ...(evidence.metadata as MicrographMetadata),
    flakeRegion: input.flakeRegion,
    substrateRegion: input.substrateRegion,
    ...(input.material ? { material: input.material } : {}),
    ...(input.substrate ? { substrate: input.substrate } : {}),
    ...(input.pixelEncoding ? { pixelEncoding: input.pixelEncoding } : {}),
  };
  const metadata = (await completeMetadata({ knex, kind: 'micrograph', metadata: given, sample })) as MicrographMetadata;
  const missing: Record<string, string[]> = {};
  if (!metadata.material)
    missing.material = ['Choose the material: the sample’s material is not one Flakeline has optical data for.'];
  if (!metadata.substrate)
    missing.substrate = ['Give the substrate (and oxide thickness): neither the sample nor its parent records it.'];
  if (Object.keys(missing).length) throw invalid(missing, 'Contrast needs the material and the substrate.');
  const analysis = await reanalyse({ knex, files, evidence, metadata, findCandidates: false });
  return knex.transaction((trx) =>
    saveAnalysis({
      trx,
      actor: props.actor,
      evidenceId: evidence.id,
      version: input.version ?? evidence.version,
      metadata,
      analysis,
      event: 'evidence.analysed',
      what: 'contrast',
    }),
  );
}

/** Runs the monolayer candidate finder again on a chip's micrograph (e.g. after a calibration was added). */
export async function rerunCandidates(props: {
  knex: Knex;
  files: FileStore;
  actor: UserModel;
  id: number;
}): Promise<EvidenceModel> {
  const { knex, files } = props;
  const evidence = await micrographOf(knex, props.id);
  const sample = await sampleOf(knex, evidence);
  if (!searchesForCandidates(evidence.kind, sample)) {
    throw invalid({ _: ['The candidate finder searches micrographs of chips; this micrograph is not attached to a chip.'] });
  }
  const metadata = (await completeMetadata({
    knex,
    kind: 'micrograph',
    metadata: evidence.metadata,
    sample,
  })) as MicrographMetadata;
  const gaps = candidateFinderGaps(metadata);
  if (gaps.length)
    throw invalid({ metadata: [`The candidate finder needs ${gaps.join(', ')}. Add them to the micrograph first.`] });
  const analysis = await reanalyse({ knex, files, evidence, metadata, findCandidates: true });
  return knex.transaction((trx) =>
    saveAnalysis({
      trx,
      actor: props.actor,
      evidenceId: evidence.id,
      version: evidence.version,
      metadata,
      analysis,
      event: 'evidence.analysed',
      what: 'candidates',
    }),
  );
}
