import { levelledProfile } from '../../../components/evidence/afm-profile';
import { metadataFromForm, EMPTY_EVIDENCE_FORM, flakeMaterialOf } from '../../../components/evidence/evidence-form-values';
import { numberFromText } from '../../../components/evidence/number-text';
import { plotPointsOfPl } from '../../../components/evidence/pl-axis';
import { planOnOxide, planOnTransparent } from '../../../components/evidence/planning-values';
import { thinForDrawing } from '../../../components/evidence/plot-thinning';
import { boxFromDrag } from '../../../components/evidence/region-geometry';
import type { AfmAnalysis } from '../../../shared/schemas/evidence-analysis';

describe('planning readout', () => {
  // Blake et al., Appl. Phys. Lett. 91, 063124 (2007), Fig. 2: in green light graphene is seen
  // best on ≈100 nm and ≈300 nm of oxide (published, read qualitatively). Independently, the bare
  // oxide reflects least, and a thin absorber shows most, where the oxide is an odd number of
  // quarter waves thick: d = (2m + 1)·λ/(4n) with n(550 nm) = 1.460 (Malitson 1965), i.e. 94 nm
  // and 283 nm (computed from published inputs).
  it('puts the best green-filter oxide for graphene on one of the quarter-wave branches', () => {
    const plan = planOnOxide('graphene');
    const quarterWaves = [94, 283];
    const nearest = Math.min(...quarterWaves.map((d) => Math.abs(plan.green.oxideThicknessNm - d)));
    expect(nearest).toBeLessThanOrEqual(15);
    expect(plan.green.contrast).toBeGreaterThan(0.1);
    expect(plan.datasets.map((dataset) => dataset.id)).toEqual(['C-Weber-2010', 'SiO2-Malitson-1965', 'Si-Green-2008']);
  });

  it('puts the best white-light oxide for graphene on a quarter-wave branch of the middle of the band', () => {
    // White light is averaged over 400–700 nm, so its best oxide wanders further from the 550 nm values than a filter's does.
    const plan = planOnOxide('graphene');
    const nearest = Math.min(...[94, 283].map((d) => Math.abs(plan.whiteLight.oxideThicknessNm - d)));
    expect(nearest).toBeLessThanOrEqual(25);
  });

  it('on a transparent substrate reports the wavelength of the strongest contrast from the spectrum itself', () => {
    const plan = planOnTransparent('MoS2', 'sapphire');
    const strongest = Math.max(...plan.spectrum.map((point) => Math.abs(point.contrast)));
    expect(Math.abs(plan.best.contrast)).toBe(strongest);
    expect(plan.datasets.map((dataset) => dataset.id)).toContain('Al2O3-Malitson-Dodge-1972-o');
  });
});

describe('PL energy axis', () => {
  // E[eV] = 1239.84 / λ[nm] (hc/e from CODATA): 650 nm is 1.9075 eV; the MoS2 monolayer A exciton
  // at 1.88 eV (Mak et al., PRL 105, 136805, 2010) sits at 659.5 nm.
  it('converts wavelength to energy point by point and runs from low to high energy', () => {
    const points = plotPointsOfPl([600, 650, 659.5], [1, 2, 3], 'nm');
    expect(points.x[1]).toBeCloseTo(1.90745, 4);
    expect(points.x[0]).toBeCloseTo(1.88, 2);
    expect(points.x).toEqual([...points.x].sort((a, b) => a - b));
    expect(points.y).toEqual([3, 2, 1]);
  });

  it('leaves a file already in eV as it is', () => {
    expect(plotPointsOfPl([1.8, 1.9], [5, 6], 'eV')).toEqual({ x: [1.8, 1.9], y: [5, 6] });
  });
});

describe('dragged boxes', () => {
  it('turn display pixels into whole image pixels, whichever way the finger went', () => {
    // Worked example: an image shown at half size; a drag from (110, 60) back to (10, 20).
    expect(boxFromDrag({ x: 110, y: 60 }, { x: 10, y: 20 }, 0.5, 800, 600)).toEqual({
      shape: 'box',
      x: 20,
      y: 40,
      width: 200,
      height: 80,
    });
  });

  it('are clamped to the image and refused when nothing is left', () => {
    expect(boxFromDrag({ x: -50, y: -50 }, { x: 50, y: 50 }, 1, 40, 30)).toEqual({
      shape: 'box',
      x: 0,
      y: 0,
      width: 40,
      height: 30,
    });
    expect(boxFromDrag({ x: 500, y: 10 }, { x: 600, y: 20 }, 1, 400, 300)).toBeNull();
  });
});

describe('thinning a long spectrum for drawing', () => {
  it('keeps, in every pixel column, exactly the lowest and the highest value', () => {
    const points = Array.from({ length: 5000 }, (_, i) => ({ x: i, y: Math.sin(i / 7) * 100 + (i % 13) }));
    const columns = 100;
    const kept = thinForDrawing(points, columns);
    expect(kept.length).toBeLessThanOrEqual(2 * columns);
    // Brute force over each column, as a reference.
    for (let column = 0; column < columns; column += 1) {
      const inColumn = points.filter((point) => Math.min(columns - 1, Math.floor((point.x / 4999) * columns)) === column);
      const keptIn = kept.filter((point) => Math.min(columns - 1, Math.floor((point.x / 4999) * columns)) === column);
      expect(Math.min(...keptIn.map((point) => point.y))).toBe(Math.min(...inColumn.map((point) => point.y)));
      expect(Math.max(...keptIn.map((point) => point.y))).toBe(Math.max(...inColumn.map((point) => point.y)));
    }
    expect(kept.map((point) => point.x)).toEqual([...kept.map((point) => point.x)].sort((a, b) => a - b));
  });

  it('leaves a short one alone', () => {
    const points = [
      { x: 0, y: 1 },
      { x: 1, y: 2 },
    ];
    expect(thinForDrawing(points, 100)).toEqual(points);
  });
});

describe('levelling an AFM profile for display', () => {
  it('removes the fitted tilt and puts the substrate at zero so the levels line up', () => {
    // A 0.65 nm step (one MoS2 layer plus nothing) at 2 µm on a 0.3 nm/µm tilt and a 12 nm offset.
    const x = Array.from({ length: 81 }, (_, i) => i * 0.05);
    const y = x.map((position) => 12 + 0.3 * position + (position >= 2 ? 0.65 : 0));
    const analysis = {
      slopeNmPerUm: 0.3,
      levels: [
        { heightNm: 0, stdDevNm: 0, pointCount: 40, fromUm: 0, toUm: 1.95, layers: 0 },
        { heightNm: 0.65, stdDevNm: 0, pointCount: 41, fromUm: 2, toUm: 4, layers: 1 },
      ],
    } as unknown as AfmAnalysis;
    const profile = levelledProfile(x, y, analysis);
    expect(profile[0].y).toBeCloseTo(0, 9);
    expect(profile[60].y).toBeCloseTo(0.65, 9);
  });
});

describe('the add-evidence form', () => {
  it('reads typed numbers with a decimal comma and refuses text', () => {
    expect(numberFromText(' 0,065 ')).toBeCloseTo(0.065, 12);
    expect(numberFromText('')).toBeUndefined();
    expect(numberFromText('12 nm')).toBeNaN();
  });

  it('matches a sample’s material to the optics data whatever its case', () => {
    expect(flakeMaterialOf('mos2')).toBe('MoS2');
    expect(flakeMaterialOf('MoTe2')).toBeNull();
  });

  it('checks micrograph metadata with the server’s schema and keys problems by field', () => {
    const blankOxide = metadataFromForm('micrograph', {
      ...EMPTY_EVIDENCE_FORM,
      substrateKind: 'oxide-on-silicon',
      material: 'MoS2',
    });
    expect(blankOxide.ok).toBe(false);
    if (!blankOxide.ok) expect(Object.keys(blankOxide.errors)).toContain('substrate.oxideThicknessNm');
    const good = metadataFromForm('micrograph', {
      ...EMPTY_EVIDENCE_FORM,
      substrateKind: 'oxide-on-silicon',
      oxideThicknessNm: '285',
      material: 'MoS2',
    });
    expect(good).toEqual({
      ok: true,
      metadata: {
        illumination: { kind: 'white' },
        substrate: { kind: 'oxide-on-silicon', oxideThicknessNm: 285 },
        material: 'MoS2',
        pixelEncoding: 'as-recorded',
      },
    });
  });
});
