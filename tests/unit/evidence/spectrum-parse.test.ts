import { parseTwoColumn } from '../../../shared/evidence/spectrum-parse';

const rows = (count: number, separator = ',', from = 100) =>
  Array.from({ length: count }, (_, i) => `${from + i}${separator}${(1000 + 3 * i).toFixed(1)}`).join('\n');

function failureOf(text: string, options = {}) {
  const result = parseTwoColumn(text, options);
  if (result.ok) throw new Error('expected the file to be refused');
  return result;
}

describe('parseTwoColumn', () => {
  it('reads comma, tab, space and semicolon separated rows with comments and one header line', () => {
    for (const separator of [',', '\t', ' ', ';', ' ; ']) {
      const text = `# Raman, 532 nm\n% exported\nShift (cm-1)${separator}Intensity\n${rows(12, separator)}\n\n// end\n`;
      const result = parseTwoColumn(text);
      expect(result).toMatchObject({ ok: true, header: ['Shift', '(cm-1)', 'Intensity'] });
      if (!result.ok) return;
      expect(result.x).toHaveLength(12);
      expect(result.x[3]).toBe(103);
      expect(result.y[3]).toBe(1009);
      expect(result.reversed).toBe(false);
    }
  });

  it('accepts CRLF line ends, a byte-order mark and exponent notation', () => {
    const text = '\uFEFFx,y\r\n' + Array.from({ length: 10 }, (_, i) => `${i + 1}.5e2,${i}E-1`).join('\r\n');
    const result = parseTwoColumn(text);
    expect(result.ok && result.x[0]).toBe(150);
    expect(result.ok && result.y[9]).toBeCloseTo(0.9, 12);
  });

  it('reads a file that runs from high to low x in reverse and says so', () => {
    const text = Array.from({ length: 10 }, (_, i) => `${800 - i},${i}`).join('\n');
    const result = parseTwoColumn(text);
    expect(result).toMatchObject({ ok: true, reversed: true });
    if (!result.ok) return;
    expect(result.x[0]).toBe(791);
    expect(result.y[0]).toBe(9);
    expect(result.x[9]).toBe(800);
  });

  it('refuses text in a data row, naming the line', () => {
    const text = `x,y\n${rows(5)}\n105,abc\n${rows(5, ',', 106)}`;
    const failure = failureOf(text);
    expect(failure).toMatchObject({ code: 'spectrum_invalid', line: 7 });
    expect(failure.message).toMatch(/^Line 7: “abc” is not a number/);
  });

  it('refuses a second header line, suggesting a comment mark', () => {
    const failure = failureOf(`x,y\nunits,counts\n${rows(12)}`);
    expect(failure.line).toBe(2);
    expect(failure.message).toMatch(/start other notes with #/);
  });

  it('refuses one column and more than two', () => {
    expect(failureOf(`${rows(3)}\n103\n${rows(8, ',', 104)}`)).toMatchObject({
      line: 4,
      message: expect.stringMatching(/^Line 4 has one value/),
    });
    const decimalComma = failureOf('100;1,5\n101;1,6');
    expect(decimalComma.line).toBe(1);
    expect(decimalComma.message).toMatch(/has 3 values.*decimal point/);
  });

  it('refuses NaN and infinite values', () => {
    expect(failureOf(`${rows(4)}\n104,NaN\n${rows(8, ',', 105)}`)).toMatchObject({
      line: 5,
      message: expect.stringMatching(/“NaN” is not a finite number/),
    });
    expect(failureOf(`${rows(4)}\n104,-Infinity`).message).toMatch(/Line 5: “-Infinity” is not a finite number/);
    expect(failureOf(`${rows(4)}\n104,1e999`).message).toMatch(/Line 5 holds a number too large/);
  });

  it('refuses unsorted and duplicated x, naming the line', () => {
    const unsorted = failureOf(`${rows(5)}\n103,7\n${rows(6, ',', 106)}`);
    expect(unsorted.line).toBe(6);
    expect(unsorted.message).toMatch(/x goes from 104 to 103.*sort the file by x/);
    const duplicated = failureOf(`# header comment\n${rows(5)}\n104,9\n${rows(6, ',', 105)}`);
    expect(duplicated.line).toBe(7);
    expect(duplicated.message).toMatch(/^Line 7 repeats the x value 104 of line 6/);
  });

  it('refuses too few and too many points, and an empty file', () => {
    expect(failureOf(rows(9)).message).toBe('The file has 9 data rows; at least 10 are needed.');
    expect(failureOf(rows(5), { minPoints: 6 }).message).toMatch(/at least 6/);
    expect(parseTwoColumn(rows(5), { minPoints: 5 }).ok).toBe(true);
    expect(failureOf(rows(30), { maxPoints: 20 })).toMatchObject({
      line: 21,
      message: expect.stringMatching(/more than 20 data rows/),
    });
    expect(failureOf('# nothing here\n\n').message).toMatch(/no data rows/);
  });
});
