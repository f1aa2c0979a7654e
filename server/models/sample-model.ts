import type { QueryBuilder } from 'objection';
import type { SampleKind, SampleStatus } from '../../shared/samples';
import type { SampleProperties } from '../../shared/schemas/sample';
import { BaseModel } from './base-model';
import { UserModel } from './user-model';

export class SampleModel extends BaseModel {
  static override tableName = 'samples';
  static override tracksUpdatedAt = true;
  static override jsonAttributes = ['properties'];

  id!: number;
  code!: string;
  kind!: SampleKind;
  material!: string;
  name!: string | null;
  status!: SampleStatus;
  ownerId!: number;
  note!: string | null;
  properties!: SampleProperties;
  layerEstimate!: number | null;
  version!: number;
  retiredReason!: string | null;
  createdById!: number | null;
  createdAt!: Date;
  updatedAt!: Date;
  owner?: UserModel;

  static override relationMappings = () => ({
    owner: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'samples.ownerId', to: 'users.id' },
    },
  });

  static override modifiers = {
    summaryColumns(query: QueryBuilder<SampleModel>) {
      query.select('samples.id', 'code', 'kind', 'material', 'name', 'status', 'layerEstimate');
    },
  };
}
