/**
 * Per-material Raman rules: which stretches of the spectrum to fit, which fitted peak is which
 * mode, and how the modes turn into a layer call. Each value names its source and how far to
 * trust it (published / computed from published inputs / common practice / from memory). Where a
 * number is recalled rather than read from the paper the rule is kept conservative: a wider
 * band of "cannot tell", an uncertainty of one layer, or only "2 or more".
 */
import { type DerivedQuantity, type FittedPeak, type LayerEstimate, type RuleReference } from '../schemas/evidence-analysis';
import { type FlakeMaterialId } from '../optics/materials';
import { layerEstimate, lowerBoundEstimate } from './layer-estimate';

export interface RamanWindow {
  readonly fromX: number;
  readonly toX: number;
  readonly minFwhm: number;
  readonly maxFwhm: number;
  /** At most this many peaks; 1 forces a single Lorentzian (graphene's 2D band). */
  readonly maxPeaks?: number;
}

export interface ModeSpec {
  readonly label: string;
  readonly from: number;
  readonly to: number;
}

export interface RamanContext {
  /** Fitted peaks by mode label (the tallest peak inside each mode's range). */
  readonly modes: ReadonlyMap<string, FittedPeak>;
  /** Noise σ and rms residual of the window a mode was fitted in, by mode label. */
  readonly windowOf: ReadonlyMap<string, { noise: number; rmsResidual: number }>;
  /** Add to a measured position to correct it by the silicon line; null when no Si line was fitted. */
  readonly siCorrection: number | null;
  readonly laserNm: number | null;
}

export interface RamanVerdict {
  readonly quantities: DerivedQuantity[];
  readonly estimate: LayerEstimate | null;
  readonly notes: string[];
}

export interface RamanRule {
  readonly windows: readonly RamanWindow[];
  readonly modes: readonly ModeSpec[];
  readonly references: readonly RuleReference[];
  judge(context: RamanContext): RamanVerdict;
}

/** Silicon's first-order line, used to correct absolute positions when the substrate shows it. */
export const SILICON_LINE_CM1 = 520.7;
export const SILICON_REFERENCE: RuleReference = {
  text: `Silicon's optical phonon at ${SILICON_LINE_CM1} cm⁻¹ at room temperature is used to correct absolute peak positions when the substrate's line is in the spectrum.`,
  source: 'Value in common use for spectrometer calibration',
  mark: 'from_memory',
};
export const SILICON_WINDOW: RamanWindow = { fromX: 480, toX: 560, minFwhm: 1, maxFwhm: 15, maxPeaks: 2 };
export const SILICON_MODE: ModeSpec = { label: 'Si', from: 510, to: 531 };
/** A correction larger than this means a mislabelled axis or a strained/heated spot, not calibration. */
export const MAX_SILICON_CORRECTION_CM1 = 5;

const round = (value: number, digits = 1) => Number(value.toFixed(digits));
const cm1 = (value: number) => `${round(value)} cm⁻¹`;

function quantity(key: string, label: string, value: number, unit: string, stdErr?: number): DerivedQuantity {
  return stdErr !== undefined && Number.isFinite(stdErr) ? { key, label, value, unit, stdErr } : { key, label, value, unit };
}

function missing(modes: readonly string[], context: RamanContext): string[] {
  return modes.filter((mode) => !context.modes.has(mode));
}

function noCall(notes: string[], quantities: DerivedQuantity[] = []): RamanVerdict {
  return { quantities, estimate: null, notes };
}

/** Position corrected by the Si line when there is one; the note says which was used. */
function correctedPosition(peak: FittedPeak, context: RamanContext): { value: number; isCalibrated: boolean } {
  return context.siCorrection === null
    ? { value: peak.centre, isCalibrated: false }
    : { value: peak.centre + context.siCorrection, isCalibrated: true };
}

// ---------------------------------------------------------------------------------------------
// MoS2: separation of the A1g and E¹2g modes

/**
 * Separation A1g − E¹2g for 1, 2, 3 layers and bulk-like flakes as reported by Lee et al.,
 * ACS Nano 4, 2695 (2010): ≈ 18–19, 21–22, ≈ 23 and 24–25 cm⁻¹ (values as recalled, from memory).
 * Boundaries sit midway between neighbouring values (computed from those inputs).
 */
export const MOS2_SEPARATION_BOUNDARIES_CM1 = [20.0, 22.5, 23.5] as const;
/** Outside this range the separation does not describe a 2H-MoS2 flake (alloy, heavy strain, wrong material). */
export const MOS2_SEPARATION_RANGE_CM1 = { from: 17, to: 27 } as const;
/** Spectrometer resolution below which a separation near a boundary cannot be trusted (common practice, no source). */
export const POSITION_RESOLUTION_CM1 = 0.5;

const MOS2: RamanRule = {
  windows: [{ fromX: 330, toX: 450, minFwhm: 1, maxFwhm: 15 }],
  modes: [
    { label: 'E¹2g', from: 370, to: 392 },
    { label: 'A1g', from: 396, to: 415 },
  ],
  references: [
    {
      text: 'A1g − E¹2g separation ≈ 18–19 cm⁻¹ (1 layer), 21–22 (2), ≈ 23 (3), 24–25 (bulk-like); boundaries used: 20.0, 22.5, 23.5 cm⁻¹ (midway).',
      source: 'C. Lee et al., ACS Nano 4, 2695 (2010)',
      mark: 'from_memory',
    },
  ],
  judge(context) {
    const absent = missing(['E¹2g', 'A1g'], context);
    if (absent.length > 0)
      return noCall([`No ${absent.join(' or ')} peak was found; MoS₂ needs both modes near 385 and 405 cm⁻¹.`]);
    const e2g = context.modes.get('E¹2g')!;
    const a1g = context.modes.get('A1g')!;
    const separation = a1g.centre - e2g.centre;
    const stdErr = Math.hypot(a1g.stdErr?.centre ?? 0, e2g.stdErr?.centre ?? 0);
    const quantities = [quantity('separation', 'A1g − E¹2g separation', separation, 'cm⁻¹', stdErr)];
    if (separation < MOS2_SEPARATION_RANGE_CM1.from || separation > MOS2_SEPARATION_RANGE_CM1.to) {
      return noCall(
        [
          `The separation ${cm1(separation)} is outside ${MOS2_SEPARATION_RANGE_CM1.from}–${MOS2_SEPARATION_RANGE_CM1.to} cm⁻¹, where the layer rule holds; check the material.`,
        ],
        quantities,
      );
    }
    const [b12, b23, b34] = MOS2_SEPARATION_BOUNDARIES_CM1;
    const layers = separation < b12 ? 1 : separation < b23 ? 2 : separation < b34 ? 3 : 4;
    const margin = Math.max(POSITION_RESOLUTION_CM1, 2 * stdErr);
    const nearest = Math.min(...MOS2_SEPARATION_BOUNDARIES_CM1.map((boundary) => Math.abs(separation - boundary)));
    const uncertainty = nearest < margin ? 1 : 0;
    const basis = `A1g − E¹2g = ${cm1(separation)} (Lee et al. 2010: ≈18–19 for 1 layer, 21–22 for 2, ≈23 for 3, 24–25 bulk-like)${
      uncertainty ? '; close to a boundary, so ±1 layer' : ''
    }.`;
    const estimate =
      layers === 4 ? lowerBoundEstimate('raman', 4, uncertainty, basis) : layerEstimate('raman', layers, uncertainty, basis);
    return { quantities, estimate, notes: [] };
  },
};

// ---------------------------------------------------------------------------------------------
// Graphene: 2D band shape and I(2D)/I(G)

/**
 * Widest single-Lorentzian 2D band still taken as a monolayer. Ferrari et al., PRL 97, 187401
 * (2006) report a single sharp 2D peak of FWHM ≈ 24 cm⁻¹ for a monolayer (published, as recalled);
 * 35 cm⁻¹ leaves room for strain and doping inhomogeneity within the laser spot (common practice, no source).
 */
export const GRAPHENE_MONOLAYER_MAX_2D_FWHM_CM1 = 35;
/** I(2D)/I(G) (peak heights) above which a narrow 2D reads as a monolayer (common practice, no source). */
export const GRAPHENE_MONOLAYER_MIN_RATIO = 2;
/** Below this ratio a narrow 2D fits no clean rule (common practice, no source). */
export const GRAPHENE_MIN_RATIO = 1;
/** A 2D band whose single-Lorentzian residual exceeds this many noise σ has more than one component. */
export const SINGLE_LORENTZIAN_RESIDUAL_SIGMAS = 2;

export const GRAPHENE_TURBOSTRATIC_NOTE =
  'A single, narrow 2D peak is also seen in misoriented (turbostratic) multilayers, whose layers do not couple; confirm a monolayer with contrast or AFM.';

const GRAPHENE: RamanRule = {
  windows: [
    { fromX: 1250, toX: 1700, minFwhm: 4, maxFwhm: 80, maxPeaks: 4 },
    // The 2D position moves with the laser (about 100 cm⁻¹ per eV, from memory): a wide window.
    { fromX: 2500, toX: 2850, minFwhm: 8, maxFwhm: 150, maxPeaks: 1 },
  ],
  modes: [
    { label: 'D', from: 1300, to: 1400 },
    { label: 'G', from: 1560, to: 1610 },
    { label: "D'", from: 1610, to: 1640 },
    { label: '2D', from: 2550, to: 2800 },
  ],
  references: [
    {
      text: 'Monolayer: a single sharp Lorentzian 2D band, FWHM ≈ 24 cm⁻¹; bilayer and thicker: broader 2D made of several components.',
      source: 'A. C. Ferrari et al., Phys. Rev. Lett. 97, 187401 (2006)',
      mark: 'from_memory',
    },
    {
      text: `Monolayer taken as 2D FWHM ≤ ${GRAPHENE_MONOLAYER_MAX_2D_FWHM_CM1} cm⁻¹ and I(2D)/I(G) ≥ ${GRAPHENE_MONOLAYER_MIN_RATIO} (peak heights).`,
      source: 'Thresholds in common use',
      mark: 'common_practice',
    },
  ],
  judge(context) {
    const absent = missing(['G', '2D'], context);
    if (absent.length > 0)
      return noCall([`No ${absent.join(' or ')} peak was found; graphene needs G near 1580 and 2D near 2650–2700 cm⁻¹.`]);
    const g = context.modes.get('G')!;
    const band2D = context.modes.get('2D')!;
    const ratio = band2D.height / g.height;
    const ratioErr = ratio * Math.hypot((band2D.stdErr?.height ?? 0) / band2D.height, (g.stdErr?.height ?? 0) / g.height);
    const quantities = [
      quantity('ratio_2d_g', 'I(2D)/I(G), peak heights', ratio, '', ratioErr),
      quantity('area_ratio_2d_g', 'A(2D)/A(G), peak areas', band2D.area / g.area, ''),
      quantity('fwhm_2d', '2D FWHM', band2D.fwhm, 'cm⁻¹', band2D.stdErr?.fwhm),
      quantity('position_g', 'G position', g.centre, 'cm⁻¹', g.stdErr?.centre),
      quantity('position_2d', '2D position', band2D.centre, 'cm⁻¹', band2D.stdErr?.centre),
    ];
    const notes = [GRAPHENE_TURBOSTRATIC_NOTE];
    const d = context.modes.get('D');
    if (d) {
      quantities.push(quantity('ratio_d_g', 'I(D)/I(G), peak heights', d.height / g.height, ''));
      notes.push(`A D peak is present (I(D)/I(G) = ${round(d.height / g.height, 2)}): defects or an edge in the laser spot.`);
    }
    const fit2D = context.windowOf.get('2D');
    const isSingleLorentzian = !fit2D || fit2D.rmsResidual <= SINGLE_LORENTZIAN_RESIDUAL_SIGMAS * fit2D.noise;
    const figures = `2D FWHM ${cm1(band2D.fwhm)}, I(2D)/I(G) ${round(ratio, 2)}`;

    if (band2D.fwhm > GRAPHENE_MONOLAYER_MAX_2D_FWHM_CM1 || !isSingleLorentzian) {
      const why = isSingleLorentzian ? 'broader than a monolayer’s' : 'not one Lorentzian';
      return {
        quantities,
        estimate: lowerBoundEstimate(
          'raman',
          2,
          0,
          `${figures}: the 2D band is ${why}, so more than one layer (Ferrari et al. 2006).`,
        ),
        notes,
      };
    }
    if (ratio >= GRAPHENE_MONOLAYER_MIN_RATIO) {
      return {
        quantities,
        estimate: layerEstimate(
          'raman',
          1,
          0,
          `${figures}: a single sharp 2D band twice the G peak or more, as in a monolayer (Ferrari et al. 2006).`,
        ),
        notes,
      };
    }
    if (ratio >= GRAPHENE_MIN_RATIO) {
      return {
        quantities,
        estimate: layerEstimate(
          'raman',
          1,
          1,
          `${figures}: a single sharp 2D band, but weaker than usual for a monolayer (doping lowers the ratio; misoriented layers also look like this).`,
        ),
        notes,
      };
    }
    return noCall([...notes, `${figures}: a narrow 2D band weaker than G fits no clean layer rule.`], quantities);
  },
};

// ---------------------------------------------------------------------------------------------
// hBN: position of the E2g mode

/**
 * Gorbachev et al., Small 7, 465 (2011): E2g at ≈ 1366 cm⁻¹ in bulk; monolayers blue-shifted by up
 * to ≈ 4 cm⁻¹, bilayers slightly red-shifted, the signal growing with the number of layers
 * (published, values as recalled, from memory). Thresholds keep a band of "cannot tell" between.
 */
export const HBN_MONOLAYER_MIN_CM1 = 1368.5;
export const HBN_MULTILAYER_MAX_CM1 = 1366.5;
/** Without the Si line to correct the axis, both thresholds move 1 cm⁻¹ apart (common practice, no source). */
export const UNCALIBRATED_WIDENING_CM1 = 1;

const HBN: RamanRule = {
  windows: [{ fromX: 1300, toX: 1430, minFwhm: 3, maxFwhm: 40, maxPeaks: 2 }],
  modes: [{ label: 'E2g', from: 1355, to: 1385 }],
  references: [
    {
      text: 'E2g ≈ 1366 cm⁻¹ in bulk hBN; monolayers blue-shifted by up to ≈ 4 cm⁻¹ and weak; thresholds used: ≥ 1368.5 cm⁻¹ for one layer, ≤ 1366.5 for two or more.',
      source: 'R. V. Gorbachev et al., Small 7, 465 (2011)',
      mark: 'from_memory',
    },
    SILICON_REFERENCE,
  ],
  judge(context) {
    const e2g = context.modes.get('E2g');
    if (!e2g) return noCall(['No E2g peak was found near 1366 cm⁻¹.']);
    const position = correctedPosition(e2g, context);
    const quantities = [
      quantity(
        'position_e2g',
        position.isCalibrated ? 'E2g position (Si-corrected)' : 'E2g position',
        position.value,
        'cm⁻¹',
        e2g.stdErr?.centre,
      ),
      quantity('fwhm_e2g', 'E2g FWHM', e2g.fwhm, 'cm⁻¹', e2g.stdErr?.fwhm),
    ];
    const widen = position.isCalibrated ? 0 : UNCALIBRATED_WIDENING_CM1;
    const notes = [
      'hBN Raman is a weak guide to layer number (strain shifts the mode too); confirm with contrast or AFM.',
      ...(position.isCalibrated ? [] : ['No silicon line to correct the axis: the thresholds were widened by 1 cm⁻¹.']),
    ];
    const basis = `E2g at ${cm1(position.value)}${position.isCalibrated ? ' (Si-corrected)' : ''}`;
    if (position.value >= HBN_MONOLAYER_MIN_CM1 + widen) {
      return {
        quantities,
        estimate: layerEstimate(
          'raman',
          1,
          1,
          `${basis}: blue-shifted from bulk 1366 cm⁻¹ as monolayers are (Gorbachev et al. 2011).`,
        ),
        notes,
      };
    }
    if (position.value <= HBN_MULTILAYER_MAX_CM1 - widen) {
      return {
        quantities,
        estimate: lowerBoundEstimate(
          'raman',
          2,
          0,
          `${basis}: at or below the bulk position, so not a monolayer (Gorbachev et al. 2011).`,
        ),
        notes,
      };
    }
    return noCall([...notes, `${basis} lies between the monolayer and bulk positions.`], quantities);
  },
};

// ---------------------------------------------------------------------------------------------
// WS2: 2LA(M)/A1g intensity ratio under green excitation, and the A1g position

/**
 * Berkdemir et al., Sci. Rep. 3, 1755 (2013), 514.5 nm excitation: I(2LA)/I(A1g) ≈ 2.2 for a
 * monolayer, falling below ≈ 1 for thicker flakes; A1g ≈ 417.5 cm⁻¹ in a monolayer, stiffening
 * towards ≈ 420.5 in bulk (values as recalled, from memory). The ratio is a resonance effect, so
 * it is used only for 510–535 nm lasers.
 */
export const WS2_MONOLAYER_MIN_RATIO = 1.5;
export const WS2_MULTILAYER_MAX_RATIO = 1.1;
export const WS2_RESONANT_LASER_NM = { from: 510, to: 535 } as const;
export const WS2_MONOLAYER_MAX_A1G_CM1 = 418.5;
export const WS2_MULTILAYER_MIN_A1G_CM1 = 419.5;

type Signal = 'one' | 'more' | 'unclear';

function combineSignals(signals: readonly { signal: Signal; words: string }[], source: string): LayerEstimate | null {
  const ones = signals.filter((s) => s.signal === 'one');
  const mores = signals.filter((s) => s.signal === 'more');
  const words = signals.map((s) => s.words).join('; ');
  if (ones.length > 0 && mores.length > 0) return null;
  if (ones.length > 0)
    return layerEstimate('raman', 1, ones.length === signals.length && signals.length > 1 ? 0 : 1, `${words} (${source}).`);
  if (mores.length > 0) return lowerBoundEstimate('raman', 2, 0, `${words} (${source}).`);
  return null;
}

const WS2: RamanRule = {
  windows: [{ fromX: 300, toX: 460, minFwhm: 2, maxFwhm: 30 }],
  modes: [
    { label: '2LA(M) + E¹2g', from: 340, to: 362 },
    { label: 'A1g', from: 410, to: 425 },
  ],
  references: [
    {
      text: 'Green excitation: I(2LA)/I(A1g) ≈ 2.2 in a monolayer, below ≈ 1 in thicker flakes; A1g ≈ 417.5 cm⁻¹ (1 layer) to ≈ 420.5 (bulk). Thresholds used: ratio ≥ 1.5 → 1, ≤ 1.1 → 2+; A1g ≤ 418.5 → 1, ≥ 419.5 → 2+.',
      source: 'A. Berkdemir et al., Sci. Rep. 3, 1755 (2013)',
      mark: 'from_memory',
    },
    SILICON_REFERENCE,
  ],
  judge(context) {
    const band = context.modes.get('2LA(M) + E¹2g');
    const a1g = context.modes.get('A1g');
    if (!a1g) return noCall(['No A1g peak was found near 418 cm⁻¹.']);
    const position = correctedPosition(a1g, context);
    const quantities = [
      quantity(
        'position_a1g',
        position.isCalibrated ? 'A1g position (Si-corrected)' : 'A1g position',
        position.value,
        'cm⁻¹',
        a1g.stdErr?.centre,
      ),
    ];
    const notes: string[] = [];
    const signals: { signal: Signal; words: string }[] = [];

    if (band) {
      const ratio = band.height / a1g.height;
      quantities.push(quantity('ratio_2la_a1g', 'I(2LA)/I(A1g), peak heights', ratio, ''));
      const laser = context.laserNm;
      if (laser !== null && laser >= WS2_RESONANT_LASER_NM.from && laser <= WS2_RESONANT_LASER_NM.to) {
        const signal: Signal = ratio >= WS2_MONOLAYER_MIN_RATIO ? 'one' : ratio <= WS2_MULTILAYER_MAX_RATIO ? 'more' : 'unclear';
        signals.push({ signal, words: `I(2LA)/I(A1g) = ${round(ratio, 2)}` });
      } else {
        notes.push('The 2LA/A1g ratio rule holds for 510–535 nm lasers only; give the laser wavelength to use it.');
      }
    }
    const widen = position.isCalibrated ? 0 : UNCALIBRATED_WIDENING_CM1;
    const positionSignal: Signal =
      position.value <= WS2_MONOLAYER_MAX_A1G_CM1 - widen
        ? 'one'
        : position.value >= WS2_MULTILAYER_MIN_A1G_CM1 + widen
          ? 'more'
          : 'unclear';
    signals.push({
      signal: positionSignal,
      words: `A1g at ${cm1(position.value)}${position.isCalibrated ? ' (Si-corrected)' : ''}`,
    });
    if (!position.isCalibrated) notes.push('No silicon line to correct the axis: the A1g thresholds were widened by 1 cm⁻¹.');

    const estimate = combineSignals(signals, 'Berkdemir et al. 2013');
    if (!estimate)
      notes.push(
        `The signs do not add up to a call: ${signals.map((s) => `${s.words} (${s.signal === 'one' ? 'one layer' : s.signal === 'more' ? 'two or more' : 'unclear'})`).join('; ')}.`,
      );
    return { quantities, estimate, notes };
  },
};

// ---------------------------------------------------------------------------------------------
// WSe2 and MoSe2: the interlayer B¹2g mode, absent in a monolayer

/**
 * Tonndorf et al., Opt. Express 21, 4908 (2013): the B¹2g mode (≈ 308 cm⁻¹ in WSe2, ≈ 353 cm⁻¹ in
 * MoSe2) needs an interlayer interaction and is absent in monolayers; in bilayers it is a few
 * percent of the main peak or more (values as recalled, from memory). A missing B¹2g says
 * "monolayer" firmly only when the noise would have shown a peak of `B2G_DETECTION_FRACTION` of the
 * main peak.
 */
export const B2G_DETECTION_FRACTION = 0.03;
/** Peak height, in noise σ, a mode needs to have been found (as in the peak finder). */
export const DETECTION_SIGMAS = 4;

function interlayerModeRule(options: { mainLabel: string; mainNear: number; b2gNear: number }): Pick<RamanRule, 'judge'> {
  return {
    judge(context) {
      const main = context.modes.get(options.mainLabel);
      if (!main) return noCall([`No ${options.mainLabel} peak was found near ${options.mainNear} cm⁻¹.`]);
      const quantities = [quantity('position_main', `${options.mainLabel} position`, main.centre, 'cm⁻¹', main.stdErr?.centre)];
      const b2g = context.modes.get('B¹2g');
      const source = 'Tonndorf et al. 2013';
      if (b2g) {
        const fraction = b2g.height / main.height;
        quantities.push(quantity('ratio_b2g_main', `I(B¹2g)/I(${options.mainLabel})`, fraction, ''));
        return {
          quantities,
          estimate: lowerBoundEstimate(
            'raman',
            2,
            0,
            `B¹2g seen at ${cm1(b2g.centre)} (${round(100 * fraction)} % of ${options.mainLabel}): an interlayer mode, absent in a monolayer (${source}).`,
          ),
          notes: [],
        };
      }
      const noise = context.windowOf.get(options.mainLabel)?.noise ?? 0;
      const detectable = (DETECTION_SIGMAS * noise) / main.height;
      quantities.push(quantity('b2g_detection_limit', 'Smallest B¹2g the noise allows, fraction of main peak', detectable, ''));
      const isFirm = detectable <= B2G_DETECTION_FRACTION;
      return {
        quantities,
        estimate: layerEstimate(
          'raman',
          1,
          isFirm ? 0 : 1,
          `No B¹2g near ${options.b2gNear} cm⁻¹ (it would have shown above ${round(100 * detectable)} % of ${options.mainLabel}): a monolayer (${source})${
            isFirm ? '' : '; the noise could hide a weak B¹2g, so ±1 layer'
          }.`,
        ),
        notes: [],
      };
    },
  };
}

const WSE2: RamanRule = {
  windows: [{ fromX: 200, toX: 330, minFwhm: 1.5, maxFwhm: 25 }],
  modes: [
    { label: 'E¹2g/A1g', from: 245, to: 256 },
    { label: '2LA(M)', from: 256, to: 266 },
    { label: 'B¹2g', from: 302, to: 313 },
  ],
  references: [
    {
      text: 'B¹2g at ≈ 308 cm⁻¹ appears from two layers on and is absent in a monolayer; E¹2g and A1g are nearly degenerate at ≈ 250 cm⁻¹. Firm monolayer call when a B¹2g of 3 % of the main peak would have been seen.',
      source: 'P. Tonndorf et al., Opt. Express 21, 4908 (2013)',
      mark: 'from_memory',
    },
  ],
  ...interlayerModeRule({ mainLabel: 'E¹2g/A1g', mainNear: 250, b2gNear: 308 }),
};

const MOSE2: RamanRule = {
  windows: [{ fromX: 200, toX: 370, minFwhm: 1.5, maxFwhm: 25 }],
  modes: [
    { label: 'A1g', from: 236, to: 246 },
    { label: 'E¹2g', from: 280, to: 292 },
    { label: 'B¹2g', from: 347, to: 358 },
  ],
  references: [
    {
      text: 'A1g ≈ 241 cm⁻¹ in a monolayer, softening (shifting down) as layers are removed; B¹2g at ≈ 353 cm⁻¹ appears from two layers on. Firm monolayer call when a B¹2g of 3 % of A1g would have been seen.',
      source: 'P. Tonndorf et al., Opt. Express 21, 4908 (2013)',
      mark: 'from_memory',
    },
  ],
  ...interlayerModeRule({ mainLabel: 'A1g', mainNear: 241, b2gNear: 353 }),
};

export const RAMAN_RULES: Readonly<Record<FlakeMaterialId, RamanRule>> = {
  MoS2: MOS2,
  graphene: GRAPHENE,
  hBN: HBN,
  WS2: WS2,
  WSe2: WSE2,
  MoSe2: MOSE2,
};
