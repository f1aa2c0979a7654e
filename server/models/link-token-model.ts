import { BaseModel } from './base-model';
import { UserModel } from './user-model';

export type LinkPurpose = 'invitation' | 'password_reset';

/** A one-time link sent by e-mail: an invitation or a password reset. */
export class LinkTokenModel extends BaseModel {
  static override tableName = 'link_tokens';

  id!: number;
  userId!: number;
  purpose!: LinkPurpose;
  tokenHash!: string;
  expiresAt!: Date;
  usedAt!: Date | null;
  revokedAt!: Date | null;
  createdAt!: Date;
  user?: UserModel;

  static override relationMappings = () => ({
    user: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'link_tokens.userId', to: 'users.id' },
    },
  });
}
