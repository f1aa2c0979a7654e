/**
 * Runs the general-purpose `ml-levenberg-marquardt` library (finite-difference Jacobian) on the
 * same data and model as our fitter, for comparison. The library ships only as an ES module,
 * which Jest's CommonJS loader cannot require, so it runs in a child Node process.
 */
import { spawnSync } from 'node:child_process';
import path from 'node:path';

export interface ReferenceFitInput {
  readonly x: readonly number[];
  readonly y: readonly number[];
  /** Parameters: [centre, fwhm, height] per peak, then background coefficients of t = (x − xCentre)/xHalfSpan. */
  readonly initialValues: readonly number[];
  readonly peakCount: number;
  readonly xCentre: number;
  readonly xHalfSpan: number;
}

const SCRIPT = `
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
let text = '';
process.stdin.on('data', (chunk) => (text += chunk));
process.stdin.on('end', () => {
  const input = JSON.parse(text);
  const model = (p) => (x) => {
    let value = 0;
    const t = (x - input.xCentre) / input.xHalfSpan;
    for (let j = 3 * input.peakCount, power = 1; j < p.length; j += 1, power *= t) value += p[j] * power;
    for (let k = 0; k < input.peakCount; k += 1) {
      const u = (2 * (x - p[3 * k])) / p[3 * k + 1];
      value += p[3 * k + 2] / (1 + u * u);
    }
    return value;
  };
  const result = levenbergMarquardt({ x: input.x, y: input.y }, model, {
    initialValues: input.initialValues,
    damping: 1e-3,
    gradientDifference: 1e-6,
    centralDifference: true,
    maxIterations: 2000,
    errorTolerance: 1e-12,
    improvementThreshold: 1e-4,
  });
  process.stdout.write(JSON.stringify(result));
});
`;

export function referenceFit(input: ReferenceFitInput): {
  parameterValues: number[];
  parameterError: number;
  iterations: number;
} {
  const run = spawnSync(process.execPath, ['--input-type=module', '-e', SCRIPT], {
    input: JSON.stringify(input),
    cwd: path.resolve(__dirname, '../../..'),
    encoding: 'utf8',
    timeout: 60_000,
  });
  if (run.status !== 0) throw new Error(`The reference fit failed: ${run.stderr}`);
  return JSON.parse(run.stdout);
}
