import { z } from 'zod';
import { DisplayNameField, EmailField, LinkTokenField, NewPasswordField, PasswordAttemptField } from './fields';
import { User } from './user';

export const SignInInput = z.object({ email: EmailField, password: PasswordAttemptField }).meta({ id: 'SignInInput' });
export type SignInInput = z.input<typeof SignInInput>;

export const CsrfToken = z.object({ csrfToken: z.string() }).meta({ id: 'CsrfToken' });
export type CsrfToken = z.infer<typeof CsrfToken>;

/** Signing in starts a fresh session, so it hands back that session's CSRF token. */
export const SignInResult = z.object({ user: User, csrfToken: z.string() }).meta({ id: 'SignInResult' });
export type SignInResult = z.infer<typeof SignInResult>;

export const CurrentSession = z.object({ user: User }).meta({ id: 'CurrentSession' });
export type CurrentSession = z.infer<typeof CurrentSession>;

export const ForgotPasswordInput = z.object({ email: EmailField }).meta({ id: 'ForgotPasswordInput' });
export type ForgotPasswordInput = z.input<typeof ForgotPasswordInput>;

export const LinkTokenParam = z.object({ token: LinkTokenField });

/** What an invitation link shows before the person chooses a password. */
export const InvitationPreview = z
  .object({ email: z.string(), displayName: z.string(), role: User.shape.role })
  .meta({ id: 'InvitationPreview' });
export type InvitationPreview = z.infer<typeof InvitationPreview>;

export const AcceptInvitationInput = z
  .object({ token: LinkTokenField, displayName: DisplayNameField, password: NewPasswordField })
  .meta({ id: 'AcceptInvitationInput' });
export type AcceptInvitationInput = z.input<typeof AcceptInvitationInput>;

export const ResetPasswordInput = z
  .object({ token: LinkTokenField, password: NewPasswordField })
  .meta({ id: 'ResetPasswordInput' });
export type ResetPasswordInput = z.input<typeof ResetPasswordInput>;

export const ChangePasswordInput = z
  .object({ currentPassword: PasswordAttemptField, newPassword: NewPasswordField })
  .meta({ id: 'ChangePasswordInput' });
export type ChangePasswordInput = z.input<typeof ChangePasswordInput>;

export const AccountUpdateInput = z.object({ displayName: DisplayNameField }).meta({ id: 'AccountUpdateInput' });
export type AccountUpdateInput = z.input<typeof AccountUpdateInput>;

export const Accepted = z.object({ message: z.string() }).meta({ id: 'Accepted' });
export type Accepted = z.infer<typeof Accepted>;
