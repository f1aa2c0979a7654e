/**
 * Raman analysis: fit the stretches of the spectrum the material's rule needs (and the silicon
 * line, when the substrate shows it, to correct absolute positions), name the fitted peaks after
 * the modes they fall on, and let the rule turn them into derived quantities and a layer call.
 */
import { type FlakeMaterialId } from '../optics/materials';
import { type DerivedQuantity, type FittedPeak, type RamanAnalysis, type SpectrumWindowFit } from '../schemas/evidence-analysis';
import { AnalysisInputError, checkXY, type XYData } from './errors';
import {
  MAX_SILICON_CORRECTION_CM1,
  type ModeSpec,
  RAMAN_RULES,
  type RamanWindow,
  SILICON_LINE_CM1,
  SILICON_MODE,
  SILICON_WINDOW,
} from './raman-rules';
import { fitSpectrumWindow } from './spectrum-fit';

export interface RamanOptions {
  readonly material: FlakeMaterialId;
  /** Excitation wavelength; some rules (WS2's 2LA/A1g ratio) depend on it. */
  readonly laserNm?: number;
}

/** Fewest points of a Raman spectrum analysed. */
export const RAMAN_MIN_POINTS = 20;

interface FittedWindow {
  readonly window: SpectrumWindowFit;
  readonly peaks: FittedPeak[];
}

/** Names the tallest unnamed peak inside each mode's range after that mode. */
function labelPeaks(peaks: FittedPeak[], modes: readonly ModeSpec[]): FittedPeak[] {
  const labelled = [...peaks];
  for (const mode of modes) {
    let best = -1;
    labelled.forEach((peak, i) => {
      if (peak.label !== null || peak.centre < mode.from || peak.centre > mode.to) return;
      if (best < 0 || peak.height > labelled[best].height) best = i;
    });
    if (best >= 0) labelled[best] = { ...labelled[best], label: mode.label };
  }
  return labelled;
}

function fitWindow(data: XYData, spec: RamanWindow): FittedWindow | null {
  const fitted = fitSpectrumWindow(data.x, data.y, {
    fromX: spec.fromX,
    toX: spec.toX,
    minFwhm: spec.minFwhm,
    maxFwhm: spec.maxFwhm,
    maxPeaks: spec.maxPeaks,
  });
  if (!fitted) return null;
  return { window: fitted.window, peaks: fitted.peaks.map((peak) => ({ label: null, ...peak })) };
}

export function analyzeRaman(data: XYData, options: RamanOptions): RamanAnalysis {
  checkXY(data, RAMAN_MIN_POINTS, 'Raman spectrum');
  const rule = RAMAN_RULES[options.material];
  if (!rule) throw new AnalysisInputError(`Flakeline has no Raman rule for “${options.material}”.`);
  const notes: string[] = [];
  const windows: SpectrumWindowFit[] = [];
  const peaks: FittedPeak[] = [];
  const windowOf = new Map<string, { noise: number; rmsResidual: number }>();

  for (const spec of rule.windows) {
    const fitted = fitWindow(data, spec);
    if (!fitted) {
      notes.push(`The spectrum does not cover ${spec.fromX}–${spec.toX} cm⁻¹, which the ${options.material} rule needs.`);
      continue;
    }
    const labelled = labelPeaks(fitted.peaks, rule.modes);
    for (const peak of labelled) if (peak.label) windowOf.set(peak.label, fitted.window);
    windows.push(fitted.window);
    peaks.push(...labelled);
  }

  const quantities: DerivedQuantity[] = [];
  let siCorrection: number | null = null;
  const silicon = fitWindow(data, SILICON_WINDOW);
  const siPeak = silicon
    ? labelPeaks(silicon.peaks, [SILICON_MODE]).find((peak) => peak.label === SILICON_MODE.label)
    : undefined;
  if (silicon && siPeak) {
    windows.push(silicon.window);
    peaks.push(siPeak);
    quantities.push({ key: 'position_si', label: 'Si line position', value: siPeak.centre, unit: 'cm⁻¹' });
    const correction = SILICON_LINE_CM1 - siPeak.centre;
    if (Math.abs(correction) <= MAX_SILICON_CORRECTION_CM1) siCorrection = correction;
    else
      notes.push(
        `The silicon line sits at ${siPeak.centre.toFixed(1)} cm⁻¹, too far from ${SILICON_LINE_CM1} to use it to correct the axis.`,
      );
  }

  const modes = new Map<string, FittedPeak>();
  for (const peak of peaks) if (peak.label) modes.set(peak.label, peak);
  const verdict = rule.judge({ modes, windowOf, siCorrection, laserNm: options.laserNm ?? null });

  return {
    material: options.material,
    laserNm: options.laserNm ?? null,
    xUnit: 'cm-1',
    windows,
    peaks: peaks.sort((a, b) => a.centre - b.centre),
    quantities: [...verdict.quantities, ...quantities],
    estimate: verdict.estimate,
    references: [...rule.references],
    notes: [...verdict.notes, ...notes],
  };
}
