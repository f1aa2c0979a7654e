import type { StepType } from '../../shared/steps';
import { BaseModel } from './base-model';
import { UserModel } from './user-model';

export class StepModel extends BaseModel {
  static override tableName = 'steps';
  static override jsonAttributes = ['parameters'];

  id!: number;
  type!: StepType;
  operatorId!: number | null;
  startedAt!: Date | null;
  endedAt!: Date | null;
  instrument!: string | null;
  parameters!: Record<string, unknown>;
  notes!: string | null;
  createdById!: number | null;
  createdAt!: Date;
  operator?: UserModel | null;

  static override relationMappings = () => ({
    operator: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'steps.operatorId', to: 'users.id' },
    },
  });
}
