/**
 * What the lithography writes: the etched zones as a radii table (CSV) for the pattern file and
 * as annuli for the ring preview (react-native-svg draws them; this module only gives numbers).
 *
 * Which zones are etched is the design's `etchedZones` choice, 'odd' by default: zone 1 (the
 * central disc), 3, 5… are removed and the flake keeps the even rings (see `EtchedZones` in
 * ./limits). The table covers zones 1…N only; what happens to flake beyond r_N (left, etched,
 * covered by an aperture stop) is the lab's decision and not part of the lens design.
 */
import { DEFAULT_ETCHED_ZONES, type EtchedZones } from './limits';
import type { ZoneRadius } from './optics';

export function isEtchedZone(zone: number, etchedZones: EtchedZones = DEFAULT_ETCHED_ZONES): boolean {
  return etchedZones === 'odd' ? zone % 2 === 1 : zone % 2 === 0;
}

/**
 * One ring of the preview. Draw it either as the region between two circles (inner/outer
 * radius; the even-odd fill rule) or as one circle of radius `midRadiusUm` stroked
 * `widthUm` wide — that also draws zone 1 as a full disc (mid r₁/2, width r₁).
 */
export interface Annulus {
  zone: number;
  innerRadiusUm: number;
  outerRadiusUm: number;
  midRadiusUm: number;
  widthUm: number;
}

export function etchedAnnuli(zones: readonly ZoneRadius[], etchedZones: EtchedZones = DEFAULT_ETCHED_ZONES): Annulus[] {
  return zones
    .filter((zone) => isEtchedZone(zone.zone, etchedZones))
    .map((zone) => ({
      zone: zone.zone,
      innerRadiusUm: zone.innerRadiusUm,
      outerRadiusUm: zone.outerRadiusUm,
      midRadiusUm: (zone.innerRadiusUm + zone.outerRadiusUm) / 2,
      widthUm: zone.widthUm,
    }));
}

/** Everything the preview needs: the lens radius r_N (for the viewBox) and the etched rings. */
export interface RingPattern {
  lensRadiusUm: number;
  etchedZones: EtchedZones;
  annuli: Annulus[];
}

export function ringPattern(zones: readonly ZoneRadius[], etchedZones: EtchedZones = DEFAULT_ETCHED_ZONES): RingPattern {
  const outermost = zones[zones.length - 1];
  return {
    lensRadiusUm: outermost === undefined ? 0 : outermost.outerRadiusUm,
    etchedZones,
    annuli: etchedAnnuli(zones, etchedZones),
  };
}

export const RADII_CSV_HEADER = 'zone,inner_radius_um,outer_radius_um,width_nm';

/**
 * Decimals in the CSV: radii to 1 pm (6 decimals in µm), widths to 1 pm (3 decimals in nm) —
 * finer than any e-beam address grid, so rounding never moves an edge (common practice, no source).
 */
const RADIUS_DECIMALS_UM = 6;
const WIDTH_DECIMALS_NM = 3;

/**
 * The etched zones, one line each after the header, centre outwards, lines ending in "\n".
 * Radii are exact (r_n = √(nλf + (nλ/2)²)); widths come from the unrounded radii.
 */
export function radiiTableCsv(zones: readonly ZoneRadius[], etchedZones: EtchedZones = DEFAULT_ETCHED_ZONES): string {
  const lines = [RADII_CSV_HEADER];
  for (const annulus of etchedAnnuli(zones, etchedZones)) {
    lines.push(
      [
        annulus.zone.toString(),
        annulus.innerRadiusUm.toFixed(RADIUS_DECIMALS_UM),
        annulus.outerRadiusUm.toFixed(RADIUS_DECIMALS_UM),
        (annulus.widthUm * 1000).toFixed(WIDTH_DECIMALS_NM),
      ].join(','),
    );
  }
  return `${lines.join('\n')}\n`;
}
