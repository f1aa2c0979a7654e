import type { QueryBuilder } from 'objection';
import type { Role } from '../../shared/roles';
import type { UserStatus } from '../../shared/schemas/user';
import { BaseModel } from './base-model';

export class UserModel extends BaseModel {
  static override tableName = 'users';

  id!: number;
  email!: string;
  displayName!: string;
  role!: Role;
  status!: UserStatus;
  passwordHash!: string | null;
  invitedById!: number | null;
  lastSignInAt!: Date | null;
  createdAt!: Date;
  updatedAt!: Date;

  static override tracksUpdatedAt = true;

  static override modifiers = {
    activeManagers(query: QueryBuilder<UserModel>) {
      query.where('role', 'manager').where('status', 'active');
    },
  };
}
