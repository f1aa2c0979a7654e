import { RADII_CSV_HEADER, etchedAnnuli, isEtchedZone, radiiTableCsv, ringPattern } from '../../../shared/zone-plate/layout';
import { zoneRadii } from '../../../shared/zone-plate/optics';

// Radii: r_n = √(nλf + (nλ/2)²) (Attwood, Soft X-Rays and Extreme Ultraviolet Radiation, ch. 9).
// Which zones are etched and the CSV layout are Flakeline's choices (common practice, no source).

const lambdaUm = 0.6328;
const f = 1000;
const r = (n: number) => Math.sqrt(n * lambdaUm * f + ((n * lambdaUm) / 2) ** 2);
const zones = zoneRadii({ wavelengthNm: 632.8, focalLengthUm: f }, 97);

const parse = (csv: string) => {
  const [header, ...rows] = csv.trimEnd().split('\n');
  return {
    header,
    rows: rows.map((line) => {
      const [zone, inner, outer, width] = line.split(',').map(Number);
      return { zone, inner, outer, width };
    }),
  };
};

describe('radii table CSV', () => {
  it('has the header and one line per etched (odd) zone, values that parse back', () => {
    const csv = radiiTableCsv(zones);
    expect(csv.endsWith('\n')).toBe(true);
    const { header, rows } = parse(csv);
    expect(header).toBe('zone,inner_radius_um,outer_radius_um,width_nm');
    expect(header).toBe(RADII_CSV_HEADER);
    expect(rows).toHaveLength(49); // odd zones 1, 3, … 97
    expect(csv.trimEnd().split('\n')).toHaveLength(1 + 49);
    rows.forEach((row, i) => {
      const n = 2 * i + 1;
      expect(row.zone).toBe(n);
      expect(row.inner).toBeCloseTo(n === 1 ? 0 : r(n - 1), 6);
      expect(row.outer).toBeCloseTo(r(n), 6);
      expect(row.width).toBeCloseTo((r(n) - (n === 1 ? 0 : r(n - 1))) * 1000, 3);
      expect(row.width / 1000).toBeCloseTo(row.outer - row.inner, 5);
    });
    expect(rows[0].inner).toBe(0); // zone 1 is the central disc
    expect(rows[48].zone).toBe(97);
  });

  it('lists the even zones when those are etched', () => {
    const { rows } = parse(radiiTableCsv(zones, 'even'));
    expect(rows).toHaveLength(48);
    expect(rows[0].zone).toBe(2);
    expect(rows[0].inner).toBeCloseTo(r(1), 6);
    expect(rows.every((row) => row.zone % 2 === 0)).toBe(true);
  });

  it('writes the header alone when no zone is etched', () => {
    expect(radiiTableCsv(zoneRadii({ wavelengthNm: 632.8, focalLengthUm: f }, 1), 'even')).toBe(`${RADII_CSV_HEADER}\n`);
  });
});

describe('ring preview geometry', () => {
  it('gives the lens radius and the etched annuli with consistent mid radius and width', () => {
    const pattern = ringPattern(zones);
    expect(pattern.lensRadiusUm).toBeCloseTo(r(97), 9);
    expect(pattern.etchedZones).toBe('odd');
    expect(pattern.annuli).toHaveLength(49);
    for (const annulus of pattern.annuli) {
      expect(isEtchedZone(annulus.zone)).toBe(true);
      expect(annulus.midRadiusUm).toBeCloseTo((annulus.innerRadiusUm + annulus.outerRadiusUm) / 2, 12);
      expect(annulus.widthUm).toBeCloseTo(annulus.outerRadiusUm - annulus.innerRadiusUm, 9);
      // A circle of radius mid stroked width wide covers exactly inner…outer.
      expect(annulus.midRadiusUm - annulus.widthUm / 2).toBeCloseTo(annulus.innerRadiusUm, 9);
    }
    expect(etchedAnnuli(zones, 'even').map((annulus) => annulus.zone)).toEqual(Array.from({ length: 48 }, (_, i) => 2 * (i + 1)));
  });
});
