import { useLocalSearchParams } from 'expo-router';
import { SharedAuditScreen } from '@/components/audit/shared-audit-screen';

/** An audit opened through a share link: no sign-in needed, read-only. */
export default function SharedAuditRoute() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return <SharedAuditScreen token={typeof token === 'string' ? token.trim() : ''} />;
}
