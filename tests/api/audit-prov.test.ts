import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import jsonld from 'jsonld';
import type { Role } from '../../shared/roles';
import { createFileStore } from '../../server/files/file-store';
import type { SampleModel } from '../../server/models/sample-model';
import { buildPerson } from '../helpers/factories';
import { fakeFileBytes, insertDevice, insertEvidence } from '../helpers/device-factories';
import { anonymousAgent, signedInAgent, type SessionAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
let workDir: string;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
  workDir = mkdtempSync(path.join(os.tmpdir(), 'flakeline-audit-prov-'));
});
afterAll(async () => {
  rmSync(workDir, { recursive: true, force: true });
  await lab.close();
});
beforeEach(() => resetDatabase());

/** The W3C PROV namespace (PROV-O, W3C Recommendation, 30 April 2013, section 2). */
const PROV = 'http://www.w3.org/ns/prov#';
const XSD_DATE_TIME = 'http://www.w3.org/2001/XMLSchema#dateTime';
const RDF_TYPE = 'http://www.w3.org/1999/02/22-rdf-syntax-ns#type';

type Expanded = Record<string, unknown> & { '@id'?: string; '@type'?: string[] };

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

const jsonldPath = (code: string) => `/api/samples/${encodeURIComponent(code)}/audit.jsonld`;

async function exported(session: SessionAgent, code: string): Promise<Record<string, unknown>> {
  const response = await session.agent.get(jsonldPath(code)).buffer(true);
  if (response.status !== 200) throw new Error(`Export of ${code}: ${response.status} ${response.text}`);
  expect(response.headers['content-type']).toMatch(/^application\/ld\+json/);
  return JSON.parse(response.text) as Record<string, unknown>;
}

/** A device with evidence on its flake, exported as a signed-in reviewer. */
async function scene() {
  const researcher = await signedIn();
  const devices = await insertDevice(lab.knex, researcher.person);
  const flake = (await lab.knex('samples').where({ code: devices.flake }).first()) as SampleModel;
  const bytes = fakeFileBytes('Raman spectrum of the monolayer');
  const evidence = await insertEvidence(lab.knex, {
    sample: flake,
    createdBy: researcher.person,
    kind: 'raman',
    layerCount: 1,
    bytes,
    files: createFileStore(lab.config.storage),
  });
  const reviewer = await signedIn('reviewer');
  return { ...devices, researcher, reviewer, evidence, bytes, document: await exported(reviewer, devices.device) };
}

/** No remote contexts: an audit must expand offline. */
const offline = {
  documentLoader: async (url: string) => {
    throw new Error(`The audit tried to load ${url}`);
  },
};

const iriOf = (code: string) => `${lab.config.publicBaseUrl}/s/${code}`;

/** Runs `server/cli/verify-audit.ts` as `npm run verify-audit` does (tsx), on a written export. */
function verify(document: unknown, extra: string[] = []) {
  const file = path.join(workDir, `audit-${Math.random().toString(36).slice(2)}.jsonld`);
  writeFileSync(file, typeof document === 'string' ? document : JSON.stringify(document, null, 2));
  const tsx = path.join(__dirname, '../../node_modules/.bin/tsx');
  const result = spawnSync(tsx, [path.join(__dirname, '../../server/cli/verify-audit.ts'), file, ...extra], { encoding: 'utf8' });
  return { status: result.status, output: `${result.stdout}${result.stderr}` };
}

type EventNode = Record<string, unknown> & {
  'flk:eventId': number;
  'flk:eventType': string;
  'flk:body': string;
  'flk:hash': string;
};
function eventsOf(document: Record<string, unknown>): EventNode[] {
  const graph = document['@graph'] as Record<string, unknown>[];
  const bundle = graph.find((node) => (node['@type'] as string[]).includes('prov:Bundle')) as Record<string, unknown>;
  return bundle['@graph'] as EventNode[];
}

describe('GET /api/samples/:code/audit.jsonld', () => {
  it('401 for a signed-out caller; 404 for an unknown record', async () => {
    const owner = await buildPerson(lab.knex);
    const { device } = await insertDevice(lab.knex, owner);
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(jsonldPath(device))).status).toBe(401);
    const reviewer = await signedIn('reviewer');
    expect((await reviewer.agent.get(jsonldPath('DV-000000'))).status).toBe(404);
  });

  it('expands with a general JSON-LD processor into PROV-O terms: entities, activities, agents and their relations', async () => {
    const { document, device, flake, crystal, lithographyStepId, researcher, evidence } = await scene();
    const expanded = (await jsonld.expand(document as jsonld.JsonLdDocument, offline)) as Expanded[];
    const nodes = new Map<string, Expanded>();
    const collect = (list: Expanded[]) => {
      for (const node of list) {
        if (node['@id']) nodes.set(node['@id'], node);
        if (Array.isArray(node['@graph'])) collect(node['@graph'] as Expanded[]);
      }
    };
    collect(expanded);
    const ids = (node: Expanded | undefined, term: string) =>
      ((node?.[`${PROV}${term}`] as { '@id': string }[] | undefined) ?? []).map((value) => value['@id']);

    const deviceNode = nodes.get(iriOf(device));
    expect(deviceNode?.['@type']).toEqual(expect.arrayContaining([`${PROV}Entity`]));
    expect(ids(deviceNode, 'wasDerivedFrom')).toEqual([iriOf(flake)]);
    expect(ids(nodes.get(iriOf(flake)), 'wasDerivedFrom')).toEqual([iriOf(crystal)]);
    expect(ids(nodes.get(iriOf(crystal)), 'wasDerivedFrom')).toEqual([]);

    const stepIri = ids(deviceNode, 'wasGeneratedBy')[0];
    expect(stepIri).toBe(`${lab.config.publicBaseUrl}/api/steps/${lithographyStepId}`);
    const step = nodes.get(stepIri);
    expect(step?.['@type']).toEqual(expect.arrayContaining([`${PROV}Activity`]));
    expect(ids(step, 'used')).toEqual([iriOf(flake)]);
    expect(step?.[`${PROV}startedAtTime`]).toEqual([{ '@type': XSD_DATE_TIME, '@value': '2026-12-03T13:00:00.000Z' }]);
    expect(step?.[`${PROV}endedAtTime`]).toEqual([{ '@type': XSD_DATE_TIME, '@value': '2026-12-03T15:00:00.000Z' }]);
    const operator = nodes.get(ids(step, 'wasAssociatedWith')[0]);
    expect(operator?.['@type']).toEqual(expect.arrayContaining([`${PROV}Agent`, `${PROV}Person`]));
    expect(ids(step, 'wasAssociatedWith')).toEqual([`${lab.config.publicBaseUrl}/people/${researcher.person.id}`]);

    // The derivation names the step that made it (PROV-O qualified derivation, section 3.3).
    const qualified = deviceNode?.[`${PROV}qualifiedDerivation`] as Expanded[];
    expect(ids(qualified[0], 'entity')).toEqual([iriOf(flake)]);
    expect(ids(qualified[0], 'hadActivity')).toEqual([stepIri]);

    const fileNode = nodes.get(`${lab.config.publicBaseUrl}/api/files/${evidence.sha256}`);
    expect(fileNode?.['@type']).toEqual(expect.arrayContaining([`${PROV}Entity`]));
    expect(fileNode?.['https://flakeline.example/ns#sha256']).toEqual([{ '@value': evidence.sha256 }]);

    // As RDF, the history events sit in the bundle's named graph with their hashed text.
    const quads = (await jsonld.toRDF(document as jsonld.JsonLdDocument, {
      ...offline,
      format: 'application/n-quads',
    })) as unknown as string;
    expect(quads).toContain(`<${iriOf(device)}> <${PROV}wasDerivedFrom> <${iriOf(flake)}> .`);
    expect(quads).toContain(`<${iriOf(device)}> <${RDF_TYPE}> <${PROV}Entity> .`);
    expect(quads).toMatch(new RegExp(`<[^>]+/history/\\d+> <${RDF_TYPE}> <${PROV}Entity> <[^>]+/history> \\.`));
  });

  it('carries each event of the audited records with its exact hashed text and the chain head', async () => {
    const { document, device } = await scene();
    const events = eventsOf(document);
    const rows = await lab
      .knex('history_events')
      .whereIn(
        'id',
        events.map((event) => event['flk:eventId']),
      )
      .orderBy('id');
    expect(events.map((event) => [event['flk:eventId'], event['flk:body'], event['flk:hash']])).toEqual(
      rows.map((row) => [row.id, row.body, row.hash]),
    );
    expect(events.some((event) => event['flk:eventType'] === 'sample.created' && event['flk:body'].includes(device))).toBe(true);
    const head = await lab.knex('history_events').orderBy('id', 'desc').first('hash');
    const graph = document['@graph'] as Record<string, unknown>[];
    expect(graph[0]['flk:chainHeadHash']).toBe(head.hash);
  });
});

describe('npm run verify-audit (server/cli/verify-audit.ts)', () => {
  it('passes an untouched export, with its evidence files', async () => {
    const { document, bytes, evidence } = await scene();
    const filesDir = mkdtempSync(path.join(workDir, 'files-'));
    writeFileSync(path.join(filesDir, evidence.sha256), bytes);
    const result = verify(document, ['--files', filesDir]);
    expect(result.output).toMatch(/checks out/);
    expect(result.output).toMatch(/1 of 1 evidence files found/);
    expect(result.status).toBe(0);
  });

  it('fails and names the event when one exported event is altered', async () => {
    const { document } = await scene();
    const events = eventsOf(document);
    const target = events.find(
      (event) => event['flk:eventType'] === 'step.logged' && event['flk:body'].includes('E-beam writer'),
    ) as EventNode;
    target['flk:body'] = target['flk:body'].replace('"instrument":"E-beam writer"', '"instrument":"Another writer"');
    expect(target['flk:body']).toContain('Another writer');
    const result = verify(document);
    expect(result.status).toBe(1);
    expect(result.output).toContain(
      `FAIL  event ${target['flk:eventId']} (step.logged): its body does not hash to its recorded hash`,
    );
  });

  it('fails when an altered event is re-hashed: the next event in the chain no longer follows it', async () => {
    const { document } = await scene();
    const events = eventsOf(document);
    const index = events.findIndex(
      (event, at) => at + 1 < events.length && events[at + 1]['flk:eventId'] === event['flk:eventId'] + 1,
    );
    const target = events[index];
    const forged = JSON.stringify({ ...JSON.parse(target['flk:body']), actorId: null });
    target['flk:body'] = forged;
    target['flk:hash'] = createHash('sha256').update(forged).digest('hex');
    const result = verify(document);
    expect(result.status).toBe(1);
    expect(result.output).toContain(`event ${events[index + 1]['flk:eventId']}`);
    expect(result.output).toContain(`does not follow event ${target['flk:eventId']}`);
  });

  it('fails when an event is dropped from the export (the bundle digest), and when a file was altered', async () => {
    const { document, evidence } = await scene();
    const withoutOne = structuredClone(document);
    const events = eventsOf(withoutOne);
    events.splice(events.length - 1, 1);
    const dropped = verify(withoutOne);
    expect(dropped.status).toBe(1);
    expect(dropped.output).toContain('an event was added, removed or reordered');

    const filesDir = mkdtempSync(path.join(workDir, 'files-'));
    writeFileSync(path.join(filesDir, evidence.sha256), Buffer.from('not the spectrum that was uploaded'));
    const altered = verify(document, ['--files', filesDir]);
    expect(altered.status).toBe(1);
    expect(altered.output).toContain(`does not match its SHA-256 ${evidence.sha256}`);
  });
});
