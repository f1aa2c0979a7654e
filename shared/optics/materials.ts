/**
 * Optical constants of the flakes and substrates Flakeline models, each tied to the published
 * dataset it comes from so a prediction can say which numbers it used. The reference files
 * (refractiveindex.info, CC0) are not read at run time: tabulated data were sampled once into
 * `data/*.ts`, and the dispersion formulas are written out here with their coefficients.
 *
 * All indices follow the N = n − ik convention of `complex.ts`.
 */
import { type Complex, refractiveIndex } from './complex';
import { GRAPHENE_WEBER_2010 } from './data/graphene-weber-2010';
import { MOS2_HSU_2019_1L } from './data/mos2-hsu-2019-1l';
import { MOSE2_HSU_2019_1L } from './data/mose2-hsu-2019-1l';
import { SI_GREEN_2008 } from './data/si-green-2008';
import { WS2_HSU_2019_1L } from './data/ws2-hsu-2019-1l';
import { WSE2_HSU_2019_1L } from './data/wse2-hsu-2019-1l';
import { interpolateNk, type NkTable, tableRangeNm } from './nk-table';

/** Where a material's optical constants come from, in a form the UI can show as it is. */
export interface DatasetInfo {
  readonly id: string;
  readonly citation: string;
  /** Absent when the source has no DOI (a conference abstract, a handbook). */
  readonly doi?: string;
  readonly kind: 'table' | 'formula';
  /** Wavelengths the product will evaluate the dataset at. */
  readonly fromNm: number;
  readonly toNm: number;
  /** Caveats a user should see beside a prediction (extrapolation, substitutions). */
  readonly note?: string;
}

export interface OpticalMaterial {
  readonly dataset: DatasetInfo;
  /** Complex refractive index N = n − ik; throws RangeError outside the dataset's range. */
  index(wavelengthNm: number): Complex;
}

// ---------------------------------------------------------------------------------------------
// Sellmeier dispersion formulas

/**
 * One term Bλ²/(λ² − C²) of a Sellmeier formula, λ and C in µm. This is refractiveindex.info's
 * "formula 1": n² − 1 = Σ Bᵢλ²/(λ² − Cᵢ²).
 */
export interface SellmeierTerm {
  readonly b: number;
  readonly cUm: number;
}

export function sellmeierIndex(terms: readonly SellmeierTerm[], wavelengthNm: number): number {
  const lambdaUm = wavelengthNm / 1000;
  const lambda2 = lambdaUm * lambdaUm;
  let nSquaredMinusOne = 0;
  for (const term of terms) nSquaredMinusOne += (term.b * lambda2) / (lambda2 - term.cUm * term.cUm);
  return Math.sqrt(1 + nSquaredMinusOne);
}

/**
 * Fused silica at 20 °C: Malitson, J. Opt. Soc. Am. 55, 1205 (1965); coefficients as listed in the
 * refractiveindex.info file SiO2-Malitson.yml, which takes them from the paper.
 */
export const FUSED_SILICA_MALITSON_1965: readonly SellmeierTerm[] = [
  { b: 0.6961663, cUm: 0.0684043 },
  { b: 0.4079426, cUm: 0.1162414 },
  { b: 0.8974794, cUm: 9.896161 },
];

/**
 * Synthetic sapphire, ordinary ray, 20 °C: Malitson & Dodge, J. Opt. Soc. Am. 62, 1405 (1972);
 * the formula itself is printed in Dodge, Handbook of Laser Science and Technology IV (CRC, 1986).
 * Coefficients as listed in the refractiveindex.info file Al2O3-Malitson-o.yml.
 */
export const SAPPHIRE_ORDINARY_MALITSON_DODGE_1972: readonly SellmeierTerm[] = [
  { b: 1.4313493, cUm: 0.0726631 },
  { b: 0.65054713, cUm: 0.1193242 },
  { b: 5.3414021, cUm: 18.028251 },
];

/**
 * hBN, in-plane (ordinary) index, single-oscillator fit to transmission spectra of ~1 µm flakes:
 * Lee et al., Phys. Status Solidi B 256, 1800417 (2019). Fitted over 450–1200 nm. Coefficients as
 * listed in the refractiveindex.info file BN-Lee.yml.
 */
export const HBN_ORDINARY_LEE_2019: readonly SellmeierTerm[] = [{ b: 3.263, cUm: 0.1644 }];

/** The visible window the generated tables cover and every prediction is made in. */
export const VISIBLE_RANGE_NM = { fromNm: 400, toNm: 750 } as const;

function formulaMaterial(terms: readonly SellmeierTerm[], dataset: DatasetInfo): OpticalMaterial {
  return {
    dataset,
    index(wavelengthNm: number): Complex {
      if (!(wavelengthNm >= dataset.fromNm && wavelengthNm <= dataset.toNm)) {
        throw new RangeError(`${dataset.id} is used for ${dataset.fromNm}–${dataset.toNm} nm; ${wavelengthNm} nm is outside`);
      }
      // These three are transparent in the visible (k = 0): fused silica, sapphire and hBN all
      // have band gaps far in the ultraviolet (fact of the trade, no source).
      return refractiveIndex(sellmeierIndex(terms, wavelengthNm));
    },
  };
}

function tableMaterial(table: NkTable, note?: string): OpticalMaterial {
  const { fromNm, toNm } = tableRangeNm(table);
  return {
    dataset: { id: table.id, citation: table.citation, doi: table.doi, kind: 'table', fromNm, toNm, note },
    index: (wavelengthNm: number) => interpolateNk(table, wavelengthNm),
  };
}

// ---------------------------------------------------------------------------------------------
// Substrate materials

export const SILICON: OpticalMaterial = tableMaterial(SI_GREEN_2008);

export const FUSED_SILICA: OpticalMaterial = formulaMaterial(FUSED_SILICA_MALITSON_1965, {
  id: 'SiO2-Malitson-1965',
  citation: 'I. H. Malitson, J. Opt. Soc. Am. 55, 1205–1208 (1965)',
  doi: '10.1364/JOSA.55.001205',
  kind: 'formula',
  ...VISIBLE_RANGE_NM,
  note: 'Fused silica; also used for thermal oxide on silicon and for "quartz" (fused-quartz) substrates.',
});

export const SAPPHIRE: OpticalMaterial = formulaMaterial(SAPPHIRE_ORDINARY_MALITSON_DODGE_1972, {
  id: 'Al2O3-Malitson-Dodge-1972-o',
  citation:
    'I. H. Malitson, M. J. Dodge, J. Opt. Soc. Am. 62, 1405 (1972); M. J. Dodge, Handbook of Laser Science and Technology IV (1986)',
  kind: 'formula',
  ...VISIBLE_RANGE_NM,
  // At normal incidence on c-plane sapphire light sees only the ordinary index (common practice).
  note: 'Ordinary ray, as seen at normal incidence on c-plane sapphire.',
});

// ---------------------------------------------------------------------------------------------
// Flake materials

export const FLAKE_MATERIAL_IDS = ['graphene', 'hBN', 'MoS2', 'WS2', 'WSe2', 'MoSe2'] as const;
export type FlakeMaterialId = (typeof FLAKE_MATERIAL_IDS)[number];

export interface FlakeMaterial extends OpticalMaterial {
  readonly id: FlakeMaterialId;
  readonly displayName: string;
  /** Thickness of one layer, used as N × this for an N-layer flake. */
  readonly layerThicknessNm: number;
  /** Where the layer thickness comes from, shown beside a prediction. */
  readonly layerThicknessSource: string;
}

/**
 * How an N-layer flake is modelled: one homogeneous film of thickness N × the layer thickness with
 * the monolayer's optical constants. Common practice for contrast estimates (e.g. Blake et al.
 * 2007 for graphene; Benameur et al. 2011 for TMDs) even though TMD constants change a little
 * with thickness (Hsu et al. 2019 measured 1L, 2L, 3L separately).
 */
export const MULTILAYER_MODEL =
  'N layers are modelled as one film N × the monolayer thickness with the monolayer optical constants (common practice for contrast estimates).';

const HSU_NOTE = 'Monolayer constants of Hsu et al. (2019); used for all N.';

export const FLAKE_MATERIALS: Readonly<Record<FlakeMaterialId, FlakeMaterial>> = {
  graphene: {
    id: 'graphene',
    displayName: 'Graphene',
    // Interlayer spacing of graphite (from memory). Weber et al. modelled their flake as 3.4 Å thick
    // when extracting n and k, so 0.335 nm makes the product n·d about 1.5 % smaller than theirs.
    layerThicknessNm: 0.335,
    layerThicknessSource: 'Interlayer spacing of graphite, 0.335 nm (from memory; Weber et al. fitted with 0.34 nm).',
    ...tableMaterial(GRAPHENE_WEBER_2010, 'Exfoliated monolayer graphene on 98 nm SiO2/Si; used for all N.'),
  },
  hBN: {
    id: 'hBN',
    displayName: 'hBN',
    layerThicknessNm: 0.333,
    layerThicknessSource: 'Interlayer spacing of bulk hBN, 0.333 nm (from memory).',
    ...formulaMaterial(HBN_ORDINARY_LEE_2019, {
      id: 'BN-Lee-2019-o',
      citation: 'S. Y. Lee, T. Y. Jeong, S. Jung, K. J. Yee, Phys. Status Solidi B 256, 1800417 (2019)',
      doi: '10.1002/pssb.201800417',
      kind: 'formula',
      ...VISIBLE_RANGE_NM,
      note: 'Bulk in-plane index fitted over 450–1200 nm; 400–450 nm is extrapolated. k = 0 (transparent).',
    }),
  },
  MoS2: {
    id: 'MoS2',
    displayName: 'MoS₂',
    layerThicknessNm: 0.615,
    layerThicknessSource: 'Interlayer spacing of 2H-MoS2, 0.615 nm (from memory).',
    ...tableMaterial(MOS2_HSU_2019_1L, HSU_NOTE),
  },
  WS2: {
    id: 'WS2',
    displayName: 'WS₂',
    layerThicknessNm: 0.618,
    layerThicknessSource: 'Interlayer spacing of 2H-WS2, 0.618 nm (from memory).',
    ...tableMaterial(WS2_HSU_2019_1L, HSU_NOTE),
  },
  WSe2: {
    id: 'WSe2',
    displayName: 'WSe₂',
    layerThicknessNm: 0.649,
    layerThicknessSource: 'Interlayer spacing of 2H-WSe2, 0.649 nm (from memory).',
    ...tableMaterial(WSE2_HSU_2019_1L, HSU_NOTE),
  },
  MoSe2: {
    id: 'MoSe2',
    displayName: 'MoSe₂',
    layerThicknessNm: 0.646,
    layerThicknessSource: 'Interlayer spacing of 2H-MoSe2, 0.646 nm (from memory).',
    ...tableMaterial(MOSE2_HSU_2019_1L, HSU_NOTE),
  },
};

export function isFlakeMaterialId(value: string): value is FlakeMaterialId {
  return (FLAKE_MATERIAL_IDS as readonly string[]).includes(value);
}
