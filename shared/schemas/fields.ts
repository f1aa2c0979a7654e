import { z } from 'zod';
import { DISPLAY_NAME_MAX_LENGTH, EMAIL_MAX_LENGTH, LINK_TOKEN_LENGTH, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from './limits';

/** E-mail addresses are compared case-insensitively, so they are stored lower-case. */
export const EmailField = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .min(1, 'Enter an e-mail address.')
  .max(EMAIL_MAX_LENGTH, `An e-mail address has at most ${EMAIL_MAX_LENGTH} characters.`)
  .pipe(z.email('That does not look like an e-mail address.'))
  .transform((email) => email.toLowerCase());

/** A password being set. Existing passwords are checked with `PasswordAttemptField`. */
export const NewPasswordField = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`);

export const PasswordAttemptField = z
  .string({ error: 'Enter your password.' })
  .min(1, 'Enter your password.')
  .max(PASSWORD_MAX_LENGTH, `A password has at most ${PASSWORD_MAX_LENGTH} characters.`);

export const DisplayNameField = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(DISPLAY_NAME_MAX_LENGTH, `A name has at most ${DISPLAY_NAME_MAX_LENGTH} characters.`);

export const LinkTokenField = z
  .string({ error: 'The link is incomplete.' })
  .regex(new RegExp(`^[A-Za-z0-9_-]{${LINK_TOKEN_LENGTH}}$`), 'The link is incomplete or damaged.');

/** A record id in a path: plain decimal digits only (no `1e3`, `0x10` or leading zeros). */
export const IdParam = z.object({
  id: z
    .string()
    .regex(/^[1-9][0-9]{0,14}$/, 'Expected a numeric id.')
    .transform((digits) => Number(digits)),
});
