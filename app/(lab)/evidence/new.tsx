import { useLocalSearchParams } from 'expo-router';
import { AddEvidenceScreen } from '@/components/evidence/add-evidence-screen';

/** `?sample=<code>`: the sample the new evidence belongs to. */
export default function AddEvidenceRoute() {
  const { sample } = useLocalSearchParams<{ sample?: string }>();
  return <AddEvidenceScreen code={typeof sample === 'string' ? sample.trim() : ''} />;
}
