/**
 * AFM line profile → flat levels → step heights → layer counts.
 *
 * Not max − min (one dust particle or tip spike would decide it). Instead:
 * 1. the tilt is the median slope between points a fixed distance apart (steps are rare, so the
 *    median ignores them);
 * 2. the tilt-free heights are grouped into k levels by one-dimensional k-means, for k = 1…5;
 *    the largest k whose levels are each well populated and separated by several noise σ wins;
 * 3. slope and level heights are refined together by least squares (heights = slope·x + level of
 *    the point's group), points regrouped to the nearest level, until the grouping settles;
 *    points far from every level (step edges, particles) are left out of the fit.
 *
 * The lowest level is taken as the bare substrate. Its step to the next level includes the extra
 * height of adsorbates, trapped water and tip–sample forces: the offset, a parameter (literature
 * reports a few ångström; first steps of 0.6–1 nm for monolayers are common (from memory)).
 * Terrace-to-terrace steps have no such offset, so their layer counts are firmer, and the call
 * states which kind of step it rests on.
 */
import { FLAKE_MATERIALS, type FlakeMaterialId } from '../optics/materials';
import { type AfmAnalysis, type AfmLevel, type AfmStep, type RuleReference } from '../schemas/evidence-analysis';
import { checkXY, type XYData } from './errors';
import { layerEstimate } from './layer-estimate';
import { linearLeastSquares } from './linear-algebra';
import { median, noiseFromFirstDifferences } from './robust-stats';

export interface AfmOptions {
  readonly material: FlakeMaterialId;
  /** Extra height of the first step over the layers' own thickness, nm. */
  readonly offsetNm?: number;
  /** One-sided range of that offset, nm. */
  readonly offsetUncertaintyNm?: number;
}

/** Interlayer spacings, nm, with their sources (the layer thicknesses of the optics code). */
export function interlayerSpacingNm(material: FlakeMaterialId): { spacingNm: number; source: string } {
  const entry = FLAKE_MATERIALS[material];
  return { spacingNm: entry.layerThicknessNm, source: entry.layerThicknessSource };
}

/**
 * Default offset and its range when the researcher gives none: 0.3 ± 0.3 nm covers first steps
 * from the bare layer thickness up to about 0.6 nm more, the spread commonly reported (from memory).
 */
export const DEFAULT_OFFSET_NM = 0.3;
export const DEFAULT_OFFSET_UNCERTAINTY_NM = 0.3;
/** Range assumed around an offset the researcher measured and entered (common practice, no source). */
export const GIVEN_OFFSET_UNCERTAINTY_NM = 0.1;

export const AFM_MIN_POINTS = 20;
const MAX_LEVELS = 5;
/** Neighbouring levels must be this many noise σ apart to count as two levels (common practice, no source). */
const MIN_SEPARATION_SIGMAS = 4;
/** A level must hold this share of the points (and at least 5) to count (common practice, no source). */
const MIN_LEVEL_SHARE = 0.04;
/** Points farther than this many σ from every level are left out of the fit. */
const OUTLIER_SIGMAS = 4;
/** Neighbours on each side that vote on a point's level (common practice, no source). */
const NEIGHBOURS = 3;

function robustSlope(x: readonly number[], y: readonly number[]): number {
  const n = x.length;
  const gap = Math.max(1, Math.floor(n / 50));
  const slopes = new Float64Array(n - gap);
  for (let i = 0; i + gap < n; i += 1) slopes[i] = (y[i + gap] - y[i]) / (x[i + gap] - x[i]);
  return median(slopes);
}

/** One-dimensional k-means (Lloyd) from quantile starts; returns sorted centres. */
function kMeans1D(values: Float64Array, k: number): number[] {
  const sorted = Float64Array.from(values).sort();
  let centres = Array.from(
    { length: k },
    (_, j) => sorted[Math.min(sorted.length - 1, Math.floor(((j + 0.5) / k) * sorted.length))],
  );
  for (let iteration = 0; iteration < 100; iteration += 1) {
    const sums = new Array<number>(k).fill(0);
    const counts = new Array<number>(k).fill(0);
    for (const value of sorted) {
      const j = nearest(centres, value);
      sums[j] += value;
      counts[j] += 1;
    }
    const next = centres.map((centre, j) => (counts[j] > 0 ? sums[j] / counts[j] : centre)).sort((a, b) => a - b);
    if (next.every((centre, j) => Math.abs(centre - centres[j]) < 1e-12)) break;
    centres = next;
  }
  return centres;
}

function nearest(centres: readonly number[], value: number): number {
  let best = 0;
  for (let j = 1; j < centres.length; j += 1) if (Math.abs(value - centres[j]) < Math.abs(value - centres[best])) best = j;
  return best;
}

function isAcceptable(values: Float64Array, centres: readonly number[], noise: number): boolean {
  const counts = new Array<number>(centres.length).fill(0);
  for (const value of values) counts[nearest(centres, value)] += 1;
  const minCount = Math.max(5, MIN_LEVEL_SHARE * values.length);
  if (counts.some((count) => count < minCount)) return false;
  for (let j = 1; j < centres.length; j += 1) if (centres[j] - centres[j - 1] < MIN_SEPARATION_SIGMAS * noise) return false;
  return true;
}

interface LevelFit {
  readonly slope: number;
  readonly intercepts: number[];
  readonly group: Int32Array;
}

/**
 * Terraces are continuous stretches of the profile, so a point's level is the one most of its
 * neighbours (±`NEIGHBOURS` points) are nearest to. This stops noise from scattering single points
 * onto the wrong level, which would bias the slope and with it every step height.
 */
function majorityGroups(nearestGroup: Int32Array, k: number): Int32Array {
  const n = nearestGroup.length;
  const smoothed = new Int32Array(n);
  const votes = new Int32Array(k);
  for (let i = 0; i < n; i += 1) {
    if (nearestGroup[i] < 0) {
      smoothed[i] = -1;
      continue;
    }
    votes.fill(0);
    for (let j = Math.max(0, i - NEIGHBOURS); j <= Math.min(n - 1, i + NEIGHBOURS); j += 1)
      if (nearestGroup[j] >= 0) votes[nearestGroup[j]] += 1;
    let best = nearestGroup[i];
    for (let level = 0; level < k; level += 1) if (votes[level] > votes[best]) best = level;
    smoothed[i] = best;
  }
  return smoothed;
}

/** Joint least squares of a common slope and one height per level, regrouping until stable. */
function refineLevels(x: readonly number[], y: readonly number[], slope: number, centres: number[], noise: number): LevelFit {
  const n = x.length;
  const k = centres.length;
  let fit: LevelFit = { slope, intercepts: [...centres], group: new Int32Array(n) };
  for (let iteration = 0; iteration < 20; iteration += 1) {
    const nearestGroup = new Int32Array(n);
    for (let i = 0; i < n; i += 1) {
      const detrended = y[i] - fit.slope * x[i];
      const j = nearest(fit.intercepts, detrended);
      nearestGroup[i] = Math.abs(detrended - fit.intercepts[j]) > OUTLIER_SIGMAS * noise + 1e-12 ? -1 : j;
    }
    const group = majorityGroups(nearestGroup, k);
    if (iteration > 0 && group.every((value, i) => value === fit.group[i])) break;
    const solved = linearLeastSquares(
      n,
      k + 1,
      (row, out) => {
        out.fill(0);
        out[0] = x[row];
        if (group[row] >= 0) out[1 + group[row]] = 1;
      },
      y,
      (row) => (group[row] >= 0 ? 1 : 0),
    );
    if (!solved) break;
    fit = { slope: solved[0], intercepts: solved.slice(1), group };
  }
  return fit;
}

const AFM_REFERENCES = (material: FlakeMaterialId): RuleReference[] => [
  {
    text: `Interlayer spacing ${interlayerSpacingNm(material).spacingNm} nm.`,
    source: interlayerSpacingNm(material).source,
    mark: 'from_memory',
  },
  {
    text: 'First steps of monolayers are often 0.6–1 nm, above the interlayer spacing, because of adsorbates, trapped water and tip–sample forces.',
    source: 'Spread commonly reported for exfoliated flakes',
    mark: 'from_memory',
  },
];

/** Whole layers (at least one) in a height, and how many either way a ± margin allows. */
function layerRange(heightNm: number, marginNm: number, spacingNm: number): { layers: number; uncertainty: number } {
  const layers = Math.max(1, Math.round(heightNm / spacingNm));
  const low = Math.max(1, Math.round((heightNm - marginNm) / spacingNm));
  const high = Math.max(1, Math.round((heightNm + marginNm) / spacingNm));
  return { layers, uncertainty: Math.max(layers - low, high - layers) };
}

export function analyzeAfmProfile(data: XYData, options: AfmOptions): AfmAnalysis {
  checkXY(data, AFM_MIN_POINTS, 'AFM profile');
  const x = [...data.x];
  const y = [...data.y];
  const { spacingNm } = interlayerSpacingNm(options.material);
  const offsetNm = options.offsetNm ?? DEFAULT_OFFSET_NM;
  const offsetUncertaintyNm =
    options.offsetUncertaintyNm ?? (options.offsetNm === undefined ? DEFAULT_OFFSET_UNCERTAINTY_NM : GIVEN_OFFSET_UNCERTAINTY_NM);
  const noise = Math.max(noiseFromFirstDifferences(y), 1e-6);
  const notes: string[] = [];

  const startSlope = robustSlope(x, y);
  const detrended = Float64Array.from(y, (value, i) => value - startSlope * x[i]);
  // Each k is judged after slope and levels are refined together: the first slope guess is only
  // good to a few hundredths of a nm per µm, enough to smear two close levels into one.
  let fit = refineLevels(x, y, startSlope, [median(detrended)], noise);
  for (let k = 2; k <= MAX_LEVELS; k += 1) {
    const trial = refineLevels(x, y, startSlope, kMeans1D(detrended, k), noise);
    const heights = Float64Array.from(y, (value, i) => value - trial.slope * x[i]);
    if (
      isAcceptable(
        heights,
        [...trial.intercepts].sort((a, b) => a - b),
        noise,
      )
    )
      fit = trial;
  }
  // Levels left without points by the regrouping (possible when two start close together) are dropped.
  const populated = fit.intercepts.map((_, j) => j).filter((j) => fit.group.includes(j));
  const order = populated.sort((a, b) => fit.intercepts[a] - fit.intercepts[b]);
  const ground = fit.intercepts[order[0]];

  const levelStats = order.map((j) => {
    let count = 0;
    let sum = 0;
    let sumSquares = 0;
    let fromUm = Infinity;
    let toUm = -Infinity;
    for (let i = 0; i < x.length; i += 1) {
      if (fit.group[i] !== j) continue;
      const residual = y[i] - fit.slope * x[i] - fit.intercepts[j];
      count += 1;
      sum += residual;
      sumSquares += residual * residual;
      fromUm = Math.min(fromUm, x[i]);
      toUm = Math.max(toUm, x[i]);
    }
    const stdDevNm = count > 1 ? Math.sqrt(Math.max(0, sumSquares / count - (sum / count) ** 2)) : 0;
    return { heightNm: fit.intercepts[j] - ground, stdDevNm, pointCount: count, fromUm, toUm };
  });

  const steps: AfmStep[] = [];
  const levels: AfmLevel[] = [];
  let layersSoFar = 0;
  let firstRange = { layers: 1, uncertainty: 0 };
  levelStats.forEach((level, index) => {
    if (index > 0) {
      const below = levelStats[index - 1];
      const heightNm = level.heightNm - below.heightNm;
      const stdErrNm = Math.hypot(
        below.stdDevNm / Math.sqrt(Math.max(1, below.pointCount)),
        level.stdDevNm / Math.sqrt(Math.max(1, level.pointCount)),
      );
      const kind = index === 1 ? 'substrate' : 'layer';
      // Only the first step carries the offset (and its uncertainty); terrace steps are layers alone.
      const counted =
        kind === 'substrate'
          ? layerRange(heightNm - offsetNm, offsetUncertaintyNm + 2 * stdErrNm, spacingNm)
          : layerRange(heightNm, 2 * stdErrNm, spacingNm);
      if (kind === 'substrate') firstRange = counted;
      layersSoFar += counted.layers;
      steps.push({ fromLevel: index - 1, toLevel: index, heightNm, stdErrNm, kind, layers: counted.layers });
    }
    levels.push({ ...level, layers: layersSoFar });
  });

  const references = AFM_REFERENCES(options.material);
  const base = {
    material: options.material,
    interlayerSpacingNm: spacingNm,
    offsetNm,
    offsetUncertaintyNm,
    slopeNmPerUm: fit.slope,
    noiseNm: noise,
    levels,
    steps,
    references,
  };
  if (steps.length === 0) {
    return {
      ...base,
      estimate: null,
      notes: [...notes, 'The profile shows one flat level only: no step to measure. Draw the line across the flake edge.'],
    };
  }

  const first = steps[0];
  const layerSteps = steps.slice(1);
  const stepWords = layerSteps
    .map((step) => `${step.heightNm.toFixed(2)} nm (${step.layers} layer${step.layers === 1 ? '' : 's'})`)
    .join(', ');
  const measuredSpacings = layerSteps.map((step) => step.heightNm / step.layers);
  if (measuredSpacings.some((value) => Math.abs(value - spacingNm) > 0.25 * spacingNm)) {
    notes.push(
      `A terrace-to-terrace step is not a whole number of ${spacingNm} nm layers (within 25 %): check the material or a fold.`,
    );
  }
  notes.push('The lowest level is taken as the bare substrate.');
  const basis =
    `First step ${first.heightNm.toFixed(2)} nm − offset ${offsetNm.toFixed(2)} ± ${offsetUncertaintyNm.toFixed(2)} nm over ${spacingNm} nm per layer` +
    ` → ${firstRange.layers} layer${firstRange.layers === 1 ? '' : 's'} on the thinnest terrace` +
    (layerSteps.length > 0 ? `; terrace-to-terrace steps (no offset, firmer): ${stepWords}.` : '.');
  return { ...base, estimate: layerEstimate('afm', firstRange.layers, firstRange.uncertainty, basis), notes };
}
