/**
 * Colour roles for both schemes. Text pairs are at least 4.5:1 against the surfaces they sit on;
 * borders meant to outline a control are at least 3:1 (WCAG 2.2, 1.4.3 and 1.4.11).
 */
export interface Palette {
  /** Page background: warm paper in light, deep blue-grey in dark. */
  paper: string;
  /** Cards, inputs, the navigation column. */
  surface: string;
  /** Recessed areas: the bottom bar, hovered rows, read-only values. */
  sunken: string;
  hairline: string;
  /** Outlines of inputs and other controls. */
  outline: string;
  ink: string;
  inkMuted: string;
  /** The violet of a silicon chip under its oxide. */
  primary: string;
  onPrimary: string;
  primaryPressed: string;
  primarySoft: string;
  onPrimarySoft: string;
  /** Copper, used sparingly: the brand mark and the keyboard focus ring. */
  copper: string;
  /** Copper dark enough to be read as text. */
  copperInk: string;
  copperSoft: string;
  onCopperSoft: string;
  danger: string;
  onDanger: string;
  dangerPressed: string;
  dangerSoft: string;
  onDangerSoft: string;
  warnSoft: string;
  onWarnSoft: string;
  successSoft: string;
  onSuccessSoft: string;
  infoSoft: string;
  onInfoSoft: string;
  neutralSoft: string;
  onNeutralSoft: string;
}

export const lightPalette: Palette = {
  paper: '#F5F4EF',
  surface: '#FFFFFF',
  sunken: '#ECEAE2',
  hairline: '#DDD9CE',
  outline: '#857F71',
  ink: '#17202A',
  inkMuted: '#4F5661',
  primary: '#3E3580',
  onPrimary: '#FFFFFF',
  primaryPressed: '#2F2866',
  primarySoft: '#E7E4F4',
  onPrimarySoft: '#2E2766',
  copper: '#B4622A',
  copperInk: '#9A4F1E',
  copperSoft: '#F6E6DA',
  onCopperSoft: '#7A3D14',
  danger: '#A3261C',
  onDanger: '#FFFFFF',
  dangerPressed: '#821D15',
  dangerSoft: '#F8E3E0',
  onDangerSoft: '#7A1B13',
  warnSoft: '#FBEFD5',
  onWarnSoft: '#6B4A00',
  successSoft: '#E1F0E3',
  onSuccessSoft: '#1F5A2B',
  infoSoft: '#E7E4F4',
  onInfoSoft: '#2E2766',
  neutralSoft: '#ECEAE2',
  onNeutralSoft: '#3D434C',
};

export const darkPalette: Palette = {
  paper: '#12171E',
  surface: '#1B222B',
  sunken: '#0E1217',
  hairline: '#2E3742',
  outline: '#737B86',
  ink: '#E8E9EC',
  inkMuted: '#A9B0BA',
  primary: '#C9C2F2',
  onPrimary: '#1E1947',
  primaryPressed: '#B2A9EA',
  primarySoft: '#2E2A52',
  onPrimarySoft: '#E1DCFF',
  copper: '#E39A63',
  copperInk: '#E39A63',
  copperSoft: '#3A2618',
  onCopperSoft: '#F2C29E',
  danger: '#F2A49B',
  onDanger: '#3A0E0A',
  dangerPressed: '#E88A7F',
  dangerSoft: '#3D1F1C',
  onDangerSoft: '#FFD9D4',
  warnSoft: '#3A2E14',
  onWarnSoft: '#E9C27A',
  successSoft: '#1D3322',
  onSuccessSoft: '#9DD3A6',
  infoSoft: '#2E2A52',
  onInfoSoft: '#E1DCFF',
  neutralSoft: '#262E38',
  onNeutralSoft: '#C9CED6',
};
