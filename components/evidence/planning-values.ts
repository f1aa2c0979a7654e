import {
  contrastSpectrum,
  contrastUnder,
  predictionDatasets,
  type SpectrumPoint,
  type Substrate,
} from '@/shared/optics/contrast';
import type { DatasetInfo, FlakeMaterialId } from '@/shared/optics/materials';
import { contrastMap, DEFAULT_OXIDE_THICKNESSES_NM, type ContrastMap } from '@/shared/optics/planning';

export type PlanningSubstrateKind = Substrate['kind'];

/** A green band-pass filter is usually centred near 550 nm, where eyes and cameras are keenest (common practice, no source). */
export const GREEN_FILTER_NM = 550;
/** White light as the camera sees it: flat over 400–700 nm, the span of `RGB_BANDS` in contrast.ts. */
export const WHITE_LIGHT = { kind: 'band', fromNm: 400, toNm: 700 } as const;

export interface BestOxide {
  oxideThicknessNm: number;
  /** Predicted monolayer contrast there (positive = flake darker than the bare oxide). */
  contrast: number;
}

export interface OxidePlan {
  kind: 'oxide-on-silicon';
  map: ContrastMap;
  /** The oxide that makes the monolayer stand out most under white light and under a green filter. */
  whiteLight: BestOxide;
  green: BestOxide;
  datasets: readonly DatasetInfo[];
}

export interface TransparentPlan {
  kind: 'sapphire' | 'quartz';
  spectrum: SpectrumPoint[];
  whiteLightContrast: number;
  /** The wavelength where the monolayer stands out most. */
  best: SpectrumPoint;
  datasets: readonly DatasetInfo[];
}

export type ContrastPlan = OxidePlan | TransparentPlan;

/** The point of largest |value|: a flake much brighter than the substrate is as easy to find as a much darker one. */
function strongest<T>(items: readonly T[], value: (item: T) => number): T {
  return items.reduce((best, item) => (Math.abs(value(item)) > Math.abs(value(best)) ? item : best));
}

export function planOnOxide(material: FlakeMaterialId): OxidePlan {
  const map = contrastMap({ material });
  const greenColumn = map.wavelengthsNm.indexOf(GREEN_FILTER_NM);
  const green = strongest(
    map.oxideThicknessesNm.map((oxideThicknessNm, i) => ({ oxideThicknessNm, contrast: map.contrast[i][greenColumn] })),
    (item) => item.contrast,
  );
  const whiteLight = strongest(
    DEFAULT_OXIDE_THICKNESSES_NM.map((oxideThicknessNm) => ({
      oxideThicknessNm,
      contrast: contrastUnder({ material, layers: 1, substrate: { kind: 'oxide-on-silicon', oxideThicknessNm } }, WHITE_LIGHT),
    })),
    (item) => item.contrast,
  );
  return { kind: 'oxide-on-silicon', map, whiteLight, green, datasets: map.datasets };
}

export function planOnTransparent(material: FlakeMaterialId, kind: 'sapphire' | 'quartz'): TransparentPlan {
  const substrate: Substrate = { kind };
  const flake = { material, layers: 1, substrate };
  const spectrum = contrastSpectrum(flake);
  return {
    kind,
    spectrum,
    whiteLightContrast: contrastUnder(flake, WHITE_LIGHT),
    best: strongest(spectrum, (point) => point.contrast),
    datasets: predictionDatasets(material, substrate),
  };
}

export function contrastPlan(material: FlakeMaterialId, kind: PlanningSubstrateKind): ContrastPlan {
  return kind === 'oxide-on-silicon' ? planOnOxide(material) : planOnTransparent(material, kind);
}

/** "8.1 % darker" / "3.0 % brighter": the sign convention of contrast.ts in words. */
export function describeContrast(contrast: number): string {
  const percent = Math.abs(contrast * 100).toFixed(1);
  return contrast >= 0 ? `${percent} % darker than the substrate` : `${percent} % brighter than the substrate`;
}
