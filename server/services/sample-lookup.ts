import type { Knex } from 'knex';
import { parseCode } from '../../shared/codes';
import { SAMPLE_CODE_PREFIXES } from '../../shared/samples';
import { codeTypo, notFound } from '../errors';
import { SampleModel } from '../models/sample-model';

export const KNOWN_SAMPLE_PREFIXES = Object.values(SAMPLE_CODE_PREFIXES);

/**
 * Turns a typed or scanned code into its stored form, forgiving case, spaces, hyphens and
 * look-alike letters; a failing check symbol is a typo, reported as such.
 */
export function canonicalSampleCode(input: string): string {
  const parsed = parseCode(input, KNOWN_SAMPLE_PREFIXES);
  if (parsed.ok) return parsed.code;
  if (parsed.reason === 'check_failed') throw codeTypo(parsed.message);
  throw notFound(`There is no sample with code ${input.trim()}.`);
}

export async function findSampleByCode(
  input: string,
  options: { trx?: Knex.Transaction; lock?: boolean } = {},
): Promise<SampleModel> {
  const code = canonicalSampleCode(input);
  const query = SampleModel.query(options.trx).findOne({ code });
  const sample = await (options.lock ? query.forUpdate() : query);
  if (!sample) throw notFound(`There is no sample with code ${code}.`);
  return sample;
}
