import { Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS, SAMPLE_STATUS_LABELS } from '@/shared/samples';
import type { LineageGraph, LineageGraphNode } from '@/shared/schemas/lineage-graph';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Heading, Text } from '@/components/ui/text';
import { generationsInOrder } from './graph-layout';
import { generationTitle, layerCall, madeByIndex, type MadeBy } from './lineage-words';

export interface LineageGenerationListProps {
  graph: LineageGraph;
  onOpen: (code: string) => void;
}

/** The lineage picture for a phone: one generation after another, sources first, each record a row to tap. */
export function LineageGenerationList({ graph, onOpen }: LineageGenerationListProps) {
  const madeBy = madeByIndex(graph);
  return (
    <View style={styles.stack} testID="lineage-list">
      {generationsInOrder(graph.nodes).map(([generation, nodes]) => (
        <View key={generation} style={styles.generation} testID={`lineage-generation-${generation}`}>
          <Heading level={2}>{generationTitle(generation)}</Heading>
          <View style={styles.rows} role="list">
            {nodes.map((node) => (
              <NodeRow
                key={node.code}
                node={node}
                madeBy={madeBy.get(node.code) ?? null}
                focused={node.code === graph.code}
                onOpen={onOpen}
              />
            ))}
          </View>
        </View>
      ))}
    </View>
  );
}

interface NodeRowProps {
  node: LineageGraphNode;
  madeBy: MadeBy | null;
  focused: boolean;
  onOpen: (code: string) => void;
}

function NodeRow({ node, madeBy, focused, onOpen }: NodeRowProps) {
  const { colors } = useTheme();
  const layers = layerCall(node);
  const status = node.status === 'ready' || node.status === 'in_process' ? null : SAMPLE_STATUS_LABELS[node.status];
  const facts = [`${SAMPLE_KIND_LABELS[node.kind]} · ${node.material}`, layers, status].filter(Boolean).join(' · ');
  const origin = madeBy ? `Made by ${madeBy.steps} from ${madeBy.parentCodes.join(', ')}` : 'A source: registered directly';
  return (
    <View role="listitem">
      <Pressable
        accessibilityRole="link"
        accessibilityLabel={`${node.code}, ${facts}. ${origin}.${focused ? ' This record.' : ''}`}
        onPress={() => onOpen(node.code)}
        testID={`lineage-row-${node.code}`}
        style={({ pressed }) => [
          styles.row,
          {
            borderColor: focused ? colors.primary : colors.hairline,
            borderWidth: focused ? sizes.focusRing - 1 : sizes.hairline,
            backgroundColor: pressed ? colors.sunken : focused ? colors.primarySoft : colors.surface,
          },
        ]}
      >
        <Text variant="code" tone="primary" style={focused ? { color: colors.onPrimarySoft } : null}>
          {node.code}
          {focused ? '  · this record' : ''}
        </Text>
        {node.name ? <Text variant="label">{node.name}</Text> : null}
        <Text variant="caption">{facts}</Text>
        <Text variant="caption" tone="muted">
          {origin}
        </Text>
      </Pressable>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.xl },
  generation: { gap: space.sm },
  rows: { gap: space.sm },
  row: {
    minHeight: sizes.touchTarget,
    borderRadius: radii.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    gap: space.xxs,
  },
});
