/**
 * Strict reader for two-column text files: Raman and PL spectra (x = Raman shift in cm⁻¹,
 * wavelength in nm or energy in eV; y = intensity) and AFM line profiles (x in µm, height in nm).
 *
 * Accepted: comment lines starting with #, % or //; one header line of column names before the
 * first data row; values separated by commas, tabs, spaces or semicolons; a decimal point (not a
 * comma). Refused, with the line named: text in a data row, a row with one value or more than two,
 * NaN or infinite values, x values that repeat or go back and forth. A file written from high x
 * to low x (common for spectrometers that step in wavelength) is read in reverse and says so.
 */

export const SPECTRUM_ERROR_CODE = 'spectrum_invalid';

/** Fewest data rows accepted unless the caller asks otherwise: too few to find a peak or a step. */
export const DEFAULT_MIN_POINTS = 10;
/** Most data rows read unless the caller asks otherwise. */
export const DEFAULT_MAX_POINTS = 50_000;

export interface ParseOptions {
  readonly maxPoints?: number;
  readonly minPoints?: number;
}

export type ParseResult =
  | {
      readonly ok: true;
      readonly x: number[];
      readonly y: number[];
      /** Column names from the header line, when the file has one. */
      readonly header?: string[];
      /** True when the file ran from high x to low x and was read in reverse. */
      readonly reversed: boolean;
    }
  | { readonly ok: false; readonly code: typeof SPECTRUM_ERROR_CODE; readonly message: string; readonly line?: number };

const NUMBER_PATTERN = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const NOT_FINITE_PATTERN = /^[+-]?(?:nan|inf|infinity)$/i;
const SEPARATORS = /[\t ,;]+/;

function isComment(line: string): boolean {
  return line.startsWith('#') || line.startsWith('%') || line.startsWith('//');
}

function quoted(field: string): string {
  const shown = field.length > 30 ? `${field.slice(0, 30)}…` : field;
  return `“${shown}”`;
}

function failure(message: string, line?: number): ParseResult {
  return { ok: false, code: SPECTRUM_ERROR_CODE, message, line };
}

/** Reads a two-column text file; never throws on bad content. */
export function parseTwoColumn(text: string, options: ParseOptions = {}): ParseResult {
  const maxPoints = options.maxPoints ?? DEFAULT_MAX_POINTS;
  const minPoints = options.minPoints ?? DEFAULT_MIN_POINTS;
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const x: number[] = [];
  const y: number[] = [];
  const lineOf: number[] = [];
  let header: string[] | undefined;

  for (let index = 0; index < lines.length; index += 1) {
    const lineNumber = index + 1;
    const line = lines[index].trim();
    if (line === '' || isComment(line)) continue;
    const fields = line.split(SEPARATORS).filter((field) => field !== '');
    const firstIsNumber = NUMBER_PATTERN.test(fields[0]);

    if (x.length === 0 && header === undefined && !firstIsNumber && !NOT_FINITE_PATTERN.test(fields[0])) {
      header = fields.map((field) => field.replace(/^"|"$/g, ''));
      continue;
    }
    for (const field of fields) {
      if (NOT_FINITE_PATTERN.test(field)) {
        return failure(
          `Line ${lineNumber}: ${quoted(field)} is not a finite number. Remove or fix rows without a measurement.`,
          lineNumber,
        );
      }
      if (!NUMBER_PATTERN.test(field)) {
        const hint = x.length === 0 ? ' Only one header line is allowed; start other notes with #.' : '';
        return failure(
          `Line ${lineNumber}: ${quoted(field)} is not a number. Data rows must hold two numbers.${hint}`,
          lineNumber,
        );
      }
    }
    if (fields.length === 1) {
      return failure(`Line ${lineNumber} has one value; Flakeline needs two columns (x and intensity or height).`, lineNumber);
    }
    if (fields.length > 2) {
      return failure(
        `Line ${lineNumber} has ${fields.length} values; Flakeline reads exactly two columns (x and intensity or height). Use a decimal point, not a comma.`,
        lineNumber,
      );
    }
    const xValue = Number(fields[0]);
    const yValue = Number(fields[1]);
    if (!Number.isFinite(xValue) || !Number.isFinite(yValue)) {
      return failure(`Line ${lineNumber} holds a number too large to read.`, lineNumber);
    }
    if (x.length >= maxPoints) {
      return failure(`The file has more than ${maxPoints} data rows (line ${lineNumber}); reduce or crop it.`, lineNumber);
    }
    x.push(xValue);
    y.push(yValue);
    lineOf.push(lineNumber);
  }

  if (x.length === 0) return failure('The file holds no data rows: expected two columns of numbers.');
  if (x.length < minPoints) {
    return failure(`The file has ${x.length} data rows; at least ${minPoints} are needed.`, lineOf[lineOf.length - 1]);
  }

  const reversed = x.length > 1 && x[1] < x[0];
  for (let i = 1; i < x.length; i += 1) {
    if (x[i] === x[i - 1]) {
      return failure(
        `Line ${lineOf[i]} repeats the x value ${String(x[i])} of line ${lineOf[i - 1]}; each x may appear once.`,
        lineOf[i],
      );
    }
    if (x[i] < x[i - 1] !== reversed) {
      return failure(
        `Line ${lineOf[i]}: x goes from ${String(x[i - 1])} to ${String(x[i])}, against the order of the rows before it; sort the file by x.`,
        lineOf[i],
      );
    }
  }
  if (reversed) {
    x.reverse();
    y.reverse();
  }
  return header ? { ok: true, x, y, header, reversed } : { ok: true, x, y, reversed };
}
