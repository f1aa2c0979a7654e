import type { Request } from 'express';
import {
  AcceptInvitationInput,
  Accepted,
  CsrfToken,
  CurrentSession,
  ForgotPasswordInput,
  InvitationPreview,
  LinkTokenParam,
  ResetPasswordInput,
  SignInInput,
  SignInResult,
} from '../../../shared/schemas/auth';
import type { AppContext } from '../../app-context';
import { SESSION_COOKIE } from '../../auth/session';
import { AppError } from '../../errors';
import { logError } from '../../log';
import { route, type AnyRouteSpec } from '../../http/route';
import { UserModel } from '../../models/user-model';
import { presentUser } from '../../presenters/user-presenter';
import { acceptInvitation, previewInvitation } from '../../services/invitations';
import { requestPasswordReset, resetPassword } from '../../services/password-resets';
import { endSessionsOf } from '../../services/people';
import { resetRequestLimiter, signInLimiters } from './sign-in-limits';

const TAG = 'Sign-in';

function logIn(req: Request, user: UserModel): Promise<void> {
  // passport regenerates the session here, so a session id known before sign-in is useless after.
  return new Promise((resolve, reject) => req.logIn(user, (error) => (error ? reject(error) : resolve())));
}

async function startSession(context: AppContext, req: Request, user: UserModel) {
  await logIn(req, user);
  const signedIn = await user.$query().patchAndFetch({ lastSignInAt: new Date() });
  return { user: presentUser(signedIn), csrfToken: context.csrf.generateToken(req, true) };
}

export function authRoutes(context: AppContext): AnyRouteSpec[] {
  return [
    route({
      method: 'get',
      path: '/auth/csrf',
      tag: TAG,
      summary: 'Token to send as x-csrf-token with every mutating request of this cookie session',
      access: 'public',
      response: CsrfToken,
      handler: ({ req }) => ({ csrfToken: context.csrf.generateToken(req) }),
    }),
    route({
      method: 'post',
      path: '/auth/sign-in',
      tag: TAG,
      summary: 'Sign in with e-mail and password; starts a new session and returns its CSRF token',
      access: 'public',
      before: signInLimiters(context.config.signInLimits),
      body: SignInInput,
      response: SignInResult,
      errors: [401, 403, 429],
      handler: ({ req, body }) =>
        new Promise((resolve, reject) => {
          req.body = body;
          context.passport.authenticate('local', { session: false }, (error: unknown, user: UserModel | false) => {
            if (error || !user) return reject(error);
            startSession(context, req, user).then(resolve, reject);
          })(req, req.res, reject);
        }),
    }),
    route({
      method: 'post',
      path: '/auth/sign-out',
      tag: TAG,
      summary: 'End this session',
      access: 'signed-in',
      handler: ({ req, res }) =>
        new Promise<void>((resolve, reject) => {
          req.logout((logoutError) => {
            if (logoutError) return reject(logoutError);
            req.session.destroy((destroyError) => {
              if (destroyError) return reject(destroyError);
              res.clearCookie(SESSION_COOKIE);
              resolve();
            });
          });
        }),
    }),
    route({
      method: 'get',
      path: '/auth/session',
      tag: TAG,
      summary: 'The signed-in person, or 401 when signed out',
      access: 'signed-in',
      response: CurrentSession,
      handler: ({ user }) => ({ user: presentUser(user) }),
    }),
    route({
      method: 'post',
      path: '/auth/password-reset-requests',
      tag: TAG,
      summary: 'E-mail a password reset link (answers the same whether or not the address has an account, or the mail went out)',
      access: 'public',
      before: [resetRequestLimiter(context.config.signInLimits)],
      body: ForgotPasswordInput,
      response: Accepted,
      successStatus: 202,
      errors: [429],
      handler: async ({ body }) => {
        try {
          await context.knex.transaction((trx) =>
            requestPasswordReset({
              trx,
              email: body.email,
              mailer: context.mailer,
              publicBaseUrl: context.config.publicBaseUrl,
              ttlMinutes: context.config.passwordResetTtlMinutes,
            }),
          );
        } catch (error) {
          // Answering 503 only for real accounts would tell a stranger which addresses exist.
          if (!(error instanceof AppError && error.code === 'mail_unavailable')) throw error;
          logError('A password reset e-mail could not be sent', error);
        }
        return { message: 'If that address has an active account, a reset link is on its way.' };
      },
    }),
    route({
      method: 'post',
      path: '/auth/password-resets',
      tag: TAG,
      summary: 'Choose a new password with a reset link; signs the person out everywhere',
      access: 'public',
      body: ResetPasswordInput,
      response: Accepted,
      errors: [404, 410],
      handler: async ({ body }) => {
        const person = await context.knex.transaction((trx) => resetPassword({ trx, ...body }));
        await endSessionsOf(context.knex, person.id);
        return { message: 'Your password has been changed. Sign in with the new one.' };
      },
    }),
    route({
      method: 'get',
      path: '/auth/invitations/:token',
      tag: TAG,
      summary: 'Who an invitation link is for, before they choose a password',
      access: 'public',
      params: LinkTokenParam,
      response: InvitationPreview,
      errors: [404, 410],
      handler: async ({ params }) => {
        const person = await previewInvitation(params.token);
        return { email: person.email, displayName: person.displayName, role: person.role };
      },
    }),
    route({
      method: 'post',
      path: '/auth/invitations/accept',
      tag: TAG,
      summary: 'Accept an invitation: choose a password, activate the account and sign in',
      access: 'public',
      body: AcceptInvitationInput,
      response: SignInResult,
      errors: [404, 409, 410],
      handler: async ({ req, body }) => {
        const person = await context.knex.transaction((trx) => acceptInvitation({ trx, ...body }));
        return startSession(context, req, person);
      },
    }),
  ];
}
