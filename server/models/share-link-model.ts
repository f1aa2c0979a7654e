import { BaseModel } from './base-model';
import { UserModel } from './user-model';

/** A read-only link to one record's audit; the token itself is never stored, only its SHA-256. */
export class ShareLinkModel extends BaseModel {
  static override tableName = 'share_links';

  id!: number;
  sampleId!: number;
  tokenSha256!: string;
  createdById!: number;
  createdAt!: Date;
  expiresAt!: Date;
  revokedAt!: Date | null;
  revokedById!: number | null;
  openCount!: number;
  lastOpenedAt!: Date | null;
  createdBy?: UserModel;
  revokedBy?: UserModel | null;

  static override relationMappings = () => ({
    createdBy: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'share_links.createdById', to: 'users.id' },
    },
    revokedBy: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'share_links.revokedById', to: 'users.id' },
    },
  });
}
