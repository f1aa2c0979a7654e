import { MAX_DRAWN_RINGS, MIN_DRAWN_RING_PX, planRingDrawing } from '../../../components/devices/ring-drawing';
import { designZonePlate, ringPattern } from '../../../shared/zone-plate';

// Drawing limits are the app's own choices (common practice, no source); the radii come from
// shared/zone-plate, checked against Attwood's exact formula in tests/unit/zone-plate.

const designOf = (apertureDiameterUm: number, focalLengthUm = 1000) =>
  designZonePlate({ wavelengthNm: 632.8, focalLengthUm, apertureDiameterUm });

describe('planning the ring preview', () => {
  it('draws every etched ring of a coarse lens and no band', () => {
    const design = designOf(500, 20_000); // few, wide zones
    const pattern = ringPattern(design.zones, design.etchedZones);
    const plan = planRingDrawing(pattern, design.zoneCount, 180);
    expect(plan.fineBand).toBeNull();
    expect(plan.rings).toEqual(pattern.annuli);
  });

  it('stops at rings finer than a pixel and covers every remaining zone with the band', () => {
    const design = designOf(500); // 98 zones, the rim about 1.3 µm wide on a 500 µm lens
    const pattern = ringPattern(design.zones, design.etchedZones);
    const radiusPx = 120; // the outermost zones are about 0.6 px wide here
    const plan = planRingDrawing(pattern, design.zoneCount, radiusPx);
    const pxPerUm = radiusPx / pattern.lensRadiusUm;
    expect(plan.rings.length).toBeGreaterThan(0);
    expect(plan.rings.length).toBeLessThan(pattern.annuli.length);
    for (const ring of plan.rings) expect(ring.widthUm * pxPerUm).toBeGreaterThanOrEqual(MIN_DRAWN_RING_PX);
    const last = plan.rings[plan.rings.length - 1];
    expect(plan.fineBand).toEqual({
      innerRadiusUm: last.outerRadiusUm,
      outerRadiusUm: pattern.lensRadiusUm,
      zoneCount: design.zoneCount - last.zone,
    });
  });

  it('never draws more than the cap however large the drawing', () => {
    const design = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: 1000, zoneCount: 5000 });
    const plan = planRingDrawing(ringPattern(design.zones), design.zoneCount, 1_000_000);
    expect(plan.rings).toHaveLength(MAX_DRAWN_RINGS);
    expect(plan.fineBand?.zoneCount).toBe(5000 - plan.rings[MAX_DRAWN_RINGS - 1].zone);
  });

  it('draws the whole lens as a band when even the first ring is too fine', () => {
    const design = designZonePlate({ wavelengthNm: 632.8, focalLengthUm: 1000, zoneCount: 5000 });
    const plan = planRingDrawing(ringPattern(design.zones), design.zoneCount, 2);
    expect(plan.rings).toEqual([]);
    expect(plan.fineBand).toEqual({ innerRadiusUm: 0, outerRadiusUm: design.zones[4999].outerRadiusUm, zoneCount: 5000 });
  });
});
