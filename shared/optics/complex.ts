/**
 * A minimal complex-number toolkit for the thin-film optics in this folder. Values are plain
 * immutable records so they serialise and compare easily; every operation returns a new value.
 *
 * Sign convention used throughout `shared/optics` (stated once here, relied on everywhere):
 * fields vary in time as exp(+iωt), so a wave travelling in +z goes as exp(i(ωt − 2πNz/λ)) and
 * the complex refractive index is N = n − ik with k ≥ 0 for an absorbing medium. The wave then
 * decays as exp(−2πkz/λ), and crossing a layer of thickness d multiplies it by exp(−iδ) with
 * δ = 2πNd/λ. This is the convention of Macleod, *Thin-Film Optical Filters*, ch. 2 (from memory);
 * Born & Wolf use exp(−iωt) and n + ik, which gives the complex conjugate amplitudes and the same
 * reflectance.
 */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

export function complex(re: number, im = 0): Complex {
  return { re, im };
}

/** The complex refractive index n − ik of the convention above, from the tabulated n and k. */
export function refractiveIndex(n: number, k = 0): Complex {
  // Written so a transparent medium gets +0, not −0, as its imaginary part.
  return { re: n, im: k === 0 ? 0 : -k };
}

export const ZERO: Complex = complex(0, 0);
export const ONE: Complex = complex(1, 0);
export const I: Complex = complex(0, 1);

export function add(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

export function sub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

export function mul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/** Multiplies by a real number. */
export function scale(a: Complex, factor: number): Complex {
  return { re: a.re * factor, im: a.im * factor };
}

/**
 * a / b. Smith's algorithm (R. L. Smith, Commun. ACM 5, 435, 1962, from memory) avoids overflow and keeps full
 * precision when |b.re| and |b.im| differ by many orders of magnitude.
 */
export function div(a: Complex, b: Complex): Complex {
  if (b.re === 0 && b.im === 0) throw new RangeError('Complex division by zero');
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const ratio = b.im / b.re;
    const denominator = b.re + b.im * ratio;
    return { re: (a.re + a.im * ratio) / denominator, im: (a.im - a.re * ratio) / denominator };
  }
  const ratio = b.re / b.im;
  const denominator = b.re * ratio + b.im;
  return { re: (a.re * ratio + a.im) / denominator, im: (a.im * ratio - a.re) / denominator };
}

export function neg(a: Complex): Complex {
  return { re: -a.re, im: -a.im };
}

export function conj(a: Complex): Complex {
  return { re: a.re, im: -a.im };
}

/** |a|², the quantity reflectance and transmittance need; cheaper and exacter than abs(a)². */
export function abs2(a: Complex): number {
  return a.re * a.re + a.im * a.im;
}

export function abs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/** e^a = e^re (cos im + i sin im). */
export function exp(a: Complex): Complex {
  const magnitude = Math.exp(a.re);
  return { re: magnitude * Math.cos(a.im), im: magnitude * Math.sin(a.im) };
}

/** cos a = cos re cosh im − i sin re sinh im. */
export function cos(a: Complex): Complex {
  return { re: Math.cos(a.re) * Math.cosh(a.im), im: -Math.sin(a.re) * Math.sinh(a.im) };
}

/** sin a = sin re cosh im + i cos re sinh im. */
export function sin(a: Complex): Complex {
  return { re: Math.sin(a.re) * Math.cosh(a.im), im: Math.cos(a.re) * Math.sinh(a.im) };
}

/** Principal square root (non-negative real part), used for the quarter-wave test index √n_s. */
export function sqrt(a: Complex): Complex {
  const magnitude = abs(a);
  const re = Math.sqrt((magnitude + a.re) / 2);
  const im = Math.sqrt((magnitude - a.re) / 2);
  return { re, im: a.im < 0 ? -im : im };
}

export function isClose(a: Complex, b: Complex, tolerance: number): boolean {
  return abs(sub(a, b)) <= tolerance;
}
