/**
 * Shapes of what Flakeline computes from thickness evidence (shared/evidence/): regions marked on a
 * micrograph, fitted spectrum peaks, AFM levels, contrast matches, monolayer candidates, one
 * layer estimate per piece of evidence and the combined layer call of a flake. Every shape is
 * plain JSON: analyses are stored in a jsonb column and sent to the browser as they are; fitted
 * curves are not stored, the client recomputes them from the peaks and the baseline.
 */
import { z } from 'zod';
import { MAX_OXIDE_THICKNESS_NM } from '../optics/contrast';
import { FLAKE_MATERIAL_IDS } from '../optics/materials';

/** zod 4 numbers refuse NaN and ±Infinity by themselves. */
const finite = (label: string) => z.number({ error: `${label} must be a number.` });

/** Most points a researcher can tap to mark one region. */
export const REGION_MAX_POINTS = 200;
/** Largest radius of a tapped point, in image pixels. */
export const REGION_MAX_RADIUS_PX = 2000;
/** Image coordinates above this are refused (no camera has a 100,000-pixel edge). */
export const REGION_MAX_COORDINATE_PX = 100_000;

const coordinate = (label: string) =>
  finite(label).min(0, `${label} cannot be negative.`).max(REGION_MAX_COORDINATE_PX, `${label} is beyond any image edge.`);

/**
 * A part of a micrograph in image pixels, origin at the top-left corner, x to the right and y
 * down: a dragged box, or tapped points each covering a disc of `radiusPx`.
 */
export const Region = z
  .discriminatedUnion(
    'shape',
    [
      z
        .object({
          shape: z.literal('box'),
          x: coordinate('Box x'),
          y: coordinate('Box y'),
          width: coordinate('Box width').positive('A box needs a width.'),
          height: coordinate('Box height').positive('A box needs a height.'),
        })
        .strict(),
      z
        .object({
          shape: z.literal('points'),
          points: z
            .array(z.object({ x: coordinate('Point x'), y: coordinate('Point y') }).strict())
            .min(1, 'Tap at least one point.')
            .max(REGION_MAX_POINTS, `Tap at most ${REGION_MAX_POINTS} points.`),
          radiusPx: finite('Point radius')
            .positive('A point radius must be above zero.')
            .max(REGION_MAX_RADIUS_PX, `A point radius is at most ${REGION_MAX_RADIUS_PX} pixels.`),
        })
        .strict(),
    ],
    { error: 'Mark a region as a box or as tapped points.' },
  )
  .meta({ id: 'Region' });
export type Region = z.infer<typeof Region>;

export const FlakeMaterial = z.enum(FLAKE_MATERIAL_IDS).meta({ id: 'FlakeMaterial' });
export type FlakeMaterial = z.infer<typeof FlakeMaterial>;

/** The substrate an analysis assumed (the same union as `Substrate` in shared/optics/contrast.ts). */
export const AnalysisSubstrate = z
  .discriminatedUnion('kind', [
    z.object({ kind: z.literal('oxide-on-silicon'), oxideThicknessNm: z.number().min(0).max(MAX_OXIDE_THICKNESS_NM) }),
    z.object({ kind: z.literal('sapphire') }),
    z.object({ kind: z.literal('quartz') }),
  ])
  .meta({ id: 'AnalysisSubstrate' });
export type AnalysisSubstrate = z.infer<typeof AnalysisSubstrate>;

/** Where a prediction's optical constants come from (`DatasetInfo` in shared/optics/materials.ts). */
export const OpticalDataset = z
  .object({
    id: z.string(),
    citation: z.string(),
    doi: z.string().optional(),
    kind: z.enum(['table', 'formula']),
    fromNm: z.number(),
    toNm: z.number(),
    note: z.string().optional(),
  })
  .meta({ id: 'OpticalDataset' });
export type OpticalDataset = z.infer<typeof OpticalDataset>;

export const RgbValues = z.object({ red: z.number(), green: z.number(), blue: z.number() }).meta({ id: 'RgbValues' });
export type RgbValues = z.infer<typeof RgbValues>;

// ---------------------------------------------------------------------------------------------
// One layer estimate per piece of evidence, and the combined call

export const LAYER_METHODS = ['optical_contrast', 'raman', 'pl', 'afm'] as const;
export const LayerMethod = z.enum(LAYER_METHODS).meta({ id: 'LayerMethod' });
export type LayerMethod = z.infer<typeof LayerMethod>;

/** What the person reads for each method ("Raman says 1, contrast says 2"). */
export const LAYER_METHOD_WORDS: Record<LayerMethod, string> = {
  optical_contrast: 'contrast',
  raman: 'Raman',
  pl: 'PL',
  afm: 'AFM',
};

/**
 * The layer count one piece of evidence supports: `layers` ± `uncertainty` (in layers). When
 * `isLowerBound` is true the evidence only says "at least `layers`" (e.g. a Raman mode that
 * appears from two layers on), and `uncertainty` applies to the lower end.
 */
export const LayerEstimate = z
  .object({
    layers: z.number().int().min(1),
    uncertainty: z.number().min(0),
    method: LayerMethod,
    /** The numbers and the rule behind the estimate, in one or two sentences. */
    basis: z.string(),
    isLowerBound: z.boolean().optional(),
  })
  .meta({ id: 'LayerEstimate' });
export type LayerEstimate = z.infer<typeof LayerEstimate>;

export const LAYER_CALL_STATUSES = ['no_evidence', 'single', 'agreeing', 'disagreeing'] as const;

export const LayerCallEstimate = z
  .object({
    evidenceId: z.number().int(),
    kind: z.enum(['micrograph', 'raman', 'pl', 'afm']),
    estimate: LayerEstimate,
  })
  .meta({ id: 'LayerCallEstimate' });
export type LayerCallEstimate = z.infer<typeof LayerCallEstimate>;

/**
 * A flake's one layer call from all its evidence. `layers` is an exact count, or null when there
 * is none (no evidence, a disagreement, or evidence that only gives a lower bound, in which case
 * `atLeast` holds it). `summary` says it in plain words, disagreements included.
 */
export const LayerCall = z
  .object({
    layers: z.number().int().min(1).nullable(),
    atLeast: z.number().int().min(1).nullable(),
    /** ± layers around `layers` (or below `atLeast`); null when there is no call. */
    uncertainty: z.number().min(0).nullable(),
    status: z.enum(LAYER_CALL_STATUSES),
    summary: z.string(),
    estimates: z.array(LayerCallEstimate),
  })
  .meta({ id: 'LayerCall' });
export type LayerCall = z.infer<typeof LayerCall>;

// ---------------------------------------------------------------------------------------------
// Spectra (Raman, PL)

/**
 * One fitted Lorentzian, height/(1 + (2(x − centre)/fwhm)²), on top of the baseline. Units are
 * those of the fitted axis (cm⁻¹ for Raman, eV for PL). `area` = π·height·fwhm/2.
 */
export const FittedPeak = z
  .object({
    /** The mode or feature the peak was identified as (e.g. "A1g", "2D"), null when unassigned. */
    label: z.string().nullable(),
    centre: z.number(),
    fwhm: z.number().positive(),
    height: z.number(),
    area: z.number(),
    /** One-sigma standard errors from the fit's covariance; absent when the fit could not give them. */
    stdErr: z.object({ centre: z.number(), fwhm: z.number(), height: z.number() }).optional(),
  })
  .meta({ id: 'FittedPeak' });
export type FittedPeak = z.infer<typeof FittedPeak>;

/**
 * The background under the peaks: a polynomial in t = (x − xCentre)/xHalfSpan,
 * Σ coefficients[i]·tⁱ. It starts as a sigma-clipped polynomial fit of the peak-free points and is
 * then refined together with the peaks in one least-squares fit.
 */
export const SpectrumBaseline = z
  .object({
    method: z.literal('polynomial_fitted_with_peaks'),
    degree: z.number().int().min(0),
    xCentre: z.number(),
    xHalfSpan: z.number().positive(),
    coefficients: z.array(z.number()),
  })
  .meta({ id: 'SpectrumBaseline' });
export type SpectrumBaseline = z.infer<typeof SpectrumBaseline>;

/**
 * One stretch of the spectrum fitted on its own: its baseline and how well the peaks whose
 * centres lie in [fromX, toX] describe it. The fitted curve there is the baseline plus those peaks.
 */
export const SpectrumWindowFit = z
  .object({
    fromX: z.number(),
    toX: z.number(),
    baseline: SpectrumBaseline,
    /** Root-mean-square residual of the fit, in intensity units. */
    rmsResidual: z.number(),
    /** Noise estimated from point-to-point scatter, for comparison with the residual. */
    noise: z.number(),
    iterations: z.number().int(),
    converged: z.boolean(),
  })
  .meta({ id: 'SpectrumWindowFit' });
export type SpectrumWindowFit = z.infer<typeof SpectrumWindowFit>;

/** A number derived from the peaks, e.g. the MoS2 mode separation or graphene's I(2D)/I(G). */
export const DerivedQuantity = z
  .object({
    key: z.string(),
    label: z.string(),
    value: z.number(),
    unit: z.string(),
    stdErr: z.number().optional(),
  })
  .meta({ id: 'DerivedQuantity' });
export type DerivedQuantity = z.infer<typeof DerivedQuantity>;

/** A published or rule-of-thumb value a rule relies on, with its source and how far to trust it. */
export const RuleReference = z
  .object({
    text: z.string(),
    source: z.string(),
    mark: z.enum(['published', 'computed_from_published', 'common_practice', 'from_memory']),
  })
  .meta({ id: 'RuleReference' });
export type RuleReference = z.infer<typeof RuleReference>;

export const RamanAnalysis = z
  .object({
    material: FlakeMaterial,
    laserNm: z.number().nullable(),
    xUnit: z.literal('cm-1'),
    windows: z.array(SpectrumWindowFit),
    peaks: z.array(FittedPeak),
    quantities: z.array(DerivedQuantity),
    estimate: LayerEstimate.nullable(),
    references: z.array(RuleReference),
    notes: z.array(z.string()),
  })
  .meta({ id: 'RamanAnalysis' });
export type RamanAnalysis = z.infer<typeof RamanAnalysis>;

/** A PL peak: fitted on an energy axis, reported both as energy and wavelength. */
export const PlPeak = FittedPeak.extend({
  energyEv: z.number(),
  wavelengthNm: z.number(),
}).meta({ id: 'PlPeak' });
export type PlPeak = z.infer<typeof PlPeak>;

export const PlAnalysis = z
  .object({
    material: FlakeMaterial,
    /** Unit of the uploaded first column; peaks are always fitted against energy in eV. */
    xUnit: z.enum(['nm', 'eV']),
    /** Fitted against energy in eV. */
    windows: z.array(SpectrumWindowFit),
    /** Peaks in eV (centre, fwhm), strongest first. */
    peaks: z.array(PlPeak),
    /** The peak taken as the A exciton, null when none sits near the expected energy. */
    aExciton: PlPeak.nullable(),
    /** Monolayer A-exciton energy the peak is compared with, and the window accepted around it. */
    monolayerAExcitonEv: z.number().nullable(),
    toleranceEv: z.number().nullable(),
    /** aExciton − monolayer value, in meV. */
    shiftMeV: z.number().nullable(),
    referenceIntensity: z.number().nullable(),
    relativeIntensity: z.number().nullable(),
    estimate: LayerEstimate.nullable(),
    references: z.array(RuleReference),
    notes: z.array(z.string()),
  })
  .meta({ id: 'PlAnalysis' });
export type PlAnalysis = z.infer<typeof PlAnalysis>;

// ---------------------------------------------------------------------------------------------
// AFM line profiles

/** A flat level of the profile (substrate or a terrace) after the common tilt is removed. */
export const AfmLevel = z
  .object({
    /** Height above the lowest level, nm. */
    heightNm: z.number(),
    stdDevNm: z.number(),
    pointCount: z.number().int(),
    /** Extent along the profile, µm. */
    fromUm: z.number(),
    toUm: z.number(),
    /** Layers on this level; 0 for the substrate. */
    layers: z.number().int().min(0),
  })
  .meta({ id: 'AfmLevel' });
export type AfmLevel = z.infer<typeof AfmLevel>;

export const AfmStep = z
  .object({
    fromLevel: z.number().int(),
    toLevel: z.number().int(),
    heightNm: z.number(),
    stdErrNm: z.number(),
    /** 'substrate' = from bare substrate onto the flake (includes the offset); 'layer' = terrace to terrace. */
    kind: z.enum(['substrate', 'layer']),
    layers: z.number().int(),
  })
  .meta({ id: 'AfmStep' });
export type AfmStep = z.infer<typeof AfmStep>;

export const AfmAnalysis = z
  .object({
    material: FlakeMaterial,
    interlayerSpacingNm: z.number(),
    offsetNm: z.number(),
    offsetUncertaintyNm: z.number(),
    /** Removed tilt, nm per µm. */
    slopeNmPerUm: z.number(),
    noiseNm: z.number(),
    /** Levels from the lowest (index 0, taken as the substrate) up. */
    levels: z.array(AfmLevel),
    steps: z.array(AfmStep),
    estimate: LayerEstimate.nullable(),
    references: z.array(RuleReference),
    notes: z.array(z.string()),
  })
  .meta({ id: 'AfmAnalysis' });
export type AfmAnalysis = z.infer<typeof AfmAnalysis>;

// ---------------------------------------------------------------------------------------------
// Micrographs: marked-region contrast and the candidate finder

/** Pixel statistics of a marked region, 0–255 scale (linear light when the image was sRGB-decoded). */
export const RegionStats = z
  .object({
    pixelCount: z.number().int(),
    mean: RgbValues,
    stdDev: RgbValues,
  })
  .meta({ id: 'RegionStats' });
export type RegionStats = z.infer<typeof RegionStats>;

export const ContrastPrediction = z
  .object({
    layers: z.number().int(),
    predicted: RgbValues,
    chiSquared: z.number(),
  })
  .meta({ id: 'ContrastPrediction' });
export type ContrastPrediction = z.infer<typeof ContrastPrediction>;

export const ContrastAnalysis = z
  .object({
    material: FlakeMaterial,
    substrate: AnalysisSubstrate,
    pixelEncoding: z.enum(['as-recorded', 'srgb']),
    flake: RegionStats,
    substrateRegion: RegionStats,
    /** Measured (I_substrate − I_flake)/I_substrate per channel; positive = flake darker. */
    measured: RgbValues,
    /** One-sigma uncertainty used per channel. */
    uncertainty: RgbValues,
    predictions: z.array(ContrastPrediction),
    bestLayers: z.number().int(),
    runnerUpLayers: z.number().int(),
    /** χ²(runner-up) − χ²(best). */
    margin: z.number(),
    confidence: z.enum(['clear', 'marginal', 'ambiguous']),
    isPoorFit: z.boolean(),
    summary: z.string(),
    datasets: z.array(OpticalDataset),
    estimate: LayerEstimate,
    notes: z.array(z.string()),
  })
  .meta({ id: 'ContrastAnalysis' });
export type ContrastAnalysis = z.infer<typeof ContrastAnalysis>;

export const PixelBox = z
  .object({ x: z.number(), y: z.number(), width: z.number(), height: z.number() })
  .meta({ id: 'PixelBox' });
export type PixelBox = z.infer<typeof PixelBox>;

export const LayerCandidate = z
  .object({
    layers: z.union([z.literal(1), z.literal(2)]),
    areaUm2: z.number(),
    /** Full-resolution image pixels, origin top-left. */
    centroidPx: z.object({ x: z.number(), y: z.number() }),
    boxPx: PixelBox,
    meanContrast: RgbValues,
  })
  .meta({ id: 'LayerCandidate' });
export type LayerCandidate = z.infer<typeof LayerCandidate>;

/** The contrast window a candidate of `layers` layers must fall in, per channel. */
export const ContrastWindow = z
  .object({
    layers: z.number().int(),
    predicted: RgbValues,
    tolerance: RgbValues,
  })
  .meta({ id: 'ContrastWindow' });
export type ContrastWindow = z.infer<typeof ContrastWindow>;

export const CandidateAnalysis = z
  .object({
    material: FlakeMaterial,
    substrate: AnalysisSubstrate,
    umPerPixel: z.number(),
    /** Image pixels averaged into one working pixel along each edge (1 = full resolution). */
    blockSize: z.number().int().min(1),
    workingWidth: z.number().int(),
    workingHeight: z.number().int(),
    /** Area of one working pixel, µm²: the resolution of the reported areas. */
    workingPixelAreaUm2: z.number(),
    /** Smallest candidate kept, µm². */
    minAreaUm2: z.number(),
    /** Estimated bare-substrate colour at the image centre, 0–255 scale (the estimate follows the illumination across the field). */
    background: RgbValues,
    windows: z.array(ContrastWindow),
    /** Monolayers first, then bilayers, each largest first. */
    candidates: z.array(LayerCandidate),
    /** Candidates found before `maxCandidates` cut the list. */
    totalFound: z.number().int(),
    datasets: z.array(OpticalDataset),
    notes: z.array(z.string()),
  })
  .meta({ id: 'CandidateAnalysis' });
export type CandidateAnalysis = z.infer<typeof CandidateAnalysis>;
