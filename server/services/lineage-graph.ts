import type { Knex } from 'knex';
import type { LineageGraph, LineageGraphEdge, LineageGraphNode } from '../../shared/schemas/lineage-graph';
import { presentSampleSummary } from '../presenters/sample-presenter';
import type { SampleModel } from '../models/sample-model';
import { lineageOf } from './lineage';

/**
 * The record, its ancestors and its descendants (one recursive query each), each once at its
 * nearest generation, and every parent → child link among them with the step that made it.
 */
export async function lineageGraphOf(knex: Knex, sample: SampleModel): Promise<LineageGraph> {
  const [ancestors, descendants] = await Promise.all([
    lineageOf(knex, sample.id, 'ancestors'),
    lineageOf(knex, sample.id, 'descendants'),
  ]);
  const strip = ({ links: _links, generation: _generation, ...summary }: (typeof ancestors)[number]) => summary;
  const nodes: LineageGraphNode[] = [
    ...ancestors.map((entry) => ({ ...strip(entry), generation: -entry.generation })),
    { ...presentSampleSummary(sample), generation: 0 },
    ...descendants.map((entry) => ({ ...strip(entry), generation: entry.generation })),
  ].sort((a, b) => a.generation - b.generation || a.code.localeCompare(b.code));
  const codes = nodes.map((node) => node.code);
  const rows: { parentCode: string; childCode: string; stepId: number; stepType: string; startedAt: Date | null }[] = await knex(
    'lineage_links as l',
  )
    .join('samples as p', 'p.id', 'l.parent_id')
    .join('samples as c', 'c.id', 'l.child_id')
    .join('steps as st', 'st.id', 'l.step_id')
    .whereIn('p.code', codes)
    .whereIn('c.code', codes)
    .orderBy(['l.step_id', 'p.code', 'c.code'])
    .select(
      'p.code as parentCode',
      'c.code as childCode',
      'st.id as stepId',
      'st.type as stepType',
      'st.started_at as startedAt',
    );
  const edges: LineageGraphEdge[] = rows.map((row) => ({
    parentCode: row.parentCode,
    childCode: row.childCode,
    step: { id: row.stepId, type: row.stepType, startedAt: row.startedAt ? new Date(row.startedAt).toISOString() : null },
  }));
  return { code: sample.code, nodes, edges };
}
