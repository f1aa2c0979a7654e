/**
 * Planning helper: which oxide thickness and which wavelength make a flake easiest to see.
 * Evaluates the predicted contrast of a (by default monolayer) flake on SiO2/Si over a grid of
 * oxide thicknesses × wavelengths, ready to draw as a heat map.
 */
import { contrastAt, predictionDatasets, wavelengthGrid } from './contrast';
import { type DatasetInfo, type FlakeMaterialId, VISIBLE_RANGE_NM } from './materials';

export interface ContrastMapQuery {
  readonly material: FlakeMaterialId;
  /** Layer count of the flake; 1 unless given. */
  readonly layers?: number;
  /** Default 0–400 nm every 5 nm. */
  readonly oxideThicknessesNm?: readonly number[];
  /** Default 400–750 nm every 5 nm. */
  readonly wavelengthsNm?: readonly number[];
}

export interface ContrastMapCell {
  readonly oxideThicknessNm: number;
  readonly wavelengthNm: number;
  readonly contrast: number;
}

export interface ContrastMap {
  readonly material: FlakeMaterialId;
  readonly layers: number;
  readonly oxideThicknessesNm: readonly number[];
  readonly wavelengthsNm: readonly number[];
  /** contrast[i][j] is for oxideThicknessesNm[i] and wavelengthsNm[j] (sign as in contrast.ts). */
  readonly contrast: readonly (readonly number[])[];
  /** Cells of the largest positive (flake darker) and most negative (flake brighter) contrast. */
  readonly darkest: ContrastMapCell;
  readonly brightest: ContrastMapCell;
  readonly datasets: readonly DatasetInfo[];
}

export const DEFAULT_OXIDE_THICKNESSES_NM: readonly number[] = wavelengthGrid(0, 400, 5);
export const DEFAULT_MAP_WAVELENGTHS_NM: readonly number[] = wavelengthGrid(VISIBLE_RANGE_NM.fromNm, VISIBLE_RANGE_NM.toNm, 5);

export function contrastMap(query: ContrastMapQuery): ContrastMap {
  const layers = query.layers ?? 1;
  const oxideThicknessesNm = query.oxideThicknessesNm ?? DEFAULT_OXIDE_THICKNESSES_NM;
  const wavelengthsNm = query.wavelengthsNm ?? DEFAULT_MAP_WAVELENGTHS_NM;
  if (oxideThicknessesNm.length === 0 || wavelengthsNm.length === 0) {
    throw new RangeError('A contrast map needs at least one oxide thickness and one wavelength');
  }
  const contrast: number[][] = [];
  let darkest: ContrastMapCell = { oxideThicknessNm: Number.NaN, wavelengthNm: Number.NaN, contrast: -Infinity };
  let brightest: ContrastMapCell = { oxideThicknessNm: Number.NaN, wavelengthNm: Number.NaN, contrast: Infinity };
  for (const oxideThicknessNm of oxideThicknessesNm) {
    const row: number[] = [];
    const flake = { material: query.material, layers, substrate: { kind: 'oxide-on-silicon', oxideThicknessNm } } as const;
    for (const wavelengthNm of wavelengthsNm) {
      const value = contrastAt(flake, wavelengthNm);
      if (value > darkest.contrast) darkest = { oxideThicknessNm, wavelengthNm, contrast: value };
      if (value < brightest.contrast) brightest = { oxideThicknessNm, wavelengthNm, contrast: value };
      row.push(value);
    }
    contrast.push(row);
  }
  return {
    material: query.material,
    layers,
    oxideThicknessesNm: [...oxideThicknessesNm],
    wavelengthsNm: [...wavelengthsNm],
    contrast,
    darkest,
    brightest,
    datasets: predictionDatasets(query.material, { kind: 'oxide-on-silicon', oxideThicknessNm: 0 }),
  };
}
