import type { Knex } from 'knex';
import type passport from 'passport';
import type { createCsrf } from './auth/csrf';
import type { ServerConfig } from './config';
import type { FileStore } from './files/file-store';
import type { Mailer } from './mail/mailer';

/** What route factories need from the running app. */
export interface AppContext {
  config: ServerConfig;
  knex: Knex;
  mailer: Mailer;
  passport: passport.Authenticator;
  csrf: ReturnType<typeof createCsrf>;
  /** Uploaded evidence files, checksummed on every read. */
  files: FileStore;
}
