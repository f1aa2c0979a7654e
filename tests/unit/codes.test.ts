import {
  BASE32_SYMBOLS,
  CHECK_SYMBOLS,
  checkSymbol,
  decodeBase32,
  encodeBase32,
  formatCode,
  parseCode,
} from '../../shared/codes';

const PREFIXES = ['CH', 'CR', 'FK', 'BX'];

// Douglas Crockford, "Base 32" (crockford.com/base32.html): 32 symbols, 0-9 and A-Z without
// I, L, O and U; five more check symbols * ~ $ = U for check values 32-36; the check symbol is
// the value modulo 37; on decoding, case is ignored, I and L read as 1, O as 0, hyphens ignored.
describe('Crockford Base32 symbols', () => {
  it('uses the published encode set and check set', () => {
    expect(BASE32_SYMBOLS).toBe('0123456789ABCDEFGHJKMNPQRSTVWXYZ');
    expect(CHECK_SYMBOLS).toBe('0123456789ABCDEFGHJKMNPQRSTVWXYZ*~$=U');
  });

  // Worked by hand from the definition above.
  it.each([
    [0, '0', '0'],
    [31, 'Z', 'Z'],
    [32, '10', '*'],
    [33, '11', '~'],
    [34, '12', '$'],
    [35, '13', '='],
    [36, '14', 'U'],
    [37, '15', '0'],
    [1234, '16J', 'D'], // 1234 = 1·1024 + 6·32 + 18 (J); 1234 = 33·37 + 13, and check symbol 13 is D
  ])('value %i encodes as %s with check symbol %s', (value, symbols, check) => {
    expect(encodeBase32(value, symbols.length)).toBe(symbols);
    expect(checkSymbol(value)).toBe(check);
    expect(decodeBase32(symbols)).toBe(value);
  });

  it('decodes look-alikes and lower case the way the description says', () => {
    expect(decodeBase32('1o')).toBe(32);
    expect(decodeBase32('Io')).toBe(32);
    expect(decodeBase32('lO')).toBe(32);
  });
});

describe('parseCode', () => {
  const code = formatCode('CH', 0x1f3a5c7);

  it('formats a prefix, six symbols and the check symbol', () => {
    expect(code).toMatch(/^CH-[0-9A-HJKMNP-TV-Z]{6}[0-9A-HJKMNP-TV-Z*~$=U]$/);
  });

  it('forgives case, spaces, hyphens and the look-alikes O, I and L', () => {
    const body = code.slice(3);
    const typed = ` ch ${body.slice(0, 3).toLowerCase()}-${body.slice(3)} `.replace(/0/g, 'o').replace(/1/g, 'l');
    expect(parseCode(typed, PREFIXES)).toEqual({ ok: true, code, prefix: 'CH', value: 0x1f3a5c7 });
  });

  it('reports a wrong symbol as a typo, not as an unknown code', () => {
    const body = code.slice(3, 9);
    const changed = body[2] === '7' ? '8' : '7';
    const result = parseCode(`CH-${body.slice(0, 2)}${changed}${body.slice(3)}${code.at(-1)}`, PREFIXES);
    expect(result).toMatchObject({ ok: false, reason: 'check_failed' });
  });

  it('catches every single-symbol substitution and every swap of neighbours (mod 37 is prime)', () => {
    let missed = 0;
    for (let trial = 0; trial < 300; trial += 1) {
      const value = Math.floor(Math.random() * 32 ** 6);
      const symbols = encodeBase32(value, 6);
      const check = checkSymbol(value);
      for (let position = 0; position < 6; position += 1) {
        for (const replacement of BASE32_SYMBOLS) {
          if (replacement === symbols[position]) continue;
          const typo = symbols.slice(0, position) + replacement + symbols.slice(position + 1);
          if (parseCode(`FK${typo}${check}`, PREFIXES).ok) missed += 1;
        }
        if (position < 5 && symbols[position] !== symbols[position + 1]) {
          const swapped = symbols.slice(0, position) + symbols[position + 1] + symbols[position] + symbols.slice(position + 2);
          if (parseCode(`FK${swapped}${check}`, PREFIXES).ok) missed += 1;
        }
      }
    }
    expect(missed).toBe(0);
  });

  it.each(['', 'CH', 'XX-123456A', 'CH-12345', 'CH-1234567890', 'https://example.org/s/CH-000000'])(
    'calls %p not a code',
    (input) => {
      expect(parseCode(input, PREFIXES)).toMatchObject({ ok: false, reason: 'malformed' });
    },
  );
});
