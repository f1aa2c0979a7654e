import type { Knex } from 'knex';
import type { Step } from '../../shared/schemas/step';
import type { StepModel } from '../models/step-model';
import { UserModel } from '../models/user-model';
import { presentSampleSummary } from './sample-presenter';

interface Participant {
  role: 'input' | 'treated' | 'output';
  consumed: boolean;
  code: string;
  kind: Step['outputs'][number]['kind'];
  material: string;
  name: string | null;
  status: Step['outputs'][number]['status'];
  layerEstimate: number | null;
}

export async function presentStep(knex: Knex, step: StepModel): Promise<Step> {
  const [operator, participants] = await Promise.all([
    step.operatorId ? UserModel.query(knex).findById(step.operatorId) : null,
    knex('step_samples as ss')
      .join('samples as s', 's.id', 'ss.sample_id')
      .where('ss.step_id', step.id)
      .orderBy(['ss.role', 'ss.position'])
      .select<Participant[]>(
        'ss.role',
        'ss.consumed',
        's.code',
        's.kind',
        's.material',
        's.name',
        's.status',
        's.layer_estimate',
      ),
  ]);
  const withRole = (role: Participant['role']) => participants.filter((row) => row.role === role);
  return {
    id: step.id,
    type: step.type,
    operator: operator ? { id: operator.id, displayName: operator.displayName } : null,
    startedAt: step.startedAt?.toISOString() ?? null,
    endedAt: step.endedAt?.toISOString() ?? null,
    instrument: step.instrument,
    notes: step.notes,
    parameters: step.parameters,
    inputs: withRole('input').map((row) => ({ ...presentSampleSummary(row), consumed: row.consumed })),
    treated: withRole('treated').map(presentSampleSummary),
    outputs: withRole('output').map(presentSampleSummary),
    createdAt: step.createdAt.toISOString(),
  };
}
