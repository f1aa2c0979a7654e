/**
 * Normal-incidence reflection from a stack of homogeneous thin layers on a semi-infinite substrate.
 *
 * Method: the characteristic (transfer) matrix of a stratified medium — Born & Wolf, *Principles
 * of Optics*, ch. 1.6 — written in the admittance form of Macleod, *Thin-Film Optical Filters*,
 * ch. 2 (from memory), which uses the same N = n − ik convention as `complex.ts`. At normal
 * incidence a layer's optical admittance (in units of the admittance of free space) equals its
 * complex index N, and its phase thickness is δ = 2πNd/λ. Each layer has the matrix
 *
 *     M = [ cos δ        i sin δ / N ]
 *         [ i N sin δ    cos δ       ]
 *
 * and the stack, read from the ambient side down, gives [B, C]ᵀ = M₁ M₂ … M_q [1, N_s]ᵀ. The stack
 * behaves like a single surface of admittance Y = C / B, so r = (N₀ − Y) / (N₀ + Y) and R = |r|².
 * The power entering the substrate is T = 4 N₀ Re(N_s) / |N₀ B + C|²; whatever is neither
 * reflected nor transmitted is absorbed in the layers, so R + T = 1 when every layer is lossless.
 *
 * Numerical range: cos δ and sin δ grow like e^{|Im δ|}, so very thick, strongly absorbing layers
 * (d ≫ λ / 2πk) would overflow. Flakes here are a few nm thick and oxides are lossless, far from it.
 */
import { abs2, add, type Complex, complex, cos, div, exp, I, mul, ONE, scale, sin, sub } from './complex';

export interface Layer {
  /** Complex refractive index N = n − ik at the wavelength of the calculation. */
  readonly index: Complex;
  readonly thicknessNm: number;
}

export interface StackResponse {
  /** Complex amplitude reflection coefficient, referred to the ambient side of the top surface. */
  readonly r: Complex;
  /** R = |r|². */
  readonly reflectance: number;
  /** Fraction of the incident power that crosses into the substrate. */
  readonly transmittance: number;
}

/** Air, taken as n = 1 (its 1.0003 changes R by well under 0.1 %: common practice, no source). */
export const AIR: Complex = ONE;

/** Phase thickness δ = 2πNd/λ of one layer (complex when the layer absorbs). */
export function phaseThickness(layer: Layer, wavelengthNm: number): Complex {
  return scale(layer.index, (2 * Math.PI * layer.thicknessNm) / wavelengthNm);
}

function checkInputs(wavelengthNm: number, layers: readonly Layer[]): void {
  if (!(wavelengthNm > 0) || !Number.isFinite(wavelengthNm)) {
    throw new RangeError(`Wavelength must be a positive number of nm, got ${wavelengthNm}`);
  }
  for (const layer of layers) {
    if (!(layer.thicknessNm >= 0) || !Number.isFinite(layer.thicknessNm)) {
      throw new RangeError(`Layer thickness must be a non-negative number of nm, got ${layer.thicknessNm}`);
    }
  }
}

/**
 * Reflection and transmission of `layers` (listed from the ambient side down to the substrate)
 * on a semi-infinite `substrateIndex`, at normal incidence, by the characteristic matrix method.
 * With no layers this is the bare Fresnel interface, r = (N₀ − N_s) / (N₀ + N_s).
 */
export function stackResponse(
  wavelengthNm: number,
  layers: readonly Layer[],
  substrateIndex: Complex,
  ambientIndex: Complex = AIR,
): StackResponse {
  checkInputs(wavelengthNm, layers);
  // The transmittance formula and the meaning of "incident power" need a transparent ambient.
  if (ambientIndex.im !== 0 || !(ambientIndex.re > 0)) {
    throw new RangeError('The ambient medium must be transparent (real, positive index)');
  }
  // Multiply from the substrate upwards: [B, C] starts as [1, N_s] and each layer's matrix
  // is applied in turn, which is M₁ … M_q [1, N_s]ᵀ without forming the matrix product.
  let b: Complex = ONE;
  let c: Complex = substrateIndex;
  for (let j = layers.length - 1; j >= 0; j -= 1) {
    const layer = layers[j];
    const delta = phaseThickness(layer, wavelengthNm);
    const cosDelta = cos(delta);
    const iSinDelta = mul(I, sin(delta));
    const nextB = add(mul(cosDelta, b), div(mul(iSinDelta, c), layer.index));
    const nextC = add(mul(mul(iSinDelta, layer.index), b), mul(cosDelta, c));
    b = nextB;
    c = nextC;
  }
  const admittance = div(c, b);
  const r = div(sub(ambientIndex, admittance), add(ambientIndex, admittance));
  const transmittance = (4 * ambientIndex.re * substrateIndex.re) / abs2(add(scale(b, ambientIndex.re), c));
  return { r, reflectance: abs2(r), transmittance };
}

/** Reflectance R = |r|² of a stack; see `stackResponse`. */
export function stackReflectance(
  wavelengthNm: number,
  layers: readonly Layer[],
  substrateIndex: Complex,
  ambientIndex: Complex = AIR,
): number {
  return stackResponse(wavelengthNm, layers, substrateIndex, ambientIndex).reflectance;
}

/** Fresnel amplitude reflection coefficient at normal incidence, going from medium a into b. */
export function interfaceReflection(indexA: Complex, indexB: Complex): Complex {
  return div(sub(indexA, indexB), add(indexA, indexB));
}

/**
 * The single-film (Airy) formula, an independent route to r for one layer, used to check the
 * matrix method: r = (r₀₁ + r₁₂ e^{−2iδ}) / (1 + r₀₁ r₁₂ e^{−2iδ}) with δ = 2πN₁d/λ
 * (Born & Wolf, *Principles of Optics*, ch. 1.6, homogeneous film; Hecht, *Optics*, multiple-beam
 * interference in thin films). The sign of the exponent follows the exp(+iωt) convention.
 */
export function airySingleFilm(wavelengthNm: number, film: Layer, substrateIndex: Complex, ambientIndex: Complex = AIR): Complex {
  // An absorbing ambient is allowed here: the tests nest this formula inside an absorbing film.
  checkInputs(wavelengthNm, [film]);
  const r01 = interfaceReflection(ambientIndex, film.index);
  const r12 = interfaceReflection(film.index, substrateIndex);
  const roundTrip = exp(mul(complex(0, -2), phaseThickness(film, wavelengthNm)));
  const r12Delayed = mul(r12, roundTrip);
  return div(add(r01, r12Delayed), add(ONE, mul(r01, r12Delayed)));
}
