import { StyleSheet, View } from 'react-native';
import type { LayerEstimate, RuleReference } from '@/shared/schemas/evidence-analysis';
import { space } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { estimateSentence } from './layer-words';

const MARK_WORDS: Record<RuleReference['mark'], string> = {
  published: 'published',
  computed_from_published: 'computed from published values',
  common_practice: 'common practice',
  from_memory: 'from memory',
};

export interface EstimateCardProps {
  estimate: LayerEstimate | null;
  references: readonly RuleReference[];
  notes: readonly string[];
}

/** The layer count one piece of evidence gives, the rule behind it with its sources, and its caveats. */
export function EstimateCard({ estimate, references, notes }: EstimateCardProps) {
  return (
    <Card title="Layer count from this evidence" testID="estimate-card">
      {estimate ? (
        <View style={styles.call}>
          <Text variant="heading" testID="estimate-layers">
            {estimateSentence(estimate)}
          </Text>
          <Text testID="estimate-basis">{estimate.basis}</Text>
        </View>
      ) : (
        <Text tone="muted" testID="estimate-none">
          This evidence does not give a layer count on its own; the notes below say why.
        </Text>
      )}
      {notes.length ? (
        <View style={styles.list} testID="estimate-notes">
          <Text variant="label">Notes and caveats</Text>
          {notes.map((note) => (
            <Text key={note}>{`• ${note}`}</Text>
          ))}
        </View>
      ) : null}
      {references.length ? (
        <View style={styles.list} testID="estimate-references">
          <Text variant="label">Rule and sources</Text>
          {references.map((reference) => (
            <View key={reference.text} style={styles.reference}>
              <Text variant="caption">{reference.text}</Text>
              <Text variant="caption" tone="muted">
                {reference.source.includes(MARK_WORDS[reference.mark])
                  ? reference.source
                  : `${reference.source} (${MARK_WORDS[reference.mark]})`}
              </Text>
            </View>
          ))}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  call: { gap: space.xs },
  list: { gap: space.xs },
  reference: { gap: space.xxs },
});
