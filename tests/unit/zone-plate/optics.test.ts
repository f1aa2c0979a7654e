import {
  AMPLITUDE_PLATE_FIRST_ORDER_EFFICIENCY,
  PHASE_PLATE_FIRST_ORDER_EFFICIENCY,
  amplitudePlateEfficiency,
  apertureDiameterForZoneCountUm,
  depthOfFocusPlusMinusUm,
  diffractionOrders,
  exactZoneRadiusUm,
  focalLengthAtWavelengthUm,
  focalLengthInOrderUm,
  largestZoneCountForMinFeature,
  maxRelativeBandwidth,
  numericalAperture,
  outermostZoneWidthUm,
  paraxialOutermostZoneWidthUm,
  phasePlateEfficiency,
  rayleighResolutionUm,
  smallAngleNumericalAperture,
  thinZoneRadiusUm,
  zoneCountForAperture,
  zoneRadii,
  zoneWidthUm,
} from '../../../shared/zone-plate/optics';

// Sources named beside each check:
// [Attwood] D. Attwood, Soft X-Rays and Extreme Ultraviolet Radiation (Cambridge UP, 1999), ch. 9.
// [Hecht] E. Hecht, Optics, Fresnel zone-plate section.
// [Kirz] J. Kirz, J. Opt. Soc. Am. 64, 301 (1974) — from memory.
// Expected values are computed here from the formulas, independently of the module's algebra.

const HE_NE = { wavelengthNm: 632.8, focalLengthUm: 1000 };
const um = (nm: number) => nm / 1000;

describe('zone radii', () => {
  // [Attwood] r_n² = nλf + (nλ/2)², from √(f² + r_n²) = f + nλ/2.
  it('follow the exact formula and put each edge nλ/2 further from the focus', () => {
    const lambda = um(HE_NE.wavelengthNm);
    const f = HE_NE.focalLengthUm;
    for (const n of [1, 2, 3, 10, 50, 97]) {
      const r = exactZoneRadiusUm(HE_NE, n);
      expect(r).toBeCloseTo(Math.sqrt(n * lambda * f + ((n * lambda) / 2) ** 2), 10);
      expect(Math.hypot(f, r) - f).toBeCloseTo((n * lambda) / 2, 9);
    }
    expect(exactZoneRadiusUm(HE_NE, 0)).toBe(0);
  });

  // [Attwood], [Hecht] thin limit r_n ≈ √(nλf); the gap is analytic: r_exact² − r_thin² = (nλ/2)².
  it('differ from the thin approximation by exactly (nλ/2)² in the squares', () => {
    const lambda = um(HE_NE.wavelengthNm);
    for (const zone of zoneRadii(HE_NE, 97)) {
      const n = zone.zone;
      expect(zone.thinOuterRadiusUm).toBeCloseTo(Math.sqrt(n * lambda * HE_NE.focalLengthUm), 10);
      expect(zone.thinOuterRadiusUm).toBeCloseTo(thinZoneRadiusUm(HE_NE, n), 12);
      const squaresGap = zone.outerRadiusUm ** 2 - zone.thinOuterRadiusUm ** 2;
      expect(squaresGap / ((n * lambda) / 2) ** 2).toBeCloseTo(1, 6);
      expect(zone.thinDifferenceUm).toBeCloseTo(zone.outerRadiusUm - zone.thinOuterRadiusUm, 9);
      expect(zone.thinRelativeDifference).toBeCloseTo(zone.thinDifferenceUm / zone.outerRadiusUm, 12);
      expect(zone.thinDifferenceInZoneWidths).toBeCloseTo(zone.thinDifferenceUm / zone.widthUm, 12);
    }
  });

  // [Attwood] thin limit f ≫ nλ: relative gap 1 − 1/√(1 + nλ/4f) → nλ/(8f) → 0.
  it('approach the thin approximation as f ≫ Nλ', () => {
    const n = 10;
    const lambda = um(632.8);
    let previous = Infinity;
    for (const f of [10, 100, 1e3, 1e4, 1e5, 1e6]) {
      const [zone] = zoneRadii({ wavelengthNm: 632.8, focalLengthUm: f }, n).slice(-1);
      const analytic = 1 - 1 / Math.sqrt(1 + (n * lambda) / (4 * f));
      expect(zone.thinRelativeDifference / analytic).toBeCloseTo(1, 6);
      expect(zone.thinRelativeDifference).toBeLessThan(previous);
      previous = zone.thinRelativeDifference;
      if (f >= 1e4) expect(zone.thinRelativeDifference / ((n * lambda) / (8 * f))).toBeCloseTo(1, 3);
    }
    expect(previous).toBeLessThan(1e-6);
  });

  it('tile the plate: each zone starts where the last ended, widths shrink outwards', () => {
    const zones = zoneRadii(HE_NE, 97);
    expect(zones[0].innerRadiusUm).toBe(0);
    expect(zones[0].widthUm).toBeCloseTo(zones[0].outerRadiusUm, 12);
    for (let i = 1; i < zones.length; i += 1) {
      expect(zones[i].innerRadiusUm).toBe(zones[i - 1].outerRadiusUm);
      expect(zones[i].widthUm).toBeCloseTo(zones[i].outerRadiusUm - zones[i].innerRadiusUm, 9);
      expect(zones[i].widthUm).toBeLessThan(zones[i - 1].widthUm);
      expect(zoneWidthUm(HE_NE, i + 1)).toBeCloseTo(zones[i].widthUm, 12);
    }
  });
});

describe('zone count and aperture', () => {
  // Definition in the brief: the largest N with 2 r_N ≤ D; checked against a plain count.
  const countByHand = (lens: typeof HE_NE, d: number) => {
    let n = 0;
    while (2 * exactZoneRadiusUm(lens, n + 1) <= d) n += 1;
    return n;
  };

  it.each([1, 50, 51.2, 123.4, 499.9, 500, 1000, 2500])('holds as many zones as counted by hand in %p µm', (d) => {
    expect(zoneCountForAperture(HE_NE, d)).toBe(countByHand(HE_NE, d));
  });

  it('gives back N for an aperture of exactly 2 r_N, and N − 1 just below it', () => {
    for (const lens of [HE_NE, { wavelengthNm: 13.5, focalLengthUm: 1000 }, { wavelengthNm: 1550, focalLengthUm: 20 }]) {
      for (const n of [1, 2, 7, 97, 1000, 12345]) {
        const d = apertureDiameterForZoneCountUm(lens, n);
        expect(d).toBe(2 * exactZoneRadiusUm(lens, n));
        expect(zoneCountForAperture(lens, d)).toBe(n);
        expect(zoneCountForAperture(lens, d * (1 - 1e-9))).toBe(n - 1);
      }
    }
  });

  it('answers at once for absurdly many zones instead of stepping through them', () => {
    // N ≈ 2R/λ when R ≫ f: 1e5 µm / 1e-12 µm ≈ 1e17.
    expect(zoneCountForAperture({ wavelengthNm: 1e-9, focalLengthUm: 1 }, 100_000)).toBeGreaterThan(0.99e17);
    expect(zoneCountForAperture({ wavelengthNm: 1e-300, focalLengthUm: 1 }, 100_000)).toBeGreaterThan(1e300);
  });

  it('holds no zone when the aperture is smaller than the central disc', () => {
    expect(zoneCountForAperture(HE_NE, 2 * exactZoneRadiusUm(HE_NE, 1) - 0.01)).toBe(0);
  });
});

describe('efficiencies', () => {
  // [Kirz] (from memory), [Attwood]: binary amplitude plate 1/π², binary π-phase plate 4/π².
  it('are 1/π² ≈ 0.10132 for an amplitude plate and 4/π² ≈ 0.40528 for a phase plate', () => {
    expect(AMPLITUDE_PLATE_FIRST_ORDER_EFFICIENCY).toBeCloseTo(0.10132, 5);
    expect(PHASE_PLATE_FIRST_ORDER_EFFICIENCY).toBeCloseTo(0.40528, 5);
    expect(amplitudePlateEfficiency(1)).toBe(AMPLITUDE_PLATE_FIRST_ORDER_EFFICIENCY);
    expect(phasePlateEfficiency(1)).toBe(PHASE_PLATE_FIRST_ORDER_EFFICIENCY);
    expect(phasePlateEfficiency(1) / amplitudePlateEfficiency(1)).toBeCloseTo(4, 12); // [Hecht] phase reversal doubles the amplitude
  });

  // [Kirz], [Attwood]: order m of an amplitude plate 1/(m²π²) for odd m, 0 for even m, 1/4 in order 0.
  it('fall as 1/m² in odd orders and vanish in even orders', () => {
    expect(amplitudePlateEfficiency(3)).toBeCloseTo(1 / (9 * Math.PI ** 2), 15);
    expect(amplitudePlateEfficiency(-3)).toBeCloseTo(1 / (9 * Math.PI ** 2), 15);
    expect(amplitudePlateEfficiency(5)).toBeCloseTo(1 / (25 * Math.PI ** 2), 15);
    expect(phasePlateEfficiency(3)).toBeCloseTo(4 / (9 * Math.PI ** 2), 15);
    for (const even of [2, 4, -2, 10]) {
      expect(amplitudePlateEfficiency(even)).toBe(0);
      expect(phasePlateEfficiency(even)).toBe(0);
    }
    expect(amplitudePlateEfficiency(0)).toBe(0.25);
    expect(phasePlateEfficiency(0)).toBe(0);
  });

  // Energy bookkeeping with Σ_{odd m ≥ 1} 1/m² = π²/8 (standard series): an amplitude plate
  // passes half the light (order 0 plus ±odd orders = 1/2, [Kirz]); a lossless phase plate all of it.
  it('add up to 1/2 for an amplitude plate and 1 for a lossless phase plate', () => {
    let amplitude = amplitudePlateEfficiency(0);
    let phase = phasePlateEfficiency(0);
    for (let m = 1; m <= 200_001; m += 1) {
      amplitude += amplitudePlateEfficiency(m) + amplitudePlateEfficiency(-m);
      phase += phasePlateEfficiency(m) + phasePlateEfficiency(-m);
    }
    expect(amplitude).toBeCloseTo(0.5, 5);
    expect(phase).toBeCloseTo(1, 5);
  });
});

describe('chromatic scaling and higher orders', () => {
  // [Attwood], [Hecht]: r_n² ≈ nλf fixes λf, so f(λ′) = f λ/λ′.
  it('moves the focus as 1/λ', () => {
    expect(focalLengthAtWavelengthUm(HE_NE, 532)).toBeCloseTo((1000 * 632.8) / 532, 10);
    expect(focalLengthAtWavelengthUm(HE_NE, 1265.6)).toBeCloseTo(500, 10);
    expect(focalLengthAtWavelengthUm(HE_NE, 632.8)).toBeCloseTo(1000, 10);
    // Same thin radii at (λ′, f′) as at (λ, f): the plate is unchanged, only the focus moved.
    const green = { wavelengthNm: 532, focalLengthUm: focalLengthAtWavelengthUm(HE_NE, 532) };
    expect(thinZoneRadiusUm(green, 40)).toBeCloseTo(thinZoneRadiusUm(HE_NE, 40), 10);
  });

  // [Attwood], [Hecht]: foci at f/m; a binary plate with equal zone areas has no even orders.
  it('puts order m at f/m and lists only odd orders', () => {
    expect(focalLengthInOrderUm(1000, 1)).toBe(1000);
    expect(focalLengthInOrderUm(1000, 3)).toBeCloseTo(1000 / 3, 12);
    expect(focalLengthInOrderUm(1000, 5)).toBe(200);
    const orders = diffractionOrders(HE_NE, 1.3, 6);
    expect(orders.map((o) => o.order)).toEqual([1, 3, 5]);
    expect(orders.map((o) => o.focalLengthUm)).toEqual([1000, 1000 / 3, 200]);
    // [Attwood] order m resolves 1.22 Δr/m (from memory).
    expect(orders[1].resolutionUm).toBeCloseTo((1.22 * 1.3) / 3, 12);
  });
});

describe('resolution, numerical aperture, depth of focus, bandwidth', () => {
  // [Attwood]: Rayleigh resolution 1.22 Δr = 0.61 λ/NA with NA = λ/(2Δr).
  it('resolves 1.22 Δr', () => {
    expect(rayleighResolutionUm(1.3)).toBeCloseTo(1.586, 12);
    const na = smallAngleNumericalAperture(632.8, 1.3);
    expect(rayleighResolutionUm(1.3)).toBeCloseTo((0.61 * um(632.8)) / na, 12);
  });

  // [Attwood]: NA ≈ λ/(2Δr) for many zones. With exact radii it tracks sin θ = r_N/√(f² + r_N²)
  // (the exact NA) even at NA ≈ 0.9, to within 1/(4N)-ish — within 1 % once N is large.
  it.each([
    [632.8, 1000, 100],
    [632.8, 100, 500],
    [13.5, 1000, 738],
    [2.48, 1000, 1007],
  ])('NA ≈ λ/(2Δr) within 1 %% (λ = %p nm, f = %p µm, N = %p)', (wavelengthNm, focalLengthUm, n) => {
    const lens = { wavelengthNm, focalLengthUm };
    const rN = exactZoneRadiusUm(lens, n);
    const exact = Math.sin(Math.atan(rN / focalLengthUm));
    expect(numericalAperture(lens, n)).toBeCloseTo(exact, 12);
    const deltaR = exactZoneRadiusUm(lens, n) - exactZoneRadiusUm(lens, n - 1);
    const smallAngle = um(wavelengthNm) / (2 * deltaR);
    expect(smallAngleNumericalAperture(wavelengthNm, outermostZoneWidthUm(lens, n))).toBeCloseTo(smallAngle, 9);
    expect(Math.abs(smallAngle / exact - 1)).toBeLessThan(0.01);
  });

  it('NA ≈ λ/(2Δr) gets better as N grows', () => {
    const gap = (n: number) =>
      Math.abs(smallAngleNumericalAperture(632.8, outermostZoneWidthUm(HE_NE, n)) / numericalAperture(HE_NE, n) - 1);
    expect(gap(1)).toBeGreaterThan(0.01);
    expect(gap(10)).toBeGreaterThan(gap(100));
    expect(gap(100)).toBeGreaterThan(gap(1000));
  });

  // [Attwood]: Δr ≈ λf/(2 r_N), D = 4NΔr and f = 4N(Δr)²/λ for many zones (and small NA, where
  // the exact radii's extra factor √(1 + (r_N/f)²) is near 1). Soft x-rays at 500 eV (2.48 nm),
  // f = 1 mm, 100 µm aperture: N ≈ 1000, NA ≈ 0.05 — Attwood's own regime.
  it('Δr ≈ λf/(2 r_N) for many zones at small NA', () => {
    const lens = { wavelengthNm: 2.48, focalLengthUm: 1000 };
    const n = zoneCountForAperture(lens, 100);
    expect(n).toBeGreaterThan(1000);
    const rN = exactZoneRadiusUm(lens, n);
    const deltaR = rN - exactZoneRadiusUm(lens, n - 1);
    const lambda = um(2.48);
    expect(deltaR / ((lambda * 1000) / (2 * rN))).toBeCloseTo(1, 2);
    expect(paraxialOutermostZoneWidthUm(lens, n)).toBeCloseTo((lambda * 1000) / (2 * rN), 12);
    expect((2 * rN) / (4 * n * deltaR)).toBeCloseTo(1, 2);
    expect((4 * n * deltaR ** 2) / lambda / 1000).toBeCloseTo(1, 2);
  });

  // [Attwood]: DOF = ±λ/(2 NA²) = ±2(Δr)²/λ; the module uses the Δr form.
  it('depth of focus is ±2(Δr)²/λ, the same as ±λ/(2 NA²) with NA = λ/(2Δr)', () => {
    const deltaR = 1.3;
    const lambda = um(632.8);
    expect(depthOfFocusPlusMinusUm(632.8, deltaR)).toBeCloseTo((2 * deltaR ** 2) / lambda, 12);
    const na = lambda / (2 * deltaR);
    expect(depthOfFocusPlusMinusUm(632.8, deltaR)).toBeCloseTo(lambda / (2 * na ** 2), 10);
  });

  // [Attwood]: spectral bandwidth Δλ/λ ≤ 1/N.
  it('tolerates a relative bandwidth of 1/N', () => {
    expect(maxRelativeBandwidth(97)).toBeCloseTo(1 / 97, 15);
  });
});

describe('largest zone count the lithography can write', () => {
  it('matches a zone-by-zone search', () => {
    const lens = { wavelengthNm: 13.5, focalLengthUm: 1000 };
    for (const minFeatureUm of [0.05, 0.1, 0.2, 1]) {
      let byHand = 0;
      while (byHand < 5000 && zoneWidthUm(lens, byHand + 1) >= minFeatureUm) byHand += 1;
      expect(largestZoneCountForMinFeature(lens, minFeatureUm, 5000)).toBe(byHand);
    }
    expect(largestZoneCountForMinFeature(lens, 1e-6, 5000)).toBe(5000);
    expect(largestZoneCountForMinFeature(lens, 1e6, 5000)).toBe(0);
  });
});

describe('argument checks', () => {
  it('refuse non-physical arguments instead of returning NaN', () => {
    expect(() => exactZoneRadiusUm({ wavelengthNm: 0, focalLengthUm: 1000 }, 1)).toThrow(RangeError);
    expect(() => exactZoneRadiusUm({ wavelengthNm: 632.8, focalLengthUm: -1 }, 1)).toThrow(RangeError);
    expect(() => exactZoneRadiusUm(HE_NE, 1.5)).toThrow(RangeError);
    expect(() => zoneRadii(HE_NE, 0)).toThrow(RangeError);
    expect(() => zoneCountForAperture(HE_NE, Number.NaN)).toThrow(RangeError);
    expect(() => focalLengthInOrderUm(1000, 0)).toThrow(RangeError);
  });
});
