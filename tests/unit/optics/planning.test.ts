import { contrastAt } from '../../../shared/optics/contrast';
import { contrastMap } from '../../../shared/optics/planning';

describe('monolayer contrast map (oxide thickness × wavelength)', () => {
  const map = contrastMap({ material: 'graphene' });

  it('spans 0–400 nm of oxide and 400–750 nm of wavelength in 5 nm steps by default', () => {
    expect(map.oxideThicknessesNm).toHaveLength(81);
    expect(map.wavelengthsNm).toHaveLength(71);
    expect(map.contrast).toHaveLength(81);
    for (const row of map.contrast) expect(row).toHaveLength(71);
    expect(map.layers).toBe(1);
    expect(map.datasets.map((dataset) => dataset.id)).toEqual(['C-Weber-2010', 'SiO2-Malitson-1965', 'Si-Green-2008']);
  });

  it('holds the same numbers as the point calculation, and marks its extremes', () => {
    const i = map.oxideThicknessesNm.indexOf(285);
    const j = map.wavelengthsNm.indexOf(550);
    expect(map.contrast[i][j]).toBe(
      contrastAt({ material: 'graphene', layers: 1, substrate: { kind: 'oxide-on-silicon', oxideThicknessNm: 285 } }, 550),
    );
    const all = map.contrast.flat();
    expect(map.darkest.contrast).toBe(Math.max(...all));
    expect(map.brightest.contrast).toBe(Math.min(...all));
  });

  // Blake et al., Appl. Phys. Lett. 91, 063124 (2007): in green light graphene is best seen on
  // ≈100 nm and ≈300 nm oxide and nearly invisible near 200 nm (qualitative comparison with their
  // Fig. 2, computed from published inputs).
  it('at 550 nm has maxima near 100 nm and 300 nm of oxide and a minimum near 200 nm', () => {
    const column = map.oxideThicknessesNm.map((oxide, i) => ({
      oxide,
      contrast: map.contrast[i][map.wavelengthsNm.indexOf(550)],
    }));
    const strongestIn = (from: number, to: number) =>
      column
        .filter((cell) => cell.oxide >= from && cell.oxide <= to)
        .reduce((best, cell) => (cell.contrast > best.contrast ? cell : best));
    const weakestIn = (from: number, to: number) =>
      column
        .filter((cell) => cell.oxide >= from && cell.oxide <= to)
        .reduce((best, cell) => (cell.contrast < best.contrast ? cell : best));
    const firstPeak = strongestIn(20, 160);
    const secondPeak = strongestIn(220, 360);
    const trough = weakestIn(150, 250);
    expect(firstPeak.oxide).toBeGreaterThanOrEqual(70);
    expect(firstPeak.oxide).toBeLessThanOrEqual(110);
    expect(secondPeak.oxide).toBeGreaterThanOrEqual(260);
    expect(secondPeak.oxide).toBeLessThanOrEqual(310);
    expect(trough.oxide).toBeGreaterThanOrEqual(170);
    expect(trough.oxide).toBeLessThanOrEqual(215);
    expect(firstPeak.contrast).toBeGreaterThan(0.1);
    expect(secondPeak.contrast).toBeGreaterThan(0.1);
    expect(Math.abs(trough.contrast)).toBeLessThan(0.02);
  });

  it('accepts custom grids and layer counts', () => {
    const small = contrastMap({ material: 'MoS2', layers: 2, oxideThicknessesNm: [90, 285], wavelengthsNm: [500, 600] });
    expect(small.contrast).toHaveLength(2);
    expect(small.contrast[1][1]).toBe(
      contrastAt({ material: 'MoS2', layers: 2, substrate: { kind: 'oxide-on-silicon', oxideThicknessNm: 285 } }, 600),
    );
    expect(() => contrastMap({ material: 'MoS2', wavelengthsNm: [] })).toThrow(RangeError);
  });
});
