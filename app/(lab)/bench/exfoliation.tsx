import { useLocalSearchParams } from 'expo-router';
import { QuickExfoliationScreen } from '@/components/bench/quick-exfoliation-screen';

/** `?crystal=<code>` starts from that crystal; `?outbox=<key>` corrects a run the server refused. */
export default function QuickExfoliationRoute() {
  const { crystal, outbox } = useLocalSearchParams<{ crystal?: string; outbox?: string }>();
  return (
    <QuickExfoliationScreen
      crystal={typeof crystal === 'string' && crystal.trim() ? crystal.trim().toUpperCase() : null}
      outboxKey={typeof outbox === 'string' && outbox ? outbox : null}
    />
  );
}
