import type {
  EvidenceAnalysis,
  EvidenceKind,
  EvidenceMetadata,
  MicrographMetadata,
  StoredMediaType,
} from '../../shared/schemas/evidence';
import type { LayerEstimate } from '../../shared/schemas/evidence-analysis';
import type { FileStore } from '../files/file-store';
import { decodeImage, thumbnailPng } from '../files/images';
import { sniffUpload } from '../files/sniff';
import { analyseMicrograph, analyseSpectrum, estimateOf, parseSpectrumText } from './evidence-analyser';

/** Runs one named stage of an ingest; the benchmark passes a timer, the server runs stages as they are. */
export type StageRunner = <T>(stage: string, run: () => T | Promise<T>) => Promise<T>;
const untimed: StageRunner = async (_stage, run) => run();

/** A file checked, analysed and stored, ready to be recorded. */
export interface IngestedFile {
  file: {
    sha256: string;
    byteSize: number;
    mediaType: StoredMediaType;
    widthPx: number | null;
    heightPx: number | null;
    thumbnailSha256: string | null;
  };
  analysis: EvidenceAnalysis;
  estimate: LayerEstimate | null;
}

/**
 * Checks an uploaded file, analyses it and stores it (with its thumbnail) in the file store.
 * Everything that can refuse the file runs before anything is stored, and the blobs are stored
 * before any database row names them, so a failure leaves no record without its file. An image
 * is decoded once: the analyses and the thumbnail share the pixels.
 */
export async function ingestEvidenceFile(props: {
  files: FileStore;
  data: Buffer;
  originalName?: string;
  declaredType?: string;
  kind: EvidenceKind;
  metadata: EvidenceMetadata;
  /** Run the monolayer candidate finder (micrographs of chips). */
  findCandidates: boolean;
  stage?: StageRunner;
}): Promise<IngestedFile> {
  const { files, data, kind } = props;
  const stage = props.stage ?? untimed;
  const sniffed = await stage('sniff', () =>
    sniffUpload({ data, originalName: props.originalName, declaredType: props.declaredType, kind }),
  );

  if (sniffed.family === 'text') {
    const points = await stage('parse', () => parseSpectrumText(sniffed.text));
    const analysis = await stage('analyse', () =>
      analyseSpectrum(kind as Exclude<EvidenceKind, 'micrograph'>, props.metadata, points),
    );
    if (points.notes.length) analysis.notes = [...points.notes, ...(analysis.notes ?? [])];
    const { sha256 } = await stage('store', () => files.save(data));
    return {
      file: { sha256, byteSize: data.length, mediaType: sniffed.mediaType, widthPx: null, heightPx: null, thumbnailSha256: null },
      analysis,
      estimate: estimateOf(kind, analysis),
    };
  }

  const image = await stage('decode', () => decodeImage(data, sniffed));
  const analysis = await stage('analyse', () =>
    analyseMicrograph(image, props.metadata as MicrographMetadata, { findCandidates: props.findCandidates }),
  );
  const thumbnail = await stage('thumbnail', () => thumbnailPng(image));
  const stored = await stage('store', async () => {
    const original = await files.save(data);
    const small = await files.save(thumbnail);
    return { sha256: original.sha256, thumbnailSha256: small.sha256 };
  });
  return {
    file: {
      sha256: stored.sha256,
      byteSize: data.length,
      mediaType: sniffed.mediaType,
      widthPx: image.width,
      heightPx: image.height,
      thumbnailSha256: stored.thumbnailSha256,
    },
    analysis,
    estimate: estimateOf(kind, analysis),
  };
}
