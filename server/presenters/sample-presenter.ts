import type { Knex } from 'knex';
import type { Sample, SampleListRow, SampleSummary } from '../../shared/schemas/sample';
import type { SampleModel } from '../models/sample-model';
import { UserModel } from '../models/user-model';
import { locationOf } from '../services/storage';

type SummaryFields = Pick<SampleModel, 'code' | 'kind' | 'material' | 'name' | 'status' | 'layerEstimate'>;

export function presentSampleSummary(sample: SummaryFields): SampleSummary {
  return {
    code: sample.code,
    kind: sample.kind,
    material: sample.material,
    name: sample.name,
    status: sample.status,
    layerEstimate: sample.layerEstimate,
  };
}

export function presentSampleListRow(sample: SampleModel & { ownerName: string }): SampleListRow {
  return {
    ...presentSampleSummary(sample),
    owner: { id: sample.ownerId, displayName: sample.ownerName },
    createdAt: sample.createdAt.toISOString(),
    updatedAt: sample.updatedAt.toISOString(),
  };
}

const SUMMARY_COLUMNS = ['s.code', 's.kind', 's.material', 's.name', 's.status', 's.layer_estimate as layerEstimate'];

/**
 * A sample with its owner, the step that made it, and its direct parents and children. Queries
 * run one after another: inside a transaction they share one connection.
 */
export async function presentSample(knex: Knex, sample: SampleModel): Promise<Sample> {
  const owner = await UserModel.query(knex).findById(sample.ownerId);
  const madeBy = await knex('step_samples as ss')
    .join('steps as st', 'st.id', 'ss.step_id')
    .where({ 'ss.sample_id': sample.id, 'ss.role': 'output' })
    .orderBy('st.id')
    .first('st.id as stepId', 'st.type', 'st.started_at as startedAt');
  const parents = await knex('lineage_links as l')
    .join('samples as s', 's.id', 'l.parent_id')
    .where('l.child_id', sample.id)
    .distinct(SUMMARY_COLUMNS)
    .orderBy('s.code');
  const children = await knex('lineage_links as l')
    .join('samples as s', 's.id', 'l.child_id')
    .where('l.parent_id', sample.id)
    .distinct(SUMMARY_COLUMNS)
    .orderBy('s.code');
  return {
    ...presentSampleSummary(sample),
    note: sample.note,
    owner: { id: sample.ownerId, displayName: owner?.displayName ?? 'Unknown' },
    properties: sample.properties ?? {},
    version: sample.version,
    retiredReason: sample.retiredReason,
    createdAt: sample.createdAt.toISOString(),
    updatedAt: sample.updatedAt.toISOString(),
    madeBy: madeBy
      ? {
          stepId: madeBy.stepId,
          type: madeBy.type,
          startedAt: madeBy.startedAt ? new Date(madeBy.startedAt).toISOString() : null,
        }
      : null,
    parents: parents.map(presentSampleSummary),
    children: children.map(presentSampleSummary),
    location: await locationOf(knex, sample.id),
  };
}
