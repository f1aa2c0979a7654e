/**
 * Input limits shared by forms and the server. Passwords are capped so that hashing a huge
 * string cannot be used to tie up the server (common practice, no source); the lower bound
 * follows NIST SP 800-63B's minimum of 8, raised to 10 for a shared lab instrument.
 */
export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 128;
/** RFC 5321 limits a forward path to 256 octets including angle brackets, so 254 for the address. */
export const EMAIL_MAX_LENGTH = 254;
export const DISPLAY_NAME_MAX_LENGTH = 80;
/** Largest JSON body the API accepts; uploads go through their own multipart limits. */
export const JSON_BODY_LIMIT_BYTES = 100 * 1024;
/** Random link tokens: 32 bytes, base64url. */
export const LINK_TOKEN_LENGTH = 43;
