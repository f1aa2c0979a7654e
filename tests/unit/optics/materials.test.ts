import { GRAPHENE_WEBER_2010 } from '../../../shared/optics/data/graphene-weber-2010';
import { MOS2_HSU_2019_1L } from '../../../shared/optics/data/mos2-hsu-2019-1l';
import { MOSE2_HSU_2019_1L } from '../../../shared/optics/data/mose2-hsu-2019-1l';
import { SI_GREEN_2008 } from '../../../shared/optics/data/si-green-2008';
import { WS2_HSU_2019_1L } from '../../../shared/optics/data/ws2-hsu-2019-1l';
import { WSE2_HSU_2019_1L } from '../../../shared/optics/data/wse2-hsu-2019-1l';
import {
  FLAKE_MATERIAL_IDS,
  FLAKE_MATERIALS,
  FUSED_SILICA,
  isFlakeMaterialId,
  SAPPHIRE,
  SILICON,
} from '../../../shared/optics/materials';
import { interpolateNk } from '../../../shared/optics/nk-table';

const n = (wavelengthNm: number) => FUSED_SILICA.index(wavelengthNm).re;

describe("fused silica (Malitson's Sellmeier formula)", () => {
  // Malitson, J. Opt. Soc. Am. 55, 1205 (1965): n_d = 1.4585 at the helium d line, 587.6 nm.
  it('gives n = 1.4585 at 587.6 nm (He d line)', () => {
    expect(Math.abs(n(587.5618) - 1.4585)).toBeLessThan(5e-5);
  });

  // Published n_D of fused silica at the sodium D line, 589.3 nm: 1.4584 (Malitson 1965 and glass
  // makers' datasheets, from memory). Only 1.7 nm from the d line, so it differs from n_d by just
  // ~6e-5; a value of 1.4580 sometimes quoted there would not fit the formula.
  it('gives n ≈ 1.4584 at 589.3 nm (sodium D), 6e-5 below the d-line value', () => {
    expect(Math.abs(n(589.29) - 1.4584)).toBeLessThan(1e-4);
    const drop = n(587.5618) - n(589.29);
    expect(drop).toBeGreaterThan(4e-5);
    expect(drop).toBeLessThan(8e-5);
  });

  // Malitson 1965: n = 1.4570 at the He-Ne laser line, 632.8 nm.
  it('gives n ≈ 1.4570 at 632.8 nm (He-Ne)', () => {
    expect(Math.abs(n(632.8) - 1.457)).toBeLessThan(5e-5);
  });

  // Abbe number ν_d = (n_d − 1)/(n_F − n_C) of fused silica is 67.8 (Corning 7980 and Heraeus
  // Suprasil datasheets, from memory); F = 486.13 nm, C = 656.27 nm hydrogen lines.
  it('has the published Abbe number 67.8', () => {
    const abbe = (n(587.5618) - 1) / (n(486.1327) - n(656.2725));
    expect(abbe).toBeCloseTo(67.8, 1);
  });

  it('is transparent (k = 0)', () => {
    expect(FUSED_SILICA.index(500).im).toBe(0);
  });
});

describe('sapphire (Malitson & Dodge Sellmeier formula, ordinary ray)', () => {
  // Ordinary index of sapphire at 589 nm: n_o = 1.768 (handbook value, from memory).
  it('gives n_o ≈ 1.768 at 589.3 nm', () => {
    expect(Math.abs(SAPPHIRE.index(589.29).re - 1.768)).toBeLessThan(1e-3);
  });
});

describe('hBN (Lee et al. 2019 single-oscillator formula)', () => {
  // In-plane index of bulk hBN in the visible is about 2.1–2.2 (from memory).
  it('gives an in-plane index of about 2.1–2.2 across the visible', () => {
    for (const wavelengthNm of [450, 550, 650, 750]) {
      const index = FLAKE_MATERIALS.hBN.index(wavelengthNm);
      expect(index.re).toBeGreaterThan(2.08);
      expect(index.re).toBeLessThan(2.25);
      expect(index.im).toBe(0);
    }
  });
});

describe('generated tables', () => {
  const tables = [SI_GREEN_2008, GRAPHENE_WEBER_2010, MOS2_HSU_2019_1L, WS2_HSU_2019_1L, WSE2_HSU_2019_1L, MOSE2_HSU_2019_1L];

  it('cover 400–750 nm every 5 nm with non-negative k', () => {
    for (const table of tables) {
      expect(table.rows).toHaveLength(71);
      table.rows.forEach(([wavelengthNm, , k], i) => {
        expect(wavelengthNm).toBe(400 + 5 * i);
        expect(k).toBeGreaterThanOrEqual(0);
      });
    }
  });

  // Green 2008, tabulated at 600 nm: n = 3.940, k = 0.019934 (a grid point, so no interpolation).
  it('reproduce Green 2008 silicon at 600 nm', () => {
    const index = SILICON.index(600);
    expect(index.re).toBeCloseTo(3.94, 4);
    expect(index.im).toBeCloseTo(-0.019934, 6);
  });

  // Weber et al. 2010 graphene, tabulated at 599.008 nm (2.7057, 1.3109) and 600.597 nm
  // (2.7067, 1.3130): n ≈ 2.706, k ≈ 1.312 at 600 nm.
  it('reproduce Weber 2010 graphene near 600 nm', () => {
    const index = FLAKE_MATERIALS.graphene.index(600);
    expect(index.re).toBeCloseTo(2.706, 3);
    expect(index.im).toBeCloseTo(-1.312, 3);
  });

  // Hsu et al. 2019 monolayer MoS2, tabulated at 599.88 nm (4.5924, 1.5257) and 600.11 nm
  // (4.6006, 1.5269): n ≈ 4.597, k ≈ 1.526 at 600 nm.
  it('reproduce Hsu 2019 monolayer MoS2 near 600 nm', () => {
    const index = FLAKE_MATERIALS.MoS2.index(600);
    expect(index.re).toBeCloseTo(4.597, 2);
    expect(index.im).toBeCloseTo(-1.526, 2);
  });

  it('interpolate linearly between samples and refuse to extrapolate', () => {
    const [, n400, k400] = SI_GREEN_2008.rows[0];
    const [, n405, k405] = SI_GREEN_2008.rows[1];
    const midway = interpolateNk(SI_GREEN_2008, 402.5);
    expect(midway.re).toBeCloseTo((n400 + n405) / 2, 12);
    expect(midway.im).toBeCloseTo(-(k400 + k405) / 2, 12);
    expect(() => interpolateNk(SI_GREEN_2008, 399)).toThrow(RangeError);
    expect(() => interpolateNk(SI_GREEN_2008, 751)).toThrow(RangeError);
    expect(() => FUSED_SILICA.index(300)).toThrow(RangeError);
  });
});

describe('flake materials', () => {
  it('name the dataset and layer thickness each one uses', () => {
    for (const id of FLAKE_MATERIAL_IDS) {
      const material = FLAKE_MATERIALS[id];
      expect(material.id).toBe(id);
      expect(material.dataset.id).toMatch(/\S/);
      expect(material.dataset.citation).toMatch(/\(\d{4}\)/);
      expect(material.layerThicknessSource).toMatch(/\S/);
    }
    expect(FLAKE_MATERIALS.graphene.dataset.id).toBe('C-Weber-2010');
    expect(FLAKE_MATERIALS.MoS2.dataset.id).toBe('MoS2-Hsu-2019-1L');
    expect(FLAKE_MATERIALS.hBN.dataset.id).toBe('BN-Lee-2019-o');
  });

  // Layer thicknesses as specified for Flakeline: graphite 0.335 nm, hBN 0.333 nm, and the 2H
  // interlayer spacings of the TMDs (from memory, see materials.ts).
  it.each([
    ['graphene', 0.335],
    ['hBN', 0.333],
    ['MoS2', 0.615],
    ['WS2', 0.618],
    ['WSe2', 0.649],
    ['MoSe2', 0.646],
  ] as const)('%s has a layer thickness of %f nm', (id, thicknessNm) => {
    expect(FLAKE_MATERIALS[id].layerThicknessNm).toBe(thicknessNm);
  });

  it('recognises material ids', () => {
    expect(isFlakeMaterialId('MoS2')).toBe(true);
    expect(isFlakeMaterialId('mos2')).toBe(false);
  });
});
