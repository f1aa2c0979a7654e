import { sampleHref } from '@/components/samples/sample-list-params';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { useBreakpoints } from '@/hooks/use-breakpoints';

/**
 * Whether the audit's records and steps can be opened: inside the lab they are links; through a
 * share link the reader is signed out and sees the codes as text.
 */
export type AuditReach = 'lab' | 'shared';

export function RecordRef({ code, reach, testID }: { code: string; reach: AuditReach; testID?: string }) {
  const { isWide } = useBreakpoints();
  if (reach === 'shared') {
    return (
      <Text variant="code" selectable testID={testID}>
        {code}
      </Text>
    );
  }
  return (
    <TextLink href={sampleHref(code, { wide: isWide })} testID={testID}>
      {code}
    </TextLink>
  );
}

export function StepRef({ id, label, reach }: { id: number; label: string; reach: AuditReach }) {
  if (reach === 'shared') return <Text variant="label">{label}</Text>;
  return <TextLink href={{ pathname: '/steps/[id]', params: { id: String(id) } }}>{label}</TextLink>;
}
