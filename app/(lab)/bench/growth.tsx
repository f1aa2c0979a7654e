import { useLocalSearchParams } from 'expo-router';
import { QuickGrowthScreen } from '@/components/bench/quick-growth-screen';

/** `?outbox=<key>` corrects a growth run the server refused. */
export default function QuickGrowthRoute() {
  const { outbox } = useLocalSearchParams<{ outbox?: string }>();
  return <QuickGrowthScreen outboxKey={typeof outbox === 'string' && outbox ? outbox : null} />;
}
