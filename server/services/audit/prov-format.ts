/**
 * The shape of an exported audit bundle that both the exporter and the offline verifier rely on:
 * the JSON-LD context, the terms of our own namespace, and the digest over the event hashes.
 * Pure Node code (no database, no server), so `npm run verify-audit` can import it.
 */
import { createHash } from 'node:crypto';

export const PROV_NS = 'http://www.w3.org/ns/prov#';
export const XSD_NS = 'http://www.w3.org/2001/XMLSchema#';
export const RDFS_NS = 'http://www.w3.org/2000/01/rdf-schema#';
/** Our own terms (reserved example domain, RFC 2606: it never resolves to anyone else's vocabulary). */
export const FLAKELINE_NS = 'https://flakeline.example/ns#';

/**
 * JSON-LD 1.1 context. Typed terms make times xsd:dateTime and references IRIs; step `parameters`
 * stay a JSON literal (@json) so their content survives expansion unchanged.
 */
export const AUDIT_CONTEXT = {
  '@version': 1.1,
  prov: PROV_NS,
  xsd: XSD_NS,
  rdfs: RDFS_NS,
  flk: FLAKELINE_NS,
  'prov:startedAtTime': { '@type': 'xsd:dateTime' },
  'prov:endedAtTime': { '@type': 'xsd:dateTime' },
  'prov:generatedAtTime': { '@type': 'xsd:dateTime' },
  'prov:wasGeneratedBy': { '@type': '@id' },
  'prov:wasDerivedFrom': { '@type': '@id' },
  'prov:used': { '@type': '@id' },
  'flk:treated': { '@type': '@id' },
  'prov:wasAssociatedWith': { '@type': '@id' },
  'prov:wasAttributedTo': { '@type': '@id' },
  'prov:entity': { '@type': '@id' },
  'prov:hadActivity': { '@type': '@id' },
  'flk:about': { '@type': '@id' },
  'flk:file': { '@type': '@id' },
  'flk:audited': { '@type': '@id' },
  'flk:parameters': { '@type': '@json' },
  'flk:recordedAt': { '@type': 'xsd:dateTime' },
  'flk:byteSize': { '@type': 'xsd:integer' },
  'flk:eventId': { '@type': 'xsd:integer' },
} as const;

/** Types of the nodes the verifier looks for. */
export const EVENT_TYPE = 'flk:HistoryEvent';
export const FILE_TYPE = 'flk:StoredFile';
export const BUNDLE_TYPE = 'prov:Bundle';

export const sha256Hex = (data: string | Buffer) => createHash('sha256').update(data).digest('hex');

/**
 * Digest of a bundle's events: SHA-256 over their hashes in chain order, one per line. An event
 * added, dropped or reordered in an export changes it even when each event still hashes right.
 */
export function eventsDigest(hashes: readonly string[]): string {
  return sha256Hex(hashes.join('\n'));
}
