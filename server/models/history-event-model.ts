import { BaseModel } from './base-model';
import { UserModel } from './user-model';

/** One link of the append-only history chain. Rows are never updated or deleted. */
export class HistoryEventModel extends BaseModel {
  static override tableName = 'history_events';
  static override jsonAttributes = ['payload'];

  id!: number;
  occurredAt!: Date;
  actorId!: number | null;
  type!: string;
  subjectCode!: string | null;
  stepId!: number | null;
  payload!: Record<string, unknown>;
  body!: string;
  prevHash!: string;
  hash!: string;
  actor?: UserModel | null;

  static override relationMappings = () => ({
    actor: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'history_events.actorId', to: 'users.id' },
    },
  });
}
