import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { accountDeactivated, invalidCredentials } from '../errors';
import { UserModel } from '../models/user-model';
import { decoyPasswordHash, verifyPassword } from './passwords';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace -- passport types extend Express.User
  namespace Express {
    interface User extends UserModel {}
  }
}

/** Checks an e-mail and password; throws invalid_credentials or account_deactivated. */
export async function checkCredentials(email: string, password: string): Promise<UserModel> {
  const user = await UserModel.query().findOne({ email });
  if (!user || !user.passwordHash) {
    await verifyPassword(await decoyPasswordHash(), password);
    throw invalidCredentials();
  }
  if (!(await verifyPassword(user.passwordHash, password))) throw invalidCredentials();
  if (user.status === 'deactivated') throw accountDeactivated();
  if (user.status !== 'active') throw invalidCredentials();
  return user;
}

/**
 * One passport instance per app. The session keeps only the user id; each request reloads the
 * person, so a role change or deactivation takes effect at once.
 */
export function createPassport(): passport.Authenticator {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      checkCredentials(email, password).then(
        (user) => done(null, user),
        (error) => done(error),
      );
    }),
  );
  instance.serializeUser((user, done) => done(null, (user as UserModel).id));
  instance.deserializeUser((id: number, done) => {
    UserModel.query()
      .findById(id)
      .then(
        (user) => done(null, user && user.status === 'active' ? user : false),
        (error) => done(error),
      );
  });
  return instance;
}
