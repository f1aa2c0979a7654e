import { csrfSync } from 'csrf-sync';

/**
 * Synchroniser-token CSRF defence: the token lives in the session and every mutating request
 * must echo it in the `x-csrf-token` header. Multipart uploads send it the same way.
 */
export function createCsrf() {
  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => {
      const header = req.headers['x-csrf-token'];
      return Array.isArray(header) ? header[0] : header;
    },
  });
  return { protect: csrfSynchronisedProtection, generateToken };
}
