import { useLocalSearchParams } from 'expo-router';
import { AuditScreen } from '@/components/audit/audit-screen';

/** A record's publication audit. */
export default function AuditRoute() {
  const { code } = useLocalSearchParams<{ code: string }>();
  return <AuditScreen code={typeof code === 'string' ? code.trim() : ''} />;
}
