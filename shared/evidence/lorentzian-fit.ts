/**
 * Least-squares fit of a sum of Lorentzians on a polynomial background by Levenberg–Marquardt
 * with the analytic Jacobian. The background is fitted together with the peaks because over a
 * window of a few peak widths a Lorentzian's long wings and a smooth background trade off: a
 * background fixed beforehand swallows part of the wings and narrows the peaks.
 *
 * One peak is L(x) = h / (1 + u²) with u = 2(x − x₀)/w: centre x₀, full width at half maximum w,
 * height h, area πhw/2. Its derivatives, with D = (1 + u²)²:
 *   ∂L/∂h  = 1/(1 + u²)
 *   ∂L/∂x₀ = 4hu / (wD)
 *   ∂L/∂w  = 2hu² / (wD)
 * The background is Σ bⱼtʲ with t = (x − xCentre)/xHalfSpan, so ∂/∂bⱼ = tʲ.
 *
 * The step solves (JᵀJ + λ·diag(JᵀJ))δ = Jᵀr (Marquardt's scaling; Marquardt, J. SIAM 11, 431,
 * 1963, from memory); λ falls tenfold after a step that lowers the residual and rises tenfold
 * after one that does not. Centres are kept inside the data and widths inside given bounds by
 * clamping each step. Standard errors come from the covariance s²(JᵀJ)⁻¹, s² = RSS/(n − p).
 */
import { inverseDiagonal, solveSymmetric } from './linear-algebra';

export interface PeakParameters {
  readonly centre: number;
  readonly fwhm: number;
  readonly height: number;
}

export interface FittedLorentzian extends PeakParameters {
  readonly area: number;
  readonly stdErr?: { readonly centre: number; readonly fwhm: number; readonly height: number };
}

/** Background polynomial Σ coefficients[j]·tʲ, t = (x − xCentre)/xHalfSpan. */
export interface BackgroundPolynomial {
  readonly xCentre: number;
  readonly xHalfSpan: number;
  readonly coefficients: readonly number[];
}

export interface LorentzianFitOptions {
  /** Narrowest and widest widths allowed, in x units. */
  readonly minFwhm?: number;
  readonly maxFwhm?: number;
  /**
   * Starting background; its degree is the number of coefficients minus one. Default: a constant
   * 0 over the data's range. An empty coefficient list fits no background at all.
   */
  readonly background?: BackgroundPolynomial;
  readonly maxIterations?: number;
}

export interface LorentzianFitResult {
  readonly peaks: FittedLorentzian[];
  readonly background: BackgroundPolynomial;
  readonly residualSumOfSquares: number;
  readonly rmsResidual: number;
  readonly iterations: number;
  readonly converged: boolean;
}

const DEFAULT_MAX_ITERATIONS = 200;
/** Relative drop of the residual below which the fit counts as converged. */
const RELATIVE_TOLERANCE = 1e-10;
const MAX_DAMPING = 1e16;

export function lorentzian(x: number, centre: number, fwhm: number, height: number): number {
  const u = (2 * (x - centre)) / fwhm;
  return height / (1 + u * u);
}

export function lorentzianArea(fwhm: number, height: number): number {
  return (Math.PI * height * fwhm) / 2;
}

/** The fit's problem: data, the background basis tʲ at every point, and the parameter layout. */
interface Problem {
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  readonly peakCount: number;
  /** Background coefficients follow the 3 peak parameters of each peak. */
  readonly backgroundTerms: number;
  /** powers[i * backgroundTerms + j] = tᵢʲ. */
  readonly powers: Float64Array;
}

function modelAt(problem: Problem, parameters: Float64Array, i: number): number {
  const { peakCount, backgroundTerms, powers } = problem;
  let model = 0;
  for (let j = 0; j < backgroundTerms; j += 1) model += parameters[3 * peakCount + j] * powers[i * backgroundTerms + j];
  for (let k = 0; k < peakCount; k += 1) {
    model += lorentzian(problem.x[i], parameters[3 * k], parameters[3 * k + 1], parameters[3 * k + 2]);
  }
  return model;
}

function residualSumOfSquares(problem: Problem, parameters: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < problem.x.length; i += 1) {
    const residual = problem.y[i] - modelAt(problem, parameters, i);
    sum += residual * residual;
  }
  return sum;
}

/** JᵀJ and Jᵀr at the parameters. */
function normalEquations(problem: Problem, parameters: Float64Array): { jtj: number[][]; jtr: number[] } {
  const { x, y, peakCount, backgroundTerms, powers } = problem;
  const free = 3 * peakCount + backgroundTerms;
  const jtj = Array.from({ length: free }, () => new Array<number>(free).fill(0));
  const jtr = new Array<number>(free).fill(0);
  const row = new Float64Array(free);
  for (let i = 0; i < x.length; i += 1) {
    let model = 0;
    for (let k = 0; k < peakCount; k += 1) {
      const centre = parameters[3 * k];
      const fwhm = parameters[3 * k + 1];
      const height = parameters[3 * k + 2];
      const u = (2 * (x[i] - centre)) / fwhm;
      const shape = 1 / (1 + u * u);
      const common = (height * shape * shape) / fwhm;
      model += height * shape;
      row[3 * k] = 4 * u * common;
      row[3 * k + 1] = 2 * u * u * common;
      row[3 * k + 2] = shape;
    }
    for (let j = 0; j < backgroundTerms; j += 1) {
      const power = powers[i * backgroundTerms + j];
      row[3 * peakCount + j] = power;
      model += parameters[3 * peakCount + j] * power;
    }
    const residual = y[i] - model;
    for (let a = 0; a < free; a += 1) {
      const ra = row[a];
      if (ra === 0) continue;
      jtr[a] += ra * residual;
      const target = jtj[a];
      for (let b = 0; b <= a; b += 1) target[b] += ra * row[b];
    }
  }
  for (let a = 0; a < free; a += 1) for (let b = 0; b < a; b += 1) jtj[b][a] = jtj[a][b];
  return { jtj, jtr };
}

/**
 * Fits Lorentzians starting from `guesses` (one per peak) to data (x ascending). Throws
 * RangeError when there are fewer points than parameters.
 */
export function fitLorentzians(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  guesses: readonly PeakParameters[],
  options: LorentzianFitOptions = {},
): LorentzianFitResult {
  const n = x.length;
  const peakCount = guesses.length;
  const span = Math.abs(x[n - 1] - x[0]);
  const startBackground: BackgroundPolynomial = options.background ?? {
    xCentre: (x[0] + x[n - 1]) / 2,
    xHalfSpan: span / 2 || 1,
    coefficients: [0],
  };
  const backgroundTerms = startBackground.coefficients.length;
  const free = 3 * peakCount + backgroundTerms;
  if (n <= free) throw new RangeError(`Fitting ${peakCount} peaks and the background needs more than ${free} points, got ${n}`);
  const powers = new Float64Array(n * backgroundTerms);
  for (let i = 0; i < n; i += 1) {
    const t = (x[i] - startBackground.xCentre) / startBackground.xHalfSpan;
    let value = 1;
    for (let j = 0; j < backgroundTerms; j += 1) {
      powers[i * backgroundTerms + j] = value;
      value *= t;
    }
  }
  const problem: Problem = { x, y, peakCount, backgroundTerms, powers };
  const minFwhm = options.minFwhm ?? span / n;
  const maxFwhm = options.maxFwhm ?? span;
  const low = Math.min(x[0], x[n - 1]);
  const high = Math.max(x[0], x[n - 1]);
  const clamp = (parameters: Float64Array) => {
    for (let k = 0; k < peakCount; k += 1) {
      parameters[3 * k] = Math.min(high, Math.max(low, parameters[3 * k]));
      parameters[3 * k + 1] = Math.min(maxFwhm, Math.max(minFwhm, parameters[3 * k + 1]));
    }
  };

  let parameters = new Float64Array(free);
  guesses.forEach((guess, k) => {
    parameters[3 * k] = guess.centre;
    parameters[3 * k + 1] = guess.fwhm;
    parameters[3 * k + 2] = guess.height;
  });
  startBackground.coefficients.forEach((value, j) => {
    parameters[3 * peakCount + j] = value;
  });
  clamp(parameters);
  let cost = residualSumOfSquares(problem, parameters);
  let damping = 1e-3;
  let iterations = 0;
  let converged = false;
  const maxIterations = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;

  while (iterations < maxIterations && !converged) {
    iterations += 1;
    const { jtj, jtr } = normalEquations(problem, parameters);
    let improved = false;
    while (!improved) {
      const damped = jtj.map((row, a) => row.map((value, b) => (a === b ? value + damping * Math.max(value, 1e-300) : value)));
      const step = solveSymmetric(damped, jtr);
      if (step) {
        const trial = Float64Array.from(parameters);
        for (let a = 0; a < free; a += 1) trial[a] += step[a];
        clamp(trial);
        const trialCost = residualSumOfSquares(problem, trial);
        if (trialCost < cost) {
          converged = cost - trialCost <= RELATIVE_TOLERANCE * cost;
          parameters = trial;
          cost = trialCost;
          damping = Math.max(damping / 10, 1e-12);
          improved = true;
          continue;
        }
      }
      damping *= 10;
      if (damping > MAX_DAMPING) {
        // No step in any direction lowers the residual: a minimum to working precision.
        converged = true;
        break;
      }
    }
  }

  const { jtj } = normalEquations(problem, parameters);
  const variance = cost / (n - free);
  const inverse = inverseDiagonal(jtj);
  const peaks: FittedLorentzian[] = [];
  for (let k = 0; k < peakCount; k += 1) {
    const centre = parameters[3 * k];
    const fwhm = parameters[3 * k + 1];
    const height = parameters[3 * k + 2];
    const peak: FittedLorentzian = { centre, fwhm, height, area: lorentzianArea(fwhm, height) };
    peaks.push(
      inverse
        ? {
            ...peak,
            stdErr: {
              centre: Math.sqrt(variance * inverse[3 * k]),
              fwhm: Math.sqrt(variance * inverse[3 * k + 1]),
              height: Math.sqrt(variance * inverse[3 * k + 2]),
            },
          }
        : peak,
    );
  }
  return {
    peaks,
    background: { ...startBackground, coefficients: Array.from(parameters.subarray(3 * peakCount)) },
    residualSumOfSquares: cost,
    rmsResidual: Math.sqrt(cost / n),
    iterations,
    converged,
  };
}
