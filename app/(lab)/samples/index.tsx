import { useLocalSearchParams } from 'expo-router';
import { parseSampleListView } from '@/components/samples/sample-list-params';
import { SamplesScreen } from '@/components/samples/samples-screen';

/** Filters, order and `?code=<code>` (the selected sample) live in the address, so they can be bookmarked. */
export default function SamplesRoute() {
  const params = useLocalSearchParams();
  const code = typeof params.code === 'string' ? params.code.trim() : '';
  return <SamplesScreen view={parseSampleListView(params)} selectedCode={code || null} />;
}
