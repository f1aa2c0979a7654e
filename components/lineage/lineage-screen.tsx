import { useRouter } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { BackToRecord } from '@/components/audit/back-to-record';
import { sampleHref } from '@/components/samples/sample-list-params';
import { space } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { describeError, isApiError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useLineageGraphQuery } from '@/hooks/use-lineage-graph';
import { layoutLineageGraph } from './graph-layout';
import { LineageCanvas } from './lineage-canvas';
import { LineageGenerationList } from './lineage-generation-list';
import { stepsPhrase } from './lineage-words';

type Shape = 'picture' | 'list';
const SHAPE_CHOICES: { value: Shape; label: string }[] = [
  { value: 'picture', label: 'Picture' },
  { value: 'list', label: 'Generations' },
];

/**
 * Where a record came from and what was made from it. Wider screens get the layered picture
 * (with the list a tap away); phones get the list, generation by generation.
 */
export function LineageScreen({ code }: { code: string }) {
  const graph = useLineageGraphQuery(code);
  const router = useRouter();
  const { isPhone, isWide } = useBreakpoints();
  const [shape, setShape] = useState<Shape>('picture');
  const layout = useMemo(
    () => (graph.data && !isPhone ? layoutLineageGraph(graph.data, stepsPhrase) : null),
    [graph.data, isPhone],
  );
  const open = (target: string) => router.push(sampleHref(target, { wide: isWide }));

  let body;
  if (!graph.data) {
    body = isApiError(graph.error, 'not_found', 'code_typo') ? (
      <Notice tone="warn" title={`No record has the code ${code}`} testID="lineage-missing">
        {describeError(graph.error)}
      </Notice>
    ) : graph.isError ? (
      <ErrorState
        title="Could not load the lineage"
        error={graph.error}
        onRetry={() => void graph.refetch()}
        retrying={graph.isFetching}
      />
    ) : (
      <LoadingState label="Loading the lineage…" />
    );
  } else {
    const data = graph.data;
    const ancestors = data.nodes.filter((node) => node.generation < 0).length;
    const descendants = data.nodes.filter((node) => node.generation > 0).length;
    const summary = `${ancestors} ${ancestors === 1 ? 'ancestor' : 'ancestors'} and ${descendants} ${descendants === 1 ? 'descendant' : 'descendants'}, ${data.edges.length} ${data.edges.length === 1 ? 'link' : 'links'}.`;
    const showPicture = !isPhone && shape === 'picture' && layout !== null;
    body = (
      <View style={styles.stack}>
        <View style={styles.header}>
          <Text testID="lineage-summary">{summary}</Text>
          {isPhone ? null : (
            <ChoiceChips
              label="Show the lineage as"
              hideLabel
              choices={SHAPE_CHOICES}
              value={shape}
              onChange={setShape}
              testID="lineage-shape"
            />
          )}
        </View>
        {data.nodes.length <= 1 ? (
          <Text tone="muted" testID="lineage-alone">
            Nothing is recorded before or after this record yet: it was registered directly and nothing has been made from it.
          </Text>
        ) : null}
        {showPicture ? (
          <LineageCanvas layout={layout} focusCode={data.code} onOpen={open} />
        ) : (
          <Card>
            <LineageGenerationList graph={data} onOpen={open} />
          </Card>
        )}
      </View>
    );
  }

  return (
    <Screen
      title="Lineage picture"
      lead="Sources at the top, what was made from them below; each link is labelled with the step that made it."
      above={<BackToRecord code={code} />}
      width="wide"
      testID="lineage-screen"
    >
      {body}
    </Screen>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  header: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'center', justifyContent: 'space-between' },
});
