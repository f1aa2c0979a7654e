import { useLocalSearchParams } from 'expo-router';
import { SAMPLE_KINDS } from '@/shared/samples';
import { NewSampleScreen } from '@/components/samples/sample-form-screens';

/** `?kind=crystal` pre-selects the kind (e.g. from the empty list's "Register a source crystal"). */
export default function NewSampleRoute() {
  const { kind } = useLocalSearchParams<{ kind?: string }>();
  return <NewSampleScreen initialKind={SAMPLE_KINDS.find((candidate) => candidate === kind) ?? null} />;
}
