import { parseCode } from '@/shared/codes';
import { BOX_CODE_PREFIX, SAMPLE_CODE_PREFIXES } from '@/shared/samples';
import type { RecordRef } from '@/hooks/use-scan';

const SAMPLE_PREFIXES: readonly string[] = Object.values(SAMPLE_CODE_PREFIXES);
const RECORD_PREFIXES: readonly string[] = [...SAMPLE_PREFIXES, BOX_CODE_PREFIX];

/** What a scanned or typed text names. */
export type ReadCode =
  | RecordRef
  /** Looks like one of our codes but its check symbol does not match: a misread or a typing slip. */
  | { kind: 'typo'; text: string; message: string }
  /** Anything else: another QR code, a web address, a stray word. */
  | { kind: 'foreign'; text: string };

/** Our labels carry `<origin>/s/<code>`; the record's code is what follows `/s/`. */
const RECORD_LINK = /\/s\/([^/?#\s]+)/;

function decodeSegment(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}

/**
 * Reads a label's content or a typed code. Any address ending in `/s/<code>` counts, whatever
 * its host: a label printed while the server had another address still names the same record.
 */
export function readCode(raw: string): ReadCode {
  const text = raw.trim();
  const link = RECORD_LINK.exec(text);
  const candidate = link ? decodeSegment(link[1]) : text;
  const parsed = parseCode(candidate, RECORD_PREFIXES);
  if (parsed.ok) {
    return parsed.prefix === BOX_CODE_PREFIX ? { kind: 'box', code: parsed.code } : { kind: 'sample', code: parsed.code };
  }
  if (parsed.reason === 'check_failed') return { kind: 'typo', text: candidate.trim(), message: parsed.message };
  return { kind: 'foreign', text };
}

/** Where a record opens in the app. */
export function recordPath(ref: RecordRef): string {
  return ref.kind === 'sample' ? `/samples/${ref.code}` : `/boxes/${ref.code}`;
}
