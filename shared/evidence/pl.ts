/**
 * Photoluminescence: fit the peaks against photon energy, find the A exciton, compare it with the
 * monolayer value of the material, look for the lower-energy emission of an indirect gap (which
 * appears from two layers on), and compare the intensity with a reference monolayer when one was
 * measured the same way.
 */
import { type FlakeMaterialId } from '../optics/materials';
import { type PlAnalysis, type PlPeak, type RuleReference } from '../schemas/evidence-analysis';
import { checkXY, type XYData } from './errors';
import { layerEstimate, lowerBoundEstimate } from './layer-estimate';
import { type FittedLorentzian } from './lorentzian-fit';
import { fitSpectrumWindow } from './spectrum-fit';

/**
 * hc in eV·nm: 1239.84198 from the CODATA values of h, c and e (computed from published inputs),
 * rounded to the 1239.84 used in E[eV] = 1239.84/λ[nm].
 */
export const HC_EV_NM = 1239.84;

export function nmToEv(wavelengthNm: number): number {
  if (!(wavelengthNm > 0)) throw new RangeError(`A wavelength must be positive, got ${wavelengthNm}`);
  return HC_EV_NM / wavelengthNm;
}

export function evToNm(energyEv: number): number {
  if (!(energyEv > 0)) throw new RangeError(`A photon energy must be positive, got ${energyEv}`);
  return HC_EV_NM / energyEv;
}

export interface PlOptions {
  readonly material: FlakeMaterialId;
  /** Unit of x: wavelength in nm or photon energy in eV. */
  readonly xUnit: 'nm' | 'eV';
  /** A-exciton peak height of a reference monolayer measured with the same settings. */
  readonly referenceIntensity?: number;
}

interface ExcitonReference {
  readonly energyEv: number;
  readonly reference: RuleReference;
}

/** Monolayer A-exciton emission energies at room temperature. */
export const MONOLAYER_A_EXCITON: Readonly<Partial<Record<FlakeMaterialId, ExcitonReference>>> = {
  MoS2: {
    energyEv: 1.88,
    reference: {
      text: 'Monolayer MoS₂ A exciton ≈ 1.88–1.90 eV.',
      source: 'K. F. Mak et al., Phys. Rev. Lett. 105, 136805 (2010); A. Splendiani et al., Nano Lett. 10, 1271 (2010)',
      mark: 'from_memory',
    },
  },
  WS2: {
    energyEv: 2.0,
    reference: {
      text: 'Monolayer WS₂ A exciton ≈ 2.0 eV.',
      source: 'Value widely reported for exfoliated monolayers',
      mark: 'from_memory',
    },
  },
  WSe2: {
    energyEv: 1.65,
    reference: {
      text: 'Monolayer WSe₂ A exciton ≈ 1.65 eV.',
      source: 'P. Tonndorf et al., Opt. Express 21, 4908 (2013)',
      mark: 'from_memory',
    },
  },
  MoSe2: {
    energyEv: 1.57,
    reference: {
      text: 'Monolayer MoSe₂ A exciton ≈ 1.57 eV.',
      source: 'P. Tonndorf et al., Opt. Express 21, 4908 (2013)',
      mark: 'from_memory',
    },
  },
};

/**
 * Window around the monolayer value accepted as the A exciton: the substrate, strain and doping
 * move it by tens of meV, and the trion sits 30–40 meV below (common practice, from memory).
 */
export const A_EXCITON_TOLERANCE_EV = 0.06;
/**
 * Emission 0.12–0.75 eV below the A exciton and at least 5 % as tall is taken as indirect-gap
 * emission, which appears from two layers on (Mak et al. 2010; Splendiani et al. 2010; the band
 * and the 5 % are common practice, no source).
 */
export const INDIRECT_BAND_BELOW_A_EV = { from: 0.12, to: 0.75 } as const;
export const INDIRECT_MIN_FRACTION = 0.05;
/** Relative intensity to a reference monolayer: ≥ 0.5 supports one layer, < 0.2 two or more (common practice, no source). */
export const MONOLAYER_MIN_RELATIVE_INTENSITY = 0.5;
export const MULTILAYER_MAX_RELATIVE_INTENSITY = 0.2;

const PL_RULE_REFERENCES: RuleReference[] = [
  {
    text: `A exciton within ±${A_EXCITON_TOLERANCE_EV * 1000} meV of the monolayer value; emission ${INDIRECT_BAND_BELOW_A_EV.from}–${INDIRECT_BAND_BELOW_A_EV.to} eV below it and ≥ ${INDIRECT_MIN_FRACTION * 100} % as tall read as an indirect gap (2+ layers); intensity ≥ ${MONOLAYER_MIN_RELATIVE_INTENSITY} of a reference monolayer supports 1, below ${MULTILAYER_MAX_RELATIVE_INTENSITY} means 2+.`,
    source: 'Thresholds in common use',
    mark: 'common_practice',
  },
];

/** Fewest points of a PL spectrum analysed. */
export const PL_MIN_POINTS = 20;
/** Room-temperature PL peaks are tens of meV wide (common practice, no source). */
const MIN_FWHM_EV = 0.008;
const MAX_FWHM_EV = 0.6;

function round(value: number, digits: number): number {
  return Number(value.toFixed(digits));
}

function toPlPeak(peak: FittedLorentzian, label: string | null): PlPeak {
  return { label, ...peak, energyEv: peak.centre, wavelengthNm: evToNm(peak.centre) };
}

/** The spectrum on an ascending energy axis. */
function onEnergyAxis(data: XYData, xUnit: 'nm' | 'eV'): { x: number[]; y: number[] } {
  if (xUnit === 'eV') return { x: [...data.x], y: [...data.y] };
  const x = data.x.map(nmToEv).reverse();
  const y = [...data.y].reverse();
  return { x, y };
}

export function analyzePl(data: XYData, options: PlOptions): PlAnalysis {
  checkXY(data, PL_MIN_POINTS, 'PL spectrum');
  if (data.x[0] <= 0) throw new RangeError('Wavelengths and energies must be positive.');
  const energy = onEnergyAxis(data, options.xUnit);
  const notes: string[] = [];
  if (options.xUnit === 'nm') {
    notes.push(
      'Intensities are used per wavelength interval as recorded (not rescaled to per energy interval); for peaks tens of meV wide this moves them by well under a meV.',
    );
  }
  const fitted = fitSpectrumWindow(energy.x, energy.y, {
    fromX: energy.x[0],
    toX: energy.x[energy.x.length - 1],
    baselineDegree: 1,
    minFwhm: MIN_FWHM_EV,
    maxFwhm: MAX_FWHM_EV,
    maxPeaks: 6,
  });
  const exciton = MONOLAYER_A_EXCITON[options.material];
  const referenceIntensity = options.referenceIntensity ?? null;
  const base = {
    material: options.material,
    xUnit: options.xUnit,
    windows: fitted ? [fitted.window] : [],
    monolayerAExcitonEv: exciton?.energyEv ?? null,
    toleranceEv: exciton ? A_EXCITON_TOLERANCE_EV : null,
    referenceIntensity,
    references: exciton ? [exciton.reference, ...PL_RULE_REFERENCES] : [],
  };
  const raw = fitted?.peaks ?? [];
  const aIndex = exciton
    ? raw.findIndex((peak) => Math.abs(peak.centre - exciton.energyEv) <= A_EXCITON_TOLERANCE_EV) // peaks come tallest first
    : -1;
  const peaks = raw.map((peak, i) => toPlPeak(peak, i === aIndex ? 'A exciton' : null));
  const none = { aExciton: null, shiftMeV: null, relativeIntensity: null, estimate: null };

  if (!exciton) {
    const why = options.material === 'graphene' ? 'graphene has no band gap' : 'its band gap lies in the deep ultraviolet';
    return { ...base, ...none, peaks, notes: [...notes, `PL gives no layer count for ${options.material}: ${why}.`] };
  }
  if (peaks.length === 0) return { ...base, ...none, peaks, notes: [...notes, 'No PL peak stands out of the noise.'] };
  if (aIndex < 0) {
    const strongest = peaks[0];
    return {
      ...base,
      ...none,
      peaks,
      notes: [
        ...notes,
        `No peak within ±${A_EXCITON_TOLERANCE_EV * 1000} meV of the monolayer A exciton (${exciton.energyEv} eV); the strongest is at ${round(strongest.energyEv, 3)} eV (${round(strongest.wavelengthNm, 1)} nm).`,
      ],
    };
  }

  const a = peaks[aIndex];
  const shiftMeV = (a.energyEv - exciton.energyEv) * 1000;
  const relativeIntensity = referenceIntensity ? a.height / referenceIntensity : null;
  const indirect = peaks.filter((peak) => {
    const below = a.energyEv - peak.energyEv;
    return (
      below >= INDIRECT_BAND_BELOW_A_EV.from &&
      below <= INDIRECT_BAND_BELOW_A_EV.to &&
      peak.height >= INDIRECT_MIN_FRACTION * a.height
    );
  });
  const seen = `A exciton at ${round(a.energyEv, 3)} eV (${round(a.wavelengthNm, 1)} nm), ${round(shiftMeV, 0)} meV from the monolayer ${exciton.energyEv} eV`;
  const relative = relativeIntensity === null ? '' : `, ${round(relativeIntensity, 2)} × the reference intensity`;

  let estimate;
  if (indirect.length > 0) {
    const strongest = indirect.reduce((best, peak) => (peak.height > best.height ? peak : best));
    indirect.forEach((peak) => {
      const i = peaks.indexOf(peak);
      peaks[i] = { ...peak, label: 'indirect gap' };
    });
    estimate = lowerBoundEstimate(
      'pl',
      2,
      0,
      `${seen}; emission at ${round(strongest.energyEv, 3)} eV (${round((100 * strongest.height) / a.height, 0)} % of A) from an indirect gap, which a monolayer does not have.`,
    );
  } else if (relativeIntensity !== null && relativeIntensity < MULTILAYER_MAX_RELATIVE_INTENSITY) {
    estimate = lowerBoundEstimate('pl', 2, 0, `${seen}${relative}: far weaker than a monolayer's emission.`);
  } else if (relativeIntensity !== null && relativeIntensity >= MONOLAYER_MIN_RELATIVE_INTENSITY) {
    estimate = layerEstimate('pl', 1, 0, `${seen}${relative}, and no indirect-gap emission: a monolayer.`);
  } else {
    const why =
      relativeIntensity === null ? 'no reference intensity to compare with' : 'intensity between monolayer and multilayer levels';
    estimate = layerEstimate('pl', 1, 1, `${seen}${relative}, no indirect-gap emission; ${why}, so ±1 layer.`);
  }
  return { ...base, peaks, aExciton: peaks[aIndex], shiftMeV, relativeIntensity, estimate, notes };
}
