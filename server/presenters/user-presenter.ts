import type { User } from '../../shared/schemas/user';
import type { UserModel } from '../models/user-model';

/** The fields of a person the API shows; never the password hash. */
export function presentUser(user: UserModel): User {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    status: user.status,
    createdAt: user.createdAt.toISOString(),
    lastSignInAt: user.lastSignInAt ? user.lastSignInAt.toISOString() : null,
  };
}
