import type { AnalysisSubstrate } from '@/shared/schemas/evidence-analysis';

/** "285 nm SiO₂ on Si", "sapphire", "quartz". */
export function substrateWords(substrate: AnalysisSubstrate): string {
  switch (substrate.kind) {
    case 'oxide-on-silicon':
      return `${substrate.oxideThicknessNm} nm SiO₂ on Si`;
    case 'sapphire':
      return 'sapphire';
    case 'quartz':
      return 'quartz';
  }
}
