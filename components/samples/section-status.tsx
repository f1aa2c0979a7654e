import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { describeError } from '@/hooks/api-client';

interface SectionQuery {
  isError: boolean;
  error: unknown;
  isFetching: boolean;
  refetch: () => unknown;
}

/**
 * Loading or failure of one part of a record (its ancestry, its history) inside that part's card,
 * so the rest of the record stays readable. Renders nothing once the part has data.
 */
export function SectionStatus({ query, what }: { query: SectionQuery; what: string }) {
  const { colors } = useTheme();
  if (query.isError) {
    return (
      <View style={styles.status} accessibilityRole="alert">
        <Text tone="danger">{`Could not load ${what}. ${describeError(query.error)}`}</Text>
        <Button
          title="Try again"
          icon="refresh"
          variant="secondary"
          onPress={() => void query.refetch()}
          loading={query.isFetching}
        />
      </View>
    );
  }
  return (
    <View style={[styles.status, styles.row]} accessibilityRole="progressbar" accessibilityLabel={`Loading ${what}`}>
      <ActivityIndicator color={colors.primary} />
      <Text tone="muted">{`Loading ${what}…`}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  status: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'center' },
});
