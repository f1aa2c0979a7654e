import { EmailField, LinkTokenField, NewPasswordField } from '../../shared/schemas/fields';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '../../shared/schemas/limits';
import { InviteUserInput, UserUpdateInput } from '../../shared/schemas/user';

describe('EmailField', () => {
  it('trims and lower-cases, since addresses are compared without case', () => {
    expect(EmailField.parse('  Teo.Valcourt@Lab.Example ')).toBe('teo.valcourt@lab.example');
  });

  it.each(['', 'no-at-sign', 'two@@signs.example', 'space in@lab.example'])('refuses %p', (value) => {
    expect(EmailField.safeParse(value).success).toBe(false);
  });

  it('refuses an address longer than RFC 5321 allows (254 characters)', () => {
    const local = 'a'.repeat(64);
    const domain = `${'b'.repeat(63)}.${'c'.repeat(63)}.${'d'.repeat(63)}.example`;
    expect(`${local}@${domain}`.length).toBeGreaterThan(254);
    expect(EmailField.safeParse(`${local}@${domain}`).success).toBe(false);
  });
});

describe('NewPasswordField', () => {
  it('accepts the shortest and the longest allowed password', () => {
    expect(NewPasswordField.safeParse('x'.repeat(PASSWORD_MIN_LENGTH)).success).toBe(true);
    expect(NewPasswordField.safeParse('x'.repeat(PASSWORD_MAX_LENGTH)).success).toBe(true);
  });

  it('refuses one character too few or too many, with a message a person understands', () => {
    const short = NewPasswordField.safeParse('x'.repeat(PASSWORD_MIN_LENGTH - 1));
    const long = NewPasswordField.safeParse('x'.repeat(PASSWORD_MAX_LENGTH + 1));
    expect(short.success || long.success).toBe(false);
    expect(short.error?.issues[0].message).toBe(`Use at least ${PASSWORD_MIN_LENGTH} characters.`);
  });
});

describe('LinkTokenField', () => {
  it('accepts 32 random bytes in base64url (43 characters) and nothing else', () => {
    expect(LinkTokenField.safeParse(Buffer.alloc(32, 7).toString('base64url')).success).toBe(true);
    expect(LinkTokenField.safeParse('short').success).toBe(false);
    expect(LinkTokenField.safeParse(`${'a'.repeat(42)}/`).success).toBe(false);
  });
});

describe('InviteUserInput', () => {
  it('names every field that needs attention', () => {
    const result = InviteUserInput.safeParse({ email: 'x', displayName: ' ', role: 'intern' });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((issue) => issue.path.join('.')).sort()).toEqual(['displayName', 'email', 'role']);
  });
});

describe('UserUpdateInput', () => {
  it('needs at least one change', () => {
    expect(UserUpdateInput.safeParse({}).success).toBe(false);
    expect(UserUpdateInput.safeParse({ role: 'reviewer' }).success).toBe(true);
  });
});
