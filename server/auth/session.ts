import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import pg from 'pg';
import type { ServerConfig } from '../config';

export const SESSION_COOKIE = 'flakeline.sid';
const TWELVE_HOURS_MS = 12 * 60 * 60 * 1000;

/**
 * Sessions live in PostgreSQL so they survive restarts and any app server can serve any request.
 * The store gets its own small pool with an error listener: without one a PostgreSQL restart
 * would crash the process.
 */
export function createSessionMiddleware(config: ServerConfig) {
  const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 4 });
  pool.on('error', () => {
    // An idle client lost its connection; the pool replaces it on next use.
  });
  const PgStore = connectPgSimple(session);
  const store = new PgStore({ pool, tableName: 'session', pruneSessionInterval: 15 * 60 });
  const middleware = session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.publicBaseUrl.startsWith('https://'),
      maxAge: TWELVE_HOURS_MS,
    },
  });
  const close = async () => {
    store.close();
    await pool.end();
  };
  return { middleware, close };
}
