import { AnalysisInputError } from '../../shared/evidence/errors';
import { analyzeAfmProfile } from '../../shared/evidence/afm';
import { findLayerCandidates } from '../../shared/evidence/candidates';
import { analyzePl } from '../../shared/evidence/pl';
import { analyzeRaman } from '../../shared/evidence/raman';
import { analyzeRegionContrast } from '../../shared/evidence/region-contrast';
import { parseTwoColumn } from '../../shared/evidence/spectrum-parse';
import type {
  AfmMetadata,
  EvidenceAnalysis,
  EvidenceKind,
  MicrographMetadata,
  PlMetadata,
  RamanMetadata,
} from '../../shared/schemas/evidence';
import { SPECTRUM_MAX_POINTS } from '../../shared/schemas/evidence';
import type { LayerEstimate } from '../../shared/schemas/evidence-analysis';
import { invalid, spectrumInvalid } from '../errors';
import type { DecodedImage } from '../files/images';

export interface XY {
  x: number[];
  y: number[];
}

/** Reads a two-column spectrum or profile; bad content is refused with the parser's own words. */
export function parseSpectrumText(text: string): XY & { notes: string[] } {
  const parsed = parseTwoColumn(text, { maxPoints: SPECTRUM_MAX_POINTS });
  if (!parsed.ok)
    throw spectrumInvalid(parsed.message, parsed.line ? { file: [`Line ${parsed.line}: ${parsed.message}`] } : undefined);
  return {
    x: parsed.x,
    y: parsed.y,
    notes: parsed.reversed ? ['The file runs from high to low x; it was read in reverse.'] : [],
  };
}

/** Runs one analysis, turning "this input cannot be analysed" into a 422 the researcher can act on. */
function guarded<T>(run: () => T, refuse: (message: string) => Error): T {
  try {
    return run();
  } catch (error) {
    if (error instanceof AnalysisInputError || error instanceof RangeError) throw refuse(error.message);
    throw error;
  }
}

const asSpectrumError = (message: string) => spectrumInvalid(message);
const asRegionError = (message: string) => invalid({ regions: [message] }, message);

const needsMaterial = (what: string) => `Name the material to get a layer call from this ${what}.`;

/** The analysis of a Raman or PL spectrum or an AFM profile, from its parsed points and metadata. */
export function analyseSpectrum(
  kind: Exclude<EvidenceKind, 'micrograph'>,
  metadata: RamanMetadata | PlMetadata | AfmMetadata,
  data: XY,
): EvidenceAnalysis {
  const { material } = metadata;
  switch (kind) {
    case 'raman':
      if (!material) return { notes: [needsMaterial('Raman spectrum')] };
      return {
        raman: guarded(() => analyzeRaman(data, { material, laserNm: (metadata as RamanMetadata).laserNm }), asSpectrumError),
      };
    case 'pl': {
      if (!material) return { notes: [needsMaterial('PL spectrum')] };
      const pl = metadata as PlMetadata;
      return {
        pl: guarded(
          () => analyzePl(data, { material, xUnit: pl.xUnit ?? 'nm', referenceIntensity: pl.referenceIntensity }),
          asSpectrumError,
        ),
      };
    }
    case 'afm':
      if (!material) return { notes: [needsMaterial('AFM profile')] };
      return {
        afm: guarded(() => analyzeAfmProfile(data, { material, offsetNm: (metadata as AfmMetadata).offsetNm }), asSpectrumError),
      };
  }
}

/** What the candidate finder needs that a micrograph's metadata lacks, in words; empty when it can run. */
export function candidateFinderGaps(metadata: MicrographMetadata): string[] {
  const gaps: string[] = [];
  if (!metadata.umPerPixel) gaps.push('a calibration (µm per pixel)');
  if (!metadata.material) gaps.push('the material');
  if (!metadata.substrate) gaps.push('the substrate');
  return gaps;
}

/**
 * A micrograph's analyses: the contrast of marked regions when both are marked, and the
 * monolayer candidate finder when asked for (chips). What cannot run is said in `notes`.
 */
export function analyseMicrograph(
  image: DecodedImage,
  metadata: MicrographMetadata,
  options: { findCandidates: boolean; keep?: Pick<EvidenceAnalysis, 'fromCandidate' | 'candidates'> },
): EvidenceAnalysis {
  const analysis: EvidenceAnalysis = { ...options.keep };
  const notes: string[] = [];
  const { material, substrate, flakeRegion, substrateRegion } = metadata;
  if (flakeRegion && substrateRegion) {
    if (material && substrate) {
      analysis.contrast = guarded(
        () =>
          analyzeRegionContrast({
            rgba: image.rgba,
            width: image.width,
            height: image.height,
            flakeRegion,
            substrateRegion,
            material,
            substrate,
            encoding: metadata.pixelEncoding,
          }),
        asRegionError,
      );
    } else {
      notes.push('The contrast of the marked regions needs the material and the substrate.');
    }
  }
  if (options.findCandidates) {
    const gaps = candidateFinderGaps(metadata);
    if (gaps.length === 0 && material && substrate && metadata.umPerPixel) {
      analysis.candidates = guarded(
        () =>
          findLayerCandidates({
            rgba: image.rgba,
            width: image.width,
            height: image.height,
            umPerPixel: metadata.umPerPixel as number,
            material,
            substrate,
            encoding: metadata.pixelEncoding,
          }),
        asRegionError,
      );
    } else {
      notes.push(`The monolayer candidate finder needs ${gaps.join(', ')}.`);
    }
  }
  if (notes.length) analysis.notes = notes;
  return analysis;
}

/** The layer estimate one piece of evidence gives, from its analysis. */
export function estimateOf(kind: EvidenceKind, analysis: EvidenceAnalysis): LayerEstimate | null {
  switch (kind) {
    case 'micrograph':
      return analysis.contrast?.estimate ?? null;
    case 'raman':
      return analysis.raman?.estimate ?? null;
    case 'pl':
      return analysis.pl?.estimate ?? null;
    case 'afm':
      return analysis.afm?.estimate ?? null;
  }
}
