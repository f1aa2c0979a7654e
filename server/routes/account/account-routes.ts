import { AccountUpdateInput, Accepted, ChangePasswordInput, CurrentSession } from '../../../shared/schemas/auth';
import type { AppContext } from '../../app-context';
import { checkCredentials } from '../../auth/passport';
import { hashPassword } from '../../auth/passwords';
import { route, type AnyRouteSpec } from '../../http/route';
import { presentUser } from '../../presenters/user-presenter';
import { endSessionsOf } from '../../services/people';
import { passwordCheckLimiter } from '../auth/sign-in-limits';

const TAG = 'Account';

export function accountRoutes(context: AppContext): AnyRouteSpec[] {
  return [
    route({
      method: 'patch',
      path: '/account',
      tag: TAG,
      summary: 'Change your display name',
      access: 'signed-in',
      body: AccountUpdateInput,
      response: CurrentSession,
      handler: async ({ user, body }) => ({
        user: presentUser(await user.$query().patchAndFetch({ displayName: body.displayName })),
      }),
    }),
    route({
      method: 'post',
      path: '/account/password',
      tag: TAG,
      summary: 'Change your password; other sessions of yours are signed out',
      access: 'signed-in',
      before: [passwordCheckLimiter(context.config.signInLimits)],
      body: ChangePasswordInput,
      response: Accepted,
      errors: [401, 429],
      handler: async ({ user, body, req }) => {
        await checkCredentials(user.email, body.currentPassword);
        await user.$query().patch({ passwordHash: await hashPassword(body.newPassword) });
        await endSessionsOf(context.knex, user.id, req.sessionID);
        return { message: 'Password changed. Your other sessions have been signed out.' };
      },
    }),
  ];
}
