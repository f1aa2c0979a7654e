/**
 * Short record codes people can read aloud and type: a kind prefix, six Crockford Base32
 * characters and Crockford's check symbol (Douglas Crockford, "Base32", crockford.com/base32):
 * the value modulo 37, written with the 32 symbols plus * ~ $ = U.
 * Example: CH-4F7K2M followed by its check symbol.
 */
export const BASE32_SYMBOLS = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
export const CHECK_SYMBOLS = `${BASE32_SYMBOLS}*~$=U`;
export const CODE_BODY_LENGTH = 6;

/** Crockford's decoding folds look-alikes: O→0, I and L→1; hyphens and spaces are ignored. */
function foldLookAlikes(text: string): string {
  return text.toUpperCase().replace(/[\s-]/g, '').replace(/O/g, '0').replace(/[IL]/g, '1');
}

export function encodeBase32(value: number, length: number): string {
  let rest = value;
  let out = '';
  for (let i = 0; i < length; i += 1) {
    out = BASE32_SYMBOLS[rest % 32] + out;
    rest = Math.floor(rest / 32);
  }
  return out;
}

export function decodeBase32(symbols: string): number {
  let value = 0;
  for (const symbol of foldLookAlikes(symbols)) {
    const digit = BASE32_SYMBOLS.indexOf(symbol);
    if (digit < 0) throw new Error(`"${symbol}" is not a Base32 symbol`);
    value = value * 32 + digit;
  }
  return value;
}

export function checkSymbol(value: number): string {
  return CHECK_SYMBOLS[value % 37];
}

/** Builds a code from a prefix and a number below 32^6. */
export function formatCode(prefix: string, value: number): string {
  if (!Number.isInteger(value) || value < 0 || value >= 32 ** CODE_BODY_LENGTH) {
    throw new Error(`Code value out of range: ${value}`);
  }
  return `${prefix}-${encodeBase32(value, CODE_BODY_LENGTH)}${checkSymbol(value)}`;
}

export type ParsedCode =
  | { ok: true; code: string; prefix: string; value: number }
  | { ok: false; reason: 'malformed' | 'check_failed'; message: string };

/**
 * Reads a typed or scanned code forgivingly: any case, spaces and hyphens anywhere, and the
 * look-alikes O, I and L. A failing check symbol is reported as a typo, not as "not found".
 */
export function parseCode(input: string, knownPrefixes: readonly string[]): ParsedCode {
  const compact = input.toUpperCase().replace(/[\s-]/g, '');
  const prefix = knownPrefixes.find((candidate) => compact.startsWith(candidate));
  const body = prefix ? compact.slice(prefix.length) : '';
  if (!prefix || body.length !== CODE_BODY_LENGTH + 1) {
    return { ok: false, reason: 'malformed', message: `"${input.trim()}" is not a Flakeline code.` };
  }
  const data = foldLookAlikes(body.slice(0, CODE_BODY_LENGTH));
  const check = foldLookAlikes(body[CODE_BODY_LENGTH]);
  if (![...data].every((symbol) => BASE32_SYMBOLS.includes(symbol)) || !CHECK_SYMBOLS.includes(check)) {
    return { ok: false, reason: 'malformed', message: `"${input.trim()}" is not a Flakeline code.` };
  }
  const value = decodeBase32(data);
  if (checkSymbol(value) !== check) {
    return { ok: false, reason: 'check_failed', message: `This code has a typo: ${input.trim()} does not check out.` };
  }
  return { ok: true, code: formatCode(prefix, value), prefix, value };
}
