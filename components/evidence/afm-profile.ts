import { median } from '@/shared/evidence/robust-stats';
import type { AfmAnalysis } from '@/shared/schemas/evidence-analysis';

/**
 * The profile as the analysis saw it: the fitted tilt removed, and shifted so the substrate level
 * sits at zero, where the fitted levels (heights above the lowest one) can be drawn over it.
 */
export function levelledProfile(x: readonly number[], y: readonly number[], analysis: AfmAnalysis): { x: number; y: number }[] {
  const untilted = x.map((position, i) => ({ x: position, y: y[i] - analysis.slopeNmPerUm * position }));
  const substrate = analysis.levels[0];
  const zero = substrate
    ? median(untilted.filter((point) => point.x >= substrate.fromUm && point.x <= substrate.toUm).map((point) => point.y)) -
      substrate.heightNm
    : 0;
  return untilted.map((point) => ({ x: point.x, y: point.y - zero }));
}
