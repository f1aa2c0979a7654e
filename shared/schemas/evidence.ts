/**
 * Thickness evidence: the files a researcher uploads (micrographs, Raman and PL spectra, AFM line
 * profiles), what they say about them, and what Flakeline computed from them. Shapes of the
 * analyses themselves live in ./evidence-analysis.ts.
 */
import { z } from 'zod';
import { MAX_OXIDE_THICKNESS_NM } from '../optics/contrast';
import { FLAKE_MATERIAL_IDS } from '../optics/materials';
import { STEP_TYPES } from '../steps';
import {
  AfmAnalysis,
  CandidateAnalysis,
  ContrastAnalysis,
  LayerCall,
  LayerEstimate,
  PlAnalysis,
  RamanAnalysis,
  Region,
} from './evidence-analysis';
import { IdParam } from './fields';
import { PersonRef, Sample, SampleSummary } from './sample';
import { Step } from './step';

// ---------------------------------------------------------------------------------------------
// Upload limits

/** Largest micrograph file accepted: a 50 MP 8-bit TIFF is 150 MB, but microscope cameras save ≤ 40 MB JPEG/PNG/TIFF (common practice, no source). */
export const IMAGE_MAX_BYTES = 40 * 1024 * 1024;
/** Largest spectrum or AFM profile file: 2 MB is over 50,000 two-column rows. */
export const SPECTRUM_MAX_BYTES = 2 * 1024 * 1024;
/**
 * Most pixels a micrograph may have, read from its header before anything is decoded: decoding
 * takes 4 bytes a pixel, so 50 MP is 200 MB of memory (common practice, no source).
 */
export const IMAGE_MAX_PIXELS = 50_000_000;
/** Most data rows read from a spectrum or profile. */
export const SPECTRUM_MAX_POINTS = 50_000;
/** Longest edge of a thumbnail, in pixels. */
export const THUMBNAIL_MAX_EDGE_PX = 320;
export const EVIDENCE_NOTE_MAX_LENGTH = 2000;
export const ORIGINAL_NAME_MAX_LENGTH = 200;

// ---------------------------------------------------------------------------------------------
// What the researcher says about a file

export const EVIDENCE_KINDS = ['micrograph', 'raman', 'pl', 'afm'] as const;
export const EvidenceKind = z
  .enum(EVIDENCE_KINDS, { error: 'Choose what kind of evidence this is.' })
  .meta({ id: 'EvidenceKind' });
export type EvidenceKind = z.infer<typeof EvidenceKind>;

export const EVIDENCE_KIND_LABELS: Record<EvidenceKind, string> = {
  micrograph: 'Optical micrograph',
  raman: 'Raman spectrum',
  pl: 'Photoluminescence spectrum',
  afm: 'AFM line profile',
};

/** Media types a stored file can have (the stored_files check allows the same). */
export const STORED_MEDIA_TYPES = ['image/jpeg', 'image/png', 'image/tiff', 'text/csv', 'text/plain'] as const;
export type StoredMediaType = (typeof STORED_MEDIA_TYPES)[number];

const number = (label: string) => z.number({ error: `${label} must be a number.` });
const positive = (label: string) => number(label).positive(`${label} must be above zero.`);

export const FlakeMaterialField = z.enum(FLAKE_MATERIAL_IDS, {
  error: `Choose a material Flakeline has data for: ${FLAKE_MATERIAL_IDS.join(', ')}.`,
});

/** The substrate under the flake, as the optics code models it. */
export const EvidenceSubstrate = z
  .discriminatedUnion(
    'kind',
    [
      z
        .object({
          kind: z.literal('oxide-on-silicon'),
          oxideThicknessNm: number('Oxide thickness')
            .min(0, 'Oxide thickness cannot be negative.')
            .max(MAX_OXIDE_THICKNESS_NM, `Oxide thickness above ${MAX_OXIDE_THICKNESS_NM} nm is outside what Flakeline models.`),
        })
        .strict(),
      z.object({ kind: z.literal('sapphire') }).strict(),
      z.object({ kind: z.literal('quartz') }).strict(),
    ],
    { error: 'Choose the substrate: oxide on silicon (with its thickness), sapphire or quartz.' },
  )
  .meta({ id: 'EvidenceSubstrate' });
export type EvidenceSubstrate = z.infer<typeof EvidenceSubstrate>;

/** White light seen through the camera's colour channels, or one band-pass filter. */
export const Illumination = z
  .discriminatedUnion(
    'kind',
    [
      z.object({ kind: z.literal('white') }).strict(),
      z
        .object({
          kind: z.literal('bandpass'),
          centreNm: number('Filter centre')
            .min(400, 'Filters below 400 nm are outside the modelled range.')
            .max(750, 'Filters above 750 nm are outside the modelled range.'),
        })
        .strict(),
    ],
    { error: 'Say whether the light was white or through a band-pass filter.' },
  )
  .meta({ id: 'MicrographIllumination' });
export type Illumination = z.infer<typeof Illumination>;

const note = z.string().trim().max(EVIDENCE_NOTE_MAX_LENGTH, `A note has at most ${EVIDENCE_NOTE_MAX_LENGTH} characters.`);
const laserNm = positive('Laser wavelength')
  .min(200, 'A laser line below 200 nm is unusual for Raman/PL.')
  .max(1100, 'A laser line above 1100 nm is unusual for Raman/PL.');

export const MicrographMetadata = z
  .object({
    objectiveMagnification: positive('Objective magnification').max(1000).optional(),
    /** A current calibration of this microscope and objective; the server copies its µm per pixel. */
    calibrationId: z.number().int().positive().optional(),
    /** Filled from the calibration; may be given directly when there is none. */
    umPerPixel: positive('µm per pixel').max(1000).optional(),
    illumination: Illumination.optional(),
    exposureMs: positive('Exposure').max(600_000).optional(),
    /** Defaults to the chip's substrate and oxide when the sample records them. */
    substrate: EvidenceSubstrate.optional(),
    /** Defaults to the sample's material when Flakeline has optical data for it. */
    material: FlakeMaterialField.optional(),
    /** 'srgb' undoes the gamma of ordinary JPEG/PNG before contrast is computed (see shared/optics/micrograph.ts). */
    pixelEncoding: z.enum(['as-recorded', 'srgb']).optional(),
    /** Marked on the image (pixels, origin top-left): the flake and bare substrate beside it. */
    flakeRegion: Region.optional(),
    substrateRegion: Region.optional(),
    note: note.optional(),
  })
  .strict()
  .meta({ id: 'MicrographMetadata' });
export type MicrographMetadata = z.infer<typeof MicrographMetadata>;

export const RamanMetadata = z
  .object({
    laserNm: laserNm.optional(),
    material: FlakeMaterialField.optional(),
    note: note.optional(),
  })
  .strict()
  .meta({ id: 'RamanMetadata' });
export type RamanMetadata = z.infer<typeof RamanMetadata>;

export const PlMetadata = z
  .object({
    laserNm: laserNm.optional(),
    material: FlakeMaterialField.optional(),
    /** Unit of the first column. */
    xUnit: z.enum(['nm', 'eV'], { error: 'Say whether the first column is wavelength (nm) or energy (eV).' }).default('nm'),
    /** Peak intensity of a reference flake measured the same way, for a relative intensity. */
    referenceIntensity: positive('Reference intensity').optional(),
    note: note.optional(),
  })
  .strict()
  .meta({ id: 'PlMetadata' });
export type PlMetadata = z.infer<typeof PlMetadata>;

export const AfmMetadata = z
  .object({
    material: FlakeMaterialField.optional(),
    /** Extra height adsorbates and tip settings add to the first step, in nm. */
    offsetNm: number('Offset')
      .min(0, 'The offset cannot be negative.')
      .max(5, 'An offset above 5 nm is not a few ångström.')
      .optional(),
    note: note.optional(),
  })
  .strict()
  .meta({ id: 'AfmMetadata' });
export type AfmMetadata = z.infer<typeof AfmMetadata>;

export const EVIDENCE_METADATA_SCHEMAS = {
  micrograph: MicrographMetadata,
  raman: RamanMetadata,
  pl: PlMetadata,
  afm: AfmMetadata,
} as const satisfies Record<EvidenceKind, z.ZodObject>;
export type EvidenceMetadata = MicrographMetadata | RamanMetadata | PlMetadata | AfmMetadata;

/**
 * The text fields of a multipart upload (`file` is the file part). `metadata` is a JSON string
 * checked against the schema of `kind`; errors come back under `metadata.<field>`.
 */
export const EvidenceUploadFields = z
  .object({
    kind: EvidenceKind,
    metadata: z.string().max(20_000, 'The metadata is too long.').default('{}'),
  })
  .meta({ id: 'EvidenceUploadFields' });
export type EvidenceUploadFields = z.input<typeof EvidenceUploadFields>;

// ---------------------------------------------------------------------------------------------
// Stored files and evidence as the API returns them

/** A stored file: its checksum is its name; `url` and `thumbnailUrl` serve it after re-checking it. */
export const StoredFileRef = z
  .object({
    sha256: z.string().regex(/^[0-9a-f]{64}$/),
    byteSize: z.number().int().nonnegative(),
    mediaType: z.enum(STORED_MEDIA_TYPES),
    widthPx: z.number().int().positive().nullable(),
    heightPx: z.number().int().positive().nullable(),
    url: z.string(),
    thumbnailUrl: z.string().nullable(),
  })
  .meta({ id: 'StoredFileRef' });
export type StoredFileRef = z.infer<typeof StoredFileRef>;

/** What Flakeline computed from one piece of evidence; which parts exist depends on the kind. */
export const EvidenceAnalysis = z
  .object({
    contrast: ContrastAnalysis.optional(),
    candidates: CandidateAnalysis.optional(),
    raman: RamanAnalysis.optional(),
    pl: PlAnalysis.optional(),
    afm: AfmAnalysis.optional(),
    /** Set on a flake's micrograph made from a candidate of a chip's micrograph. */
    fromCandidate: z.object({ evidenceId: z.number(), index: z.number() }).optional(),
    /** Why an analysis could not run (e.g. no calibration, unknown material), in plain words. */
    notes: z.array(z.string()).optional(),
  })
  .meta({ id: 'EvidenceAnalysis' });
export type EvidenceAnalysis = z.infer<typeof EvidenceAnalysis>;

const evidenceOf = <K extends EvidenceKind, M extends z.ZodType>(kind: K, metadata: M) =>
  z.object({
    id: z.number(),
    kind: z.literal(kind),
    /** The sample it is attached to, or null when it is attached to a step. */
    sample: SampleSummary.nullable(),
    step: z.object({ id: z.number(), type: z.enum(STEP_TYPES) }).nullable(),
    file: StoredFileRef,
    originalName: z.string().nullable(),
    metadata,
    analysis: EvidenceAnalysis,
    /** The layer count this evidence supports, with its uncertainty and method; null when it gives none. */
    estimate: LayerEstimate.nullable(),
    /** Candidates of this micrograph already made into flake records (index into its candidate list). */
    candidateFlakes: z.array(z.object({ index: z.number().int(), code: z.string() })),
    createdBy: PersonRef.nullable(),
    createdAt: z.iso.datetime(),
    updatedAt: z.iso.datetime(),
    version: z.number(),
  });

export const Evidence = z
  .discriminatedUnion('kind', [
    evidenceOf('micrograph', MicrographMetadata),
    evidenceOf('raman', RamanMetadata),
    evidenceOf('pl', PlMetadata),
    evidenceOf('afm', AfmMetadata),
  ])
  .meta({ id: 'Evidence' });
export type Evidence = z.infer<typeof Evidence>;

export const EvidenceEnvelope = z.object({ evidence: Evidence }).meta({ id: 'EvidenceEnvelope' });
export type EvidenceEnvelope = z.infer<typeof EvidenceEnvelope>;

/** A sample's evidence, newest first, and the one layer call it adds up to. */
export const EvidenceList = z.object({ evidence: z.array(Evidence), layerCall: LayerCall }).meta({ id: 'EvidenceList' });
export type EvidenceList = z.infer<typeof EvidenceList>;

/** A candidate of an evidence item's candidate list: `/evidence/:id/candidates/:index`. */
export const CandidateParam = IdParam.extend({
  index: z
    .string()
    .regex(/^(0|[1-9][0-9]{0,5})$/, 'A candidate index is a whole number from 0.')
    .transform(Number),
});

/** Evidence without a layer call (e.g. a step's). */
export const EvidenceItems = z.object({ evidence: z.array(Evidence) }).meta({ id: 'EvidenceItems' });
export type EvidenceItems = z.infer<typeof EvidenceItems>;

/** An edit replaces the metadata (checked against the kind's schema) and re-runs the analysis. */
export const EvidenceUpdateInput = z
  .object({
    version: z.number({ error: 'Send the version you edited.' }).int().positive(),
    metadata: z.record(z.string(), z.unknown()),
  })
  .meta({ id: 'EvidenceUpdateInput' });
export type EvidenceUpdateInput = z.input<typeof EvidenceUpdateInput>;

/** Regions marked on a micrograph; material and substrate override what the evidence records. */
export const ContrastInput = z
  .object({
    /** When given, a stale version is refused like an edit. */
    version: z.number().int().positive().optional(),
    flakeRegion: Region,
    substrateRegion: Region,
    material: FlakeMaterialField.optional(),
    substrate: EvidenceSubstrate.optional(),
    pixelEncoding: z.enum(['as-recorded', 'srgb']).optional(),
  })
  .meta({ id: 'ContrastInput' });
export type ContrastInput = z.input<typeof ContrastInput>;

/** A candidate made into a flake: the new flake, the flake_search step, and the flake's micrograph evidence. */
export const CandidateFlakeResult = z
  .object({ sample: Sample, step: Step, evidence: Evidence })
  .meta({ id: 'CandidateFlakeResult' });
export type CandidateFlakeResult = z.infer<typeof CandidateFlakeResult>;

// ---------------------------------------------------------------------------------------------
// Microscope calibrations

export const MICROSCOPE_NAME_MAX_LENGTH = 80;

export const MicroscopeCalibration = z
  .object({
    id: z.number(),
    microscope: z.string(),
    objectiveMagnification: z.number(),
    umPerPixel: z.number(),
    note: z.string().nullable(),
    createdBy: PersonRef.nullable(),
    createdAt: z.iso.datetime(),
    retiredAt: z.iso.datetime().nullable(),
  })
  .meta({ id: 'MicroscopeCalibration' });
export type MicroscopeCalibration = z.infer<typeof MicroscopeCalibration>;

/** A new calibration of a microscope and objective replaces (retires) the current one. */
export const CalibrationCreateInput = z
  .object({
    microscope: z
      .string({ error: 'Name the microscope.' })
      .trim()
      .min(1, 'Name the microscope.')
      .max(MICROSCOPE_NAME_MAX_LENGTH, `A microscope name has at most ${MICROSCOPE_NAME_MAX_LENGTH} characters.`),
    objectiveMagnification: positive('Objective magnification').max(1000),
    umPerPixel: positive('µm per pixel').max(1000),
    note: z.string().trim().max(500).optional(),
  })
  .meta({ id: 'CalibrationCreateInput' });
export type CalibrationCreateInput = z.input<typeof CalibrationCreateInput>;

export const CalibrationListQuery = z
  .object({
    includeRetired: z
      .enum(['true', 'false'], { error: 'includeRetired is true or false.' })
      .transform((value) => value === 'true')
      .optional(),
  })
  .meta({ id: 'CalibrationListQuery' });

export const CalibrationList = z.object({ calibrations: z.array(MicroscopeCalibration) }).meta({ id: 'CalibrationList' });
export type CalibrationList = z.infer<typeof CalibrationList>;
export const CalibrationEnvelope = z.object({ calibration: MicroscopeCalibration }).meta({ id: 'CalibrationEnvelope' });
export type CalibrationEnvelope = z.infer<typeof CalibrationEnvelope>;

export const FileShaParam = z.object({
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'A file is named by its SHA-256 in lower-case hex.'),
});

export const FileDownloadQuery = z
  .object({
    download: z
      .enum(['true', 'false'], { error: 'download is true or false.' })
      .transform((value) => value === 'true')
      .optional(),
  })
  .meta({ id: 'FileDownloadQuery' });
