import { Link, useRouter } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { Step } from '@/shared/schemas/step';
import { STEP_TYPE_LABELS } from '@/shared/steps';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { useAwaitingSearchChipsQuery, useMyStepsQuery } from '@/hooks/use-bench';
import { OutboxList } from './outbox-list';

const RECENT_LIMIT = 10;

/** The signed-in home at the tape station or the furnace: log a run in one tap, see what is pending. */
export function BenchScreen() {
  const router = useRouter();
  return (
    <Screen title="Bench" lead="Log a run as it happens; it syncs even if the network drops." testID="bench-screen">
      <View style={styles.big}>
        <BigAction
          title="Log exfoliation"
          detail="Crystal, tape, peels, chips"
          onPress={() => router.push('/bench/exfoliation')}
          testID="bench-log-exfoliation"
        />
        <BigAction
          title="Log growth"
          detail="Precursors, furnace, films"
          onPress={() => router.push('/bench/growth')}
          testID="bench-log-growth"
        />
      </View>
      <OutboxList />
      <RecentRuns />
      <AwaitingSearch />
    </Screen>
  );
}

function BigAction({ title, detail, onPress, testID }: { title: string; detail: string; onPress: () => void; testID: string }) {
  const { colors } = useTheme();
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityLabel={title}
      onPress={onPress}
      testID={testID}
      style={({ pressed }) => [styles.action, { backgroundColor: pressed ? colors.primaryPressed : colors.primary }]}
    >
      <Text variant="heading" style={{ color: colors.onPrimary }}>
        {title}
      </Text>
      <Text style={{ color: colors.onPrimary }}>{detail}</Text>
    </Pressable>
  );
}

function describeRun(step: Step): string {
  const used = step.inputs.map((input) => input.code).join(', ');
  const made = step.outputs.length;
  const kind = step.outputs[0] ? SAMPLE_KIND_LABELS[step.outputs[0].kind].toLowerCase() : '';
  return [used ? `from ${used}` : null, made ? `${made} ${kind}${made === 1 ? '' : 's'}` : null].filter(Boolean).join(' · ');
}

function RecentRuns() {
  const { colors } = useTheme();
  const steps = useMyStepsQuery(null, RECENT_LIMIT);
  return (
    <Card title="My recent runs" testID="bench-recent">
      {steps.data ? (
        steps.data.length === 0 ? (
          <EmptyState icon="flask-outline" title="Nothing logged yet">
            Your runs and steps appear here once logged.
          </EmptyState>
        ) : (
          <View style={styles.list} role="list">
            {steps.data.map((step) => (
              <Link key={step.id} href={`/steps/${step.id}`} asChild>
                <Pressable
                  role="listitem"
                  testID={`bench-recent-${step.id}`}
                  style={({ pressed }) => [
                    styles.row,
                    { borderColor: colors.hairline, backgroundColor: pressed ? colors.sunken : colors.surface },
                  ]}
                >
                  <Text variant="label">{STEP_TYPE_LABELS[step.type]}</Text>
                  <Text variant="caption" tone="muted" numberOfLines={1}>
                    {[new Date(step.startedAt ?? step.createdAt).toLocaleString(), describeRun(step)].filter(Boolean).join(' · ')}
                  </Text>
                </Pressable>
              </Link>
            ))}
          </View>
        )
      ) : steps.isError ? (
        <ErrorState
          title="Could not load your recent runs"
          error={steps.error}
          onRetry={() => void steps.refetch()}
          retrying={steps.isFetching}
        />
      ) : (
        <LoadingState label="Loading your recent runs…" />
      )}
    </Card>
  );
}

function AwaitingSearch() {
  const { colors } = useTheme();
  const chips = useAwaitingSearchChipsQuery();
  return (
    <Card title="Chips waiting for a flake search" testID="bench-awaiting">
      {chips.data ? (
        chips.data.length === 0 ? (
          <EmptyState icon="search-outline" title="No chips waiting">
            Chips you make show here until flakes are logged on them.
          </EmptyState>
        ) : (
          <View style={styles.list} role="list">
            {chips.data.map((chip) => (
              <Link key={chip.code} href={`/s/${chip.code}`} asChild>
                <Pressable
                  role="listitem"
                  testID={`bench-awaiting-${chip.code}`}
                  style={({ pressed }) => [
                    styles.row,
                    { borderColor: colors.hairline, backgroundColor: pressed ? colors.sunken : colors.surface },
                  ]}
                >
                  <Text variant="code" tone="primary">
                    {chip.code}
                  </Text>
                  <Text variant="caption" tone="muted" numberOfLines={1}>
                    {[chip.material, chip.name].filter(Boolean).join(' · ') || 'Substrate chip'}
                  </Text>
                </Pressable>
              </Link>
            ))}
          </View>
        )
      ) : chips.isError ? (
        <ErrorState
          title="Could not load the chips"
          error={chips.error}
          onRetry={() => void chips.refetch()}
          retrying={chips.isFetching}
        />
      ) : (
        <LoadingState label="Loading chips…" />
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  big: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  action: {
    flexGrow: 1,
    flexBasis: 160,
    minHeight: sizes.touchTarget * 2,
    borderRadius: radii.lg,
    padding: space.lg,
    justifyContent: 'center',
    gap: space.xs,
  },
  list: { gap: space.xs },
  row: {
    minHeight: sizes.touchTarget,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: sizes.hairline,
    gap: space.xxs,
    justifyContent: 'center',
  },
});
