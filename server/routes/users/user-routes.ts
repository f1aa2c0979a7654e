import { z } from 'zod';
import { Accepted } from '../../../shared/schemas/auth';
import { IdParam } from '../../../shared/schemas/fields';
import { InviteUserInput, User, UserList, UserUpdateInput } from '../../../shared/schemas/user';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { UserModel } from '../../models/user-model';
import { presentUser } from '../../presenters/user-presenter';
import { invitePerson, resendInvitation, type InvitationSettings } from '../../services/invitations';
import { updatePerson } from '../../services/people';

const TAG = 'People';
const MANAGERS = ['manager'] as const;
const UserEnvelope = z.object({ user: User }).meta({ id: 'UserEnvelope' });

export function userRoutes(context: AppContext): AnyRouteSpec[] {
  const invitationSettings: InvitationSettings = {
    mailer: context.mailer,
    publicBaseUrl: context.config.publicBaseUrl,
    ttlHours: context.config.invitationTtlHours,
  };
  return [
    route({
      method: 'get',
      path: '/users',
      tag: TAG,
      summary: 'Everyone with an account in this lab',
      access: MANAGERS,
      response: UserList,
      handler: async () => ({
        users: (await UserModel.query().orderBy([{ column: 'status' }, { column: 'displayName' }])).map(presentUser),
      }),
    }),
    route({
      method: 'post',
      path: '/users/invitations',
      tag: TAG,
      summary: 'Invite a person by e-mail; they choose their password through the link',
      access: MANAGERS,
      body: InviteUserInput,
      response: UserEnvelope,
      successStatus: 201,
      errors: [409, 503],
      handler: async ({ user, body }) => {
        const person = await context.knex.transaction((trx) =>
          invitePerson({ trx, inviter: user, ...body, settings: invitationSettings }),
        );
        return { user: presentUser(person) };
      },
    }),
    route({
      method: 'patch',
      path: '/users/:id',
      tag: TAG,
      summary: "Change a person's role, or deactivate / reactivate them",
      access: MANAGERS,
      params: IdParam,
      body: UserUpdateInput,
      response: UserEnvelope,
      errors: [404, 409],
      handler: async ({ params, body }) => {
        const person = await context.knex.transaction((trx) => updatePerson({ trx, id: params.id, ...body }));
        return { user: presentUser(person) };
      },
    }),
    route({
      method: 'post',
      path: '/users/:id/invitation',
      tag: TAG,
      summary: 'Send a fresh invitation link (earlier links stop working)',
      access: MANAGERS,
      params: IdParam,
      response: Accepted,
      successStatus: 202,
      errors: [404, 409, 503],
      handler: async ({ user, params }) => {
        const person = await context.knex.transaction((trx) =>
          resendInvitation({ trx, inviter: user, personId: params.id, settings: invitationSettings }),
        );
        return { message: `A new invitation is on its way to ${person.email}.` };
      },
    }),
  ];
}
