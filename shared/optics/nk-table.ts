/**
 * Tabulated optical constants sampled on an even wavelength grid (the generated files in
 * `data/`), and linear interpolation between the samples.
 */
import { type Complex, refractiveIndex } from './complex';

export interface NkTable {
  /** Short dataset name shown to users, e.g. "Si-Green-2008". */
  readonly id: string;
  readonly citation: string;
  readonly doi: string;
  readonly startNm: number;
  readonly stepNm: number;
  /** [wavelength in nm, n, k], evenly spaced from `startNm` in steps of `stepNm`. */
  readonly rows: readonly (readonly [number, number, number])[];
}

export function tableRangeNm(table: NkTable): { fromNm: number; toNm: number } {
  return { fromNm: table.startNm, toNm: table.startNm + table.stepNm * (table.rows.length - 1) };
}

/**
 * N = n − ik at `wavelengthNm`, linearly interpolated between the two neighbouring samples.
 * Outside the table it throws rather than extrapolate: the measured data stop there.
 */
export function interpolateNk(table: NkTable, wavelengthNm: number): Complex {
  const { fromNm, toNm } = tableRangeNm(table);
  if (!(wavelengthNm >= fromNm && wavelengthNm <= toNm)) {
    throw new RangeError(`${table.id} covers ${fromNm}–${toNm} nm; ${wavelengthNm} nm is outside it`);
  }
  const position = (wavelengthNm - table.startNm) / table.stepNm;
  const lower = Math.min(Math.floor(position), table.rows.length - 2);
  const fraction = position - lower;
  const [, n0, k0] = table.rows[lower];
  const [, n1, k1] = table.rows[lower + 1];
  return refractiveIndex(n0 + fraction * (n1 - n0), k0 + fraction * (k1 - k0));
}
