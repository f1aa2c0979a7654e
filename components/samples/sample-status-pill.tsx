import { SAMPLE_STATUS_LABELS, type SampleStatus } from '@/shared/samples';
import { DotPill, type PillLook } from '@/components/ui/badges';

/** Usable states read as calm colours; states that stop work (missing, retired) stand out. */
const LOOKS: Record<SampleStatus, PillLook> = {
  ready: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' },
  in_process: { background: 'infoSoft', text: 'onInfoSoft', dot: 'onInfoSoft' },
  used_up: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' },
  missing: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' },
  discarded: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' },
  retired: { background: 'dangerSoft', text: 'onDangerSoft', dot: 'onDangerSoft' },
};

/** Where a sample is in its life, in the same pill shape as a person's status. */
export function SampleStatusPill({ status }: { status: SampleStatus }) {
  return <DotPill label={SAMPLE_STATUS_LABELS[status]} look={LOOKS[status]} testID={`sample-status-${status}`} />;
}
