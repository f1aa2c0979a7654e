import type { LayerCall, LayerEstimate } from '@/shared/schemas/evidence-analysis';
import { LAYER_METHOD_WORDS } from '@/shared/schemas/evidence-analysis';
import type { EvidenceKind } from '@/shared/schemas/evidence';
import type { PillLook } from '@/components/ui/badges';
import type { IconName } from '@/components/ui/button';
import { formatNumber } from './number-text';

export function layersWord(layers: number): string {
  return layers === 1 ? '1 layer' : `${layers} layers`;
}

/** "1 layer", "2 ± 0.5 layers", "at least 2 layers". */
export function describeEstimate(estimate: LayerEstimate): string {
  if (estimate.isLowerBound) return `at least ${layersWord(estimate.layers)}`;
  if (estimate.uncertainty > 0) return `${estimate.layers} ± ${formatNumber(estimate.uncertainty, 2)} layers`;
  return layersWord(estimate.layers);
}

/** "Raman says 1 layer", "Contrast says at least 2 layers": the words the combined call uses. */
export function estimateSentence(estimate: LayerEstimate): string {
  const method = LAYER_METHOD_WORDS[estimate.method];
  return `${method.charAt(0).toUpperCase()}${method.slice(1)} says ${describeEstimate(estimate)}`;
}

/** The big figure of a layer call: the count, "≥ 2" for a lower bound, a dash for none. */
export function callFigure(call: LayerCall): string {
  if (call.layers !== null) return String(call.layers);
  if (call.atLeast !== null) return `≥ ${call.atLeast}`;
  return '–';
}

export const CALL_STATUS: Record<LayerCall['status'], { label: string; look: PillLook }> = {
  no_evidence: { label: 'No evidence yet', look: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' } },
  single: { label: 'One method', look: { background: 'infoSoft', text: 'onInfoSoft', dot: 'onInfoSoft' } },
  agreeing: { label: 'Methods agree', look: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' } },
  disagreeing: { label: 'Methods disagree', look: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' } },
};

export const KIND_ICONS: Record<EvidenceKind, IconName> = {
  micrograph: 'image-outline',
  raman: 'pulse-outline',
  pl: 'sunny-outline',
  afm: 'trending-up-outline',
};

export const KIND_SHORT_LABELS: Record<EvidenceKind, string> = {
  micrograph: 'Micrograph',
  raman: 'Raman',
  pl: 'PL',
  afm: 'AFM profile',
};
