import { useLocalSearchParams } from 'expo-router';
import { LineageScreen } from '@/components/lineage/lineage-screen';

/** A record's ancestry and descendants as a layered picture (or generation list on phones). */
export default function LineageRoute() {
  const { code } = useLocalSearchParams<{ code: string }>();
  return <LineageScreen code={typeof code === 'string' ? code.trim() : ''} />;
}
