import { StyleSheet, View } from 'react-native';
import type { LineageEntry } from '@/shared/schemas/lineage';
import { space } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { Heading, Text } from '@/components/ui/text';
import { useSampleLineageQuery } from '@/hooks/use-samples';
import { stepTypePhrase } from './history-events';
import { SampleChip } from './sample-chip';
import { SectionStatus } from './section-status';

export type LineageDirection = 'ancestors' | 'descendants';

const COPY: Record<LineageDirection, { title: string; lead: string; none: string; what: string; testID: string }> = {
  ancestors: {
    title: 'Ancestry',
    lead: 'Generation 1 are its parents, generation 2 their parents, and so on back to the source.',
    none: 'Nothing came before it: it was registered directly.',
    what: 'the ancestry',
    testID: 'ancestry',
  },
  descendants: {
    title: 'Descendants',
    lead: 'Everything made from it, generation by generation.',
    none: 'Nothing has been made from it yet.',
    what: 'the descendants',
    testID: 'descendants',
  },
};

/** "exfoliation", or "transfer, stacking" when more than one step links it. */
function stepTypesOf(entry: LineageEntry): string {
  return [...new Set(entry.links.map((link) => stepTypePhrase(link.stepType)))].join(', ');
}

function byGeneration(relatives: readonly LineageEntry[]): [number, LineageEntry[]][] {
  const groups = new Map<number, LineageEntry[]>();
  for (const entry of relatives) groups.set(entry.generation, [...(groups.get(entry.generation) ?? []), entry]);
  return [...groups.entries()].sort(([a], [b]) => a - b);
}

/** A sample's ancestors or descendants, one generation after another, with the steps linking them. */
export function LineageCard({ code, direction }: { code: string; direction: LineageDirection }) {
  const lineage = useSampleLineageQuery(code, direction);
  const copy = COPY[direction];
  const generations = lineage.data ? byGeneration(lineage.data.relatives) : [];
  return (
    <Card title={copy.title} lead={copy.lead} testID={copy.testID}>
      {!lineage.data ? (
        <SectionStatus query={lineage} what={copy.what} />
      ) : generations.length === 0 ? (
        <Text tone="muted">{copy.none}</Text>
      ) : (
        generations.map(([generation, entries]) => (
          <View key={generation} style={styles.generation} testID={`${copy.testID}-generation-${generation}`}>
            <Heading level={3}>{`Generation ${generation}`}</Heading>
            <View style={styles.entries}>
              {entries.map((entry) => (
                <SampleChip key={entry.code} sample={entry} note={`by ${stepTypesOf(entry)}`} />
              ))}
            </View>
          </View>
        ))
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  generation: { gap: space.sm },
  entries: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
