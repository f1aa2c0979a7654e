import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { SignInLimits } from '../../config';
import { tooManyAttempts } from '../../errors';

const clientAddress = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');
const attemptedEmail = (req: Request) => (typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '');

function limiter(windowMs: number, limit: number, key: (req: Request) => string, message: string): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    keyGenerator: key,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(tooManyAttempts(message)),
  });
}

/**
 * Failed sign-ins are limited per address+account (guessing one person's password) and per
 * address (trying many accounts). Counts are kept in this process; behind a load balancer use
 * a shared store (see DEVELOPERS.md).
 */
export function signInLimiters(limits: SignInLimits): RequestHandler[] {
  const minutes = Math.round(limits.windowMs / 60_000);
  return [
    limiter(
      limits.windowMs,
      limits.perAccount,
      (req) => `${clientAddress(req)}|${attemptedEmail(req)}`,
      `Too many failed sign-ins for this account. Wait ${minutes} minutes or reset your password.`,
    ),
    limiter(
      limits.windowMs,
      limits.perAddress,
      clientAddress,
      `Too many failed sign-ins from this device. Wait ${minutes} minutes.`,
    ),
  ];
}

/** Reset e-mails are limited per address so the form cannot flood someone's inbox. */
export function resetRequestLimiter(limits: SignInLimits): RequestHandler {
  return rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAccount,
    keyGenerator: clientAddress,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(tooManyAttempts('Too many reset requests from this device. Wait a while and try again.')),
  });
}

/** Wrong current passwords on the change-password form count per person, like failed sign-ins. */
export function passwordCheckLimiter(limits: SignInLimits): RequestHandler {
  return limiter(
    limits.windowMs,
    limits.perAccount,
    (req) => `person:${String((req.user as { id?: number } | undefined)?.id ?? clientAddress(req))}`,
    'Too many wrong current passwords. Wait a while, or sign out and reset your password.',
  );
}
