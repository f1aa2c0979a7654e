/**
 * `npm run verify-audit -- <audit.jsonld> [--files <dir>]`: checks an exported audit bundle with
 * no server and no database. For each history event it recomputes the SHA-256 of the stored
 * text, checks that the text says what the event's fields say, and that events consecutive in
 * the lab's chain are linked (each names the previous one's hash); then it checks the bundle's
 * digest over the event hashes (so an event dropped, added or reordered shows), and, with
 * --files, the SHA-256 of every evidence file found in that folder (named by its SHA-256 or its
 * original name). Prints the first failure and exits 1; exits 0 when everything checks.
 *
 * An export holds only the events of the audited records, a subset of the lab's chain: events
 * that were not consecutive there cannot be linked here. The bundle's chain head hash can be
 * compared with the lab's live chain (GET /api/history/verify) to tie the export to it.
 */
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { BUNDLE_TYPE, EVENT_TYPE, FILE_TYPE, eventsDigest, sha256Hex } from '../services/audit/prov-format';

type Node = Record<string, unknown>;

interface VerifyReport {
  ok: boolean;
  /** What was checked, one line each. */
  lines: string[];
  /** The first failure, naming the event or file. */
  failure: string | null;
}

const typesOf = (node: Node): string[] => {
  const type = node['@type'];
  return Array.isArray(type) ? type.map(String) : type === undefined ? [] : [String(type)];
};

/** Every node object in the document, named graphs included. */
function nodesOf(value: unknown, into: Node[] = []): Node[] {
  if (Array.isArray(value)) {
    for (const item of value) nodesOf(item, into);
  } else if (value && typeof value === 'object') {
    const node = value as Node;
    if ('@id' in node || '@type' in node) into.push(node);
    if ('@graph' in node) nodesOf(node['@graph'], into);
  }
  return into;
}

function checkEvents(bundle: Node): { lines: string[]; failure: string | null } {
  const events = (nodesOf(bundle['@graph']) as Node[]).filter((node) => typesOf(node).includes(EVENT_TYPE));
  const lines: string[] = [];
  let previous: { id: number; hash: string } | null = null;
  for (const event of events) {
    const id = Number(event['flk:eventId']);
    const name = `event ${id} (${String(event['flk:eventType'])})`;
    const body = event['flk:body'];
    const hash = event['flk:hash'];
    const prevHash = event['flk:prevHash'];
    if (typeof body !== 'string' || typeof hash !== 'string' || typeof prevHash !== 'string') {
      return { lines, failure: `${name}: its body, hash or previous hash is missing.` };
    }
    if (previous && id <= previous.id)
      return { lines, failure: `${name}: events are out of chain order (after event ${previous.id}).` };
    if (sha256Hex(body) !== hash)
      return { lines, failure: `${name}: its body does not hash to its recorded hash — the event was altered.` };
    let recorded: Record<string, unknown>;
    try {
      recorded = JSON.parse(body) as Record<string, unknown>;
    } catch {
      return { lines, failure: `${name}: its body is not the JSON text that was hashed.` };
    }
    const stated: [string, unknown, unknown][] = [
      ['id', recorded.id, id],
      ['type', recorded.type, event['flk:eventType']],
      ['time', recorded.occurredAt, event['prov:generatedAtTime']],
      ['previous hash', recorded.prevHash, prevHash],
    ];
    for (const [field, inBody, inExport] of stated) {
      if (inBody !== inExport)
        return { lines, failure: `${name}: its ${field} differs from the hashed body — the event was altered.` };
    }
    if (previous && previous.id === id - 1 && prevHash !== previous.hash) {
      return { lines, failure: `${name}: it does not follow event ${previous.id}, which comes right before it in the chain.` };
    }
    previous = { id, hash };
  }
  lines.push(`${events.length} history events: each body hashes to its hash; consecutive events are linked.`);
  const digest = eventsDigest(events.map((event) => String(event['flk:hash'])));
  if (digest !== bundle['flk:eventsDigest']) {
    return { lines, failure: 'The bundle digest does not match its events: an event was added, removed or reordered.' };
  }
  if (Number(bundle['flk:eventCount']) !== events.length) {
    return { lines, failure: `The bundle says it holds ${String(bundle['flk:eventCount'])} events; it holds ${events.length}.` };
  }
  lines.push(`Bundle digest ${digest} matches.`);
  return { lines, failure: null };
}

function checkFiles(nodes: Node[], dir: string | null): { lines: string[]; failure: string | null } {
  const files = nodes.filter((node) => typesOf(node).includes(FILE_TYPE));
  if (!dir) return { lines: [`${files.length} evidence files listed (give --files <dir> to check them).`], failure: null };
  let checked = 0;
  for (const file of files) {
    const sha256 = String(file['flk:sha256']);
    const candidates = [sha256, file['flk:originalName']].filter((name): name is string => typeof name === 'string');
    const found = candidates.map((name) => path.join(dir, path.basename(name))).find((candidate) => existsSync(candidate));
    if (!found) continue;
    checked += 1;
    if (sha256Hex(readFileSync(found)) !== sha256) {
      return { lines: [], failure: `File ${path.basename(found)} does not match its SHA-256 ${sha256}: it was altered.` };
    }
  }
  return { lines: [`${checked} of ${files.length} evidence files found in ${dir}; each matches its SHA-256.`], failure: null };
}

function verifyAuditBundle(text: string, filesDir: string | null = null): VerifyReport {
  let document: unknown;
  try {
    document = JSON.parse(text);
  } catch {
    return { ok: false, lines: [], failure: 'The file is not JSON.' };
  }
  const nodes = nodesOf((document as Node)['@graph']);
  const bundle = nodes.find((node) => typesOf(node).includes(BUNDLE_TYPE) && 'flk:eventsDigest' in node);
  if (!bundle) return { ok: false, lines: [], failure: 'No bundle of history events found: is this a Flakeline audit export?' };
  const lines: string[] = [];
  for (const step of [() => checkEvents(bundle), () => checkFiles(nodes, filesDir)]) {
    const result = step();
    lines.push(...result.lines);
    if (result.failure) return { ok: false, lines, failure: result.failure };
  }
  if (typeof bundle['flk:chainHeadHash'] === 'string') {
    lines.push(`Chain head when exported: ${bundle['flk:chainHeadHash']} (compare with the lab's live chain).`);
  }
  return { ok: true, lines, failure: null };
}

function main(argv: string[]): number {
  const args = [...argv];
  const at = args.indexOf('--files');
  const filesDir = at >= 0 ? (args.splice(at, 2)[1] ?? null) : null;
  const [file] = args;
  if (!file || (at >= 0 && !filesDir)) {
    process.stderr.write('Usage: npm run verify-audit -- <audit.jsonld> [--files <folder of evidence files>]\n');
    return 2;
  }
  if (!existsSync(file)) {
    process.stderr.write(`verify-audit: no such file: ${file}\n`);
    return 2;
  }
  const report = verifyAuditBundle(readFileSync(file, 'utf8'), filesDir);
  for (const line of report.lines) process.stdout.write(`ok    ${line}\n`);
  if (report.failure) {
    process.stdout.write(`FAIL  ${report.failure}\n`);
    return 1;
  }
  process.stdout.write(`The audit export ${path.basename(file)} checks out.\n`);
  return 0;
}

process.exit(main(process.argv.slice(2)));
