import { useLocalSearchParams } from 'expo-router';
import { BoxScreen } from '@/components/boxes/box-screen';

/** One box and its slots. Codes are read forgivingly by the server. */
export default function BoxRoute() {
  const { code } = useLocalSearchParams<{ code: string }>();
  return <BoxScreen code={typeof code === 'string' ? code.trim() : ''} />;
}
