import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';

/** Values the server accepts but a careful colleague would query: listed, never blocking. */
export function WarningsNotice({
  warnings,
  title = 'Unusual values, logged as given',
}: {
  warnings: readonly { message: string }[];
  title?: string;
}) {
  if (warnings.length === 0) return null;
  return (
    <Notice tone="warn" title={title} testID="run-warnings">
      {warnings.map((warning) => (
        <Text key={warning.message}>{warning.message}</Text>
      ))}
    </Notice>
  );
}
