import { useLocalSearchParams } from 'expo-router';
import { parseSampleListView } from '@/components/samples/sample-list-params';
import { SamplesScreen } from '@/components/samples/samples-screen';

/** One sample: the whole screen on phones, beside the list on wide screens. Codes are read forgivingly. */
export default function SampleRoute() {
  const params = useLocalSearchParams();
  const code = typeof params.code === 'string' ? params.code.trim() : '';
  return <SamplesScreen view={parseSampleListView(params)} selectedCode={code || null} />;
}
