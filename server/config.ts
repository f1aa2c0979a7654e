import path from 'node:path';

export interface SignInLimits {
  windowMs: number;
  /** Failed attempts allowed per address and account in one window. */
  perAccount: number;
  /** Failed attempts allowed per address over all accounts in one window. */
  perAddress: number;
}

export interface ServerConfig {
  databaseUrl: string;
  sessionSecret: string;
  /** Where people reach Flakeline; links in e-mail and QR labels start with it. */
  publicBaseUrl: string;
  host: string;
  port: number;
  /** Set when the server sits behind a TLS-terminating proxy. */
  trustProxy: boolean;
  smtp: { host: string; port: number; from: string };
  /** Folder the local mail sink writes to; null when mail goes to a real server. */
  mailSinkDir: string | null;
  signInLimits: SignInLimits;
  webDistDir: string;
  invitationTtlHours: number;
  passwordResetTtlMinutes: number;
  /** Where uploaded evidence files are kept: a local folder (default) or an S3-compatible bucket. */
  storage: StorageConfig;
}

export type StorageConfig =
  | { backend: 'local'; dir: string }
  | {
      backend: 's3';
      endpoint: string;
      bucket: string;
      region: string;
      accessKeyId: string;
      secretAccessKey: string;
    };

/** STORAGE_BACKEND=s3 with S3_ENDPOINT, S3_BUCKET, S3_REGION, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY; else STORAGE_DIR. */
function storageFromEnv(env: Record<string, string | undefined>): StorageConfig {
  const backend = env.STORAGE_BACKEND ?? 'local';
  if (backend === 'local') {
    return { backend, dir: env.STORAGE_DIR ? path.resolve(env.STORAGE_DIR) : path.join(REPO_ROOT, 'storage', 'blobs') };
  }
  if (backend !== 's3') throw new Error(`STORAGE_BACKEND is "local" or "s3", got "${backend}"`);
  const required = (name: string): string => {
    const value = env[name];
    if (!value) throw new Error(`${name} is not set (needed with STORAGE_BACKEND=s3).`);
    return value;
  };
  return {
    backend,
    endpoint: required('S3_ENDPOINT'),
    bucket: required('S3_BUCKET'),
    region: env.S3_REGION ?? 'us-east-1',
    accessKeyId: required('S3_ACCESS_KEY_ID'),
    secretAccessKey: required('S3_SECRET_ACCESS_KEY'),
  };
}

export const REPO_ROOT = path.resolve(__dirname, '..');
export const DATA_DIR = path.join(REPO_ROOT, '.data');

function numberFrom(value: string | undefined, fallback: number): number {
  if (value === undefined || value === '') return fallback;
  const parsed = Number(value);
  if (!Number.isFinite(parsed)) throw new Error(`Expected a number, got "${value}"`);
  return parsed;
}

/** Reads the server's settings from the environment, with the defaults a lab machine needs. */
export function configFromEnv(env: Record<string, string | undefined> = process.env): ServerConfig {
  const port = numberFrom(env.PORT, 8080);
  const host = env.HOST ?? '127.0.0.1';
  if (!env.DATABASE_URL) throw new Error('DATABASE_URL is not set.');
  if (!env.SESSION_SECRET) throw new Error('SESSION_SECRET is not set.');
  const publicBaseUrl = (env.PUBLIC_BASE_URL ?? `http://${host}:${port}`).replace(/\/+$/, '');
  return {
    databaseUrl: env.DATABASE_URL,
    sessionSecret: env.SESSION_SECRET,
    publicBaseUrl,
    host,
    port,
    trustProxy: env.TRUST_PROXY === '1',
    smtp: {
      host: env.SMTP_HOST ?? '127.0.0.1',
      port: numberFrom(env.SMTP_PORT, 2526),
      from: env.MAIL_FROM ?? 'Flakeline <flakeline@localhost>',
    },
    mailSinkDir: env.MAIL_SINK_DIR ? path.resolve(env.MAIL_SINK_DIR) : null,
    signInLimits: {
      windowMs: numberFrom(env.SIGN_IN_WINDOW_MINUTES, 15) * 60_000,
      perAccount: numberFrom(env.SIGN_IN_LIMIT_PER_ACCOUNT, 8),
      perAddress: numberFrom(env.SIGN_IN_LIMIT_PER_ADDRESS, 40),
    },
    webDistDir: env.WEB_DIST_DIR ? path.resolve(env.WEB_DIST_DIR) : path.join(REPO_ROOT, 'dist'),
    invitationTtlHours: numberFrom(env.INVITATION_TTL_HOURS, 72),
    passwordResetTtlMinutes: numberFrom(env.PASSWORD_RESET_TTL_MINUTES, 60),
    storage: storageFromEnv(env),
  };
}
