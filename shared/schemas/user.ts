import { z } from 'zod';
import { ROLES } from '../roles';
import { DisplayNameField, EmailField } from './fields';

export const RoleField = z.enum(ROLES, { error: 'Choose lab manager, researcher or reviewer.' });

/** invited: has a link but no password yet; active: can sign in; deactivated: kept for history, cannot sign in. */
export const USER_STATUSES = ['invited', 'active', 'deactivated'] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

export const User = z
  .object({
    id: z.number().int(),
    email: z.string(),
    displayName: z.string(),
    role: z.enum(ROLES),
    status: z.enum(USER_STATUSES),
    createdAt: z.iso.datetime(),
    lastSignInAt: z.iso.datetime().nullable(),
  })
  .meta({ id: 'User' });
export type User = z.infer<typeof User>;

export const UserList = z.object({ users: z.array(User) }).meta({ id: 'UserList' });
export type UserList = z.infer<typeof UserList>;

export const InviteUserInput = z
  .object({ email: EmailField, displayName: DisplayNameField, role: RoleField })
  .meta({ id: 'InviteUserInput' });
export type InviteUserInput = z.input<typeof InviteUserInput>;

/** A manager changes a person's role or (de)activates them; at least one field. */
export const UserUpdateInput = z
  .object({
    role: RoleField.optional(),
    status: z.enum(['active', 'deactivated'], { error: 'Choose active or deactivated.' }).optional(),
  })
  .refine((input) => input.role !== undefined || input.status !== undefined, {
    message: 'Say what to change: role or status.',
  })
  .meta({ id: 'UserUpdateInput' });
export type UserUpdateInput = z.input<typeof UserUpdateInput>;
