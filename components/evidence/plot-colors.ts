import type { ColourChannel } from '@/shared/optics/contrast';
import type { Theme } from '@/components/theme';

/**
 * Colours that carry data in plots: a camera channel is drawn in its own hue so a red-channel
 * line is never mistaken for the green one. They are data encodings, not interface colours, so
 * they live here rather than in the theme; each scheme's set keeps at least 3:1 against the
 * surface the plot sits on (WCAG 2.2, 1.4.11).
 */
const CHANNEL_COLOURS: Record<Theme['scheme'], Record<ColourChannel, string>> = {
  light: { red: '#B3261E', green: '#2E7D32', blue: '#1F5FAD' },
  dark: { red: '#FF8A80', green: '#81C784', blue: '#90CAF9' },
};

export function channelColour(theme: Theme, channel: ColourChannel): string {
  return CHANNEL_COLOURS[theme.scheme][channel];
}

export const CHANNEL_LABELS: Record<ColourChannel, string> = { red: 'Red', green: 'Green', blue: 'Blue' };

/**
 * Ends of the contrast heat map: the chip violet where the flake looks darker than the oxide,
 * copper where it looks brighter, the plot surface where it vanishes.
 */
export function contrastScaleColours(theme: Theme): { darker: string; vanishing: string; brighter: string } {
  const { colors } = theme;
  return { darker: colors.primary, vanishing: colors.surface, brighter: colors.copper };
}

/**
 * Outlines drawn over a micrograph. They sit on the photo, not on a theme surface, so they are
 * the same in both schemes: saturated hues rare on oxide chips (violet, blue, green, gold) with
 * a dark halo under each line (common practice, no source).
 */
export const MARKER_COLOURS = {
  flake: '#FF9F1C',
  substrate: '#2EC4F0',
  candidate: '#7CFC00',
  selectedCandidate: '#FFFFFF',
  halo: 'rgba(0,0,0,0.65)',
} as const;
