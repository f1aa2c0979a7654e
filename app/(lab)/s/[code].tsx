import { useLocalSearchParams } from 'expo-router';
import { ResolveCodeScreen } from '@/components/scan/resolve-code-screen';

/** The address on every printed label: `/s/<code>` opens the sample or box it names. */
export default function ResolveCodeRoute() {
  const { code } = useLocalSearchParams<{ code: string }>();
  return <ResolveCodeScreen code={typeof code === 'string' ? code : ''} />;
}
