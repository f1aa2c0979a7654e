import { useLocalSearchParams } from 'expo-router';
import { EditSampleScreen } from '@/components/samples/sample-form-screens';

export default function EditSampleRoute() {
  const { code } = useLocalSearchParams<{ code: string }>();
  return <EditSampleScreen code={typeof code === 'string' ? code.trim() : ''} />;
}
