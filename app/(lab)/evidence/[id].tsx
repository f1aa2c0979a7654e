import { useLocalSearchParams } from 'expo-router';
import { EvidenceScreen } from '@/components/evidence/evidence-screen';

/** One piece of thickness evidence; `?added=1` marks the view shown straight after the upload. */
export default function EvidenceRoute() {
  const { id, added } = useLocalSearchParams<{ id: string; added?: string }>();
  const evidenceId = Number(id);
  return <EvidenceScreen id={Number.isInteger(evidenceId) && evidenceId > 0 ? evidenceId : null} justAdded={added === '1'} />;
}
