import { nmToEv } from '@/shared/evidence/pl';
import type { PlAnalysis } from '@/shared/schemas/evidence-analysis';

/**
 * A PL spectrum on the energy axis its peaks were fitted on, as the analysis put it there: a
 * file in nanometres is converted point by point, E[eV] = 1239.84/λ[nm], and reversed, since
 * energy falls as wavelength rises. Intensities are kept as recorded, as the fit kept them.
 */
export function plotPointsOfPl(
  x: readonly number[],
  y: readonly number[],
  unit: PlAnalysis['xUnit'],
): { x: number[]; y: number[] } {
  if (unit === 'eV') return { x: [...x], y: [...y] };
  return { x: x.map(nmToEv).reverse(), y: [...y].reverse() };
}
