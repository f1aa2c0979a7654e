/**
 * Input an analysis cannot work with (an empty region, a buffer of the wrong size, a spectrum too
 * short), as opposed to a measurement that simply gives no layer call. The message is written for
 * the researcher; a server maps this error to a 422 response.
 */
export class AnalysisInputError extends Error {
  readonly code = 'analysis_input_invalid';

  constructor(message: string) {
    super(message);
    this.name = 'AnalysisInputError';
  }
}

export interface XYData {
  readonly x: readonly number[];
  readonly y: readonly number[];
}

/** Checks that (x, y) are equally long, finite and x strictly ascending, as `parseTwoColumn` returns them. */
export function checkXY(data: XYData, minPoints: number, what: string): void {
  if (data.x.length !== data.y.length)
    throw new AnalysisInputError(`The ${what} has ${data.x.length} x values but ${data.y.length} y values.`);
  if (data.x.length < minPoints)
    throw new AnalysisInputError(`The ${what} has ${data.x.length} points; at least ${minPoints} are needed.`);
  for (let i = 0; i < data.x.length; i += 1) {
    if (!Number.isFinite(data.x[i]) || !Number.isFinite(data.y[i]))
      throw new AnalysisInputError(`Point ${i + 1} of the ${what} is not a finite number.`);
    if (i > 0 && !(data.x[i] > data.x[i - 1]))
      throw new AnalysisInputError(`The ${what}'s x values must rise strictly (point ${i + 1}).`);
  }
}
