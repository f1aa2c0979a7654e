import {
  abs,
  abs2,
  add,
  complex,
  conj,
  cos,
  div,
  exp,
  I,
  isClose,
  mul,
  ONE,
  refractiveIndex,
  sin,
  sqrt,
  sub,
} from '../../../shared/optics/complex';

// Identities of complex arithmetic (textbook algebra, no source needed beyond the definitions).
describe('complex arithmetic', () => {
  it('adds, subtracts and multiplies by the definitions', () => {
    expect(add(complex(1, 2), complex(3, -5))).toEqual(complex(4, -3));
    expect(sub(complex(1, 2), complex(3, -5))).toEqual(complex(-2, 7));
    // (1 + 2i)(3 − 5i) = 3 − 5i + 6i + 10 = 13 + i
    expect(mul(complex(1, 2), complex(3, -5))).toEqual(complex(13, 1));
    expect(mul(I, I)).toEqual(complex(-1, 0));
  });

  it('divides as the inverse of multiplication, including badly scaled divisors', () => {
    const a = complex(13, 1);
    expect(isClose(div(a, complex(3, -5)), complex(1, 2), 1e-15)).toBe(true);
    const tiny = complex(1e-300, 3e-300);
    expect(isClose(mul(div(ONE, tiny), tiny), ONE, 1e-14)).toBe(true);
    expect(() => div(ONE, complex(0, 0))).toThrow(RangeError);
  });

  it("satisfies Euler's formula e^{iπ} = −1 and cos² + sin² = 1 for complex arguments", () => {
    expect(isClose(exp(complex(0, Math.PI)), complex(-1, 0), 1e-15)).toBe(true);
    const z = complex(0.7, -1.3);
    const identity = add(mul(cos(z), cos(z)), mul(sin(z), sin(z)));
    expect(isClose(identity, ONE, 1e-13)).toBe(true);
    // cos z = (e^{iz} + e^{−iz}) / 2
    const fromExp = mul(add(exp(mul(I, z)), exp(mul(complex(0, -1), z))), complex(0.5));
    expect(isClose(cos(z), fromExp, 1e-14)).toBe(true);
  });

  it('takes moduli and square roots', () => {
    expect(abs2(complex(3, 4))).toBe(25);
    expect(abs(complex(3, 4))).toBe(5);
    expect(conj(complex(3, 4))).toEqual(complex(3, -4));
    const root = sqrt(complex(-3, 4)); // (1 + 2i)² = −3 + 4i
    expect(isClose(root, complex(1, 2), 1e-15)).toBe(true);
  });

  it('writes an absorbing index as n − ik with a negative imaginary part', () => {
    expect(refractiveIndex(2.6, 1.3)).toEqual(complex(2.6, -1.3));
  });
});
