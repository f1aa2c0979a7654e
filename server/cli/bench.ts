import { randomInt } from 'node:crypto';
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import type { Knex } from 'knex';
import { Model } from 'objection';
import { CODE_BODY_LENGTH, formatCode } from '../../shared/codes';
import { SAMPLE_CODE_PREFIXES, type SampleKind } from '../../shared/samples';
import { SampleListQuery } from '../../shared/schemas/sample';
import { createKnex } from '../db/knex';
import { prepareDatabase } from '../db/prepare-database';
import { eventBody, GENESIS_HASH, sha256Hex, verifyHistory } from '../services/history-chain';
import { lineageOf } from '../services/lineage';
import { findSampleByCode } from '../services/sample-lookup';
import { filteredSamples, LIST_COLUMNS, sortedSamples } from '../services/sample-search';
import { APP_ROLE, ensureClusterRunning, ensureDatabase } from './local-postgres';
import { loadLocalSecrets } from './local-secrets';
import { progress } from './progress';

/**
 * `npm run bench`: fills a scratch database with a synthetic lab of about 100,000 samples
 * (exfoliation trees, stacks and devices with two parents, and 50-generation chains), then times
 * the lineage and list queries. Figures, not pass/fail: compare them with the baseline printed
 * beside them, measured in the same run.
 */
const DATABASE = 'flakeline_bench';
const CRYSTALS = 2_000;
const CHIPS_PER_CRYSTAL = 10;
const FLAKES_PER_CHIP = 2;
const CHAINS = 360;
const CHAIN_LENGTH = 50;
const MATERIALS = ['MoS2', 'WS2', 'WSe2', 'MoSe2', 'graphene', 'hBN'];

interface Row {
  id: number;
  code: string;
  kind: SampleKind;
  material: string;
  status: string;
  ownerId: number;
  properties: string;
  layerEstimate: number | null;
  createdAt: Date;
}

class SyntheticLab {
  samples: Row[] = [];
  steps: { id: number; type: string; operatorId: number; startedAt: Date; parameters: string }[] = [];
  links: { parentId: number; childId: number; stepId: number }[] = [];
  private codes = new Set<string>();
  private clock = Date.parse('2024-01-01T00:00:00Z');

  sample(kind: SampleKind, material: string): Row {
    let code: string;
    do code = formatCode(SAMPLE_CODE_PREFIXES[kind], randomInt(32 ** CODE_BODY_LENGTH));
    while (this.codes.has(code));
    this.codes.add(code);
    this.clock += 60_000;
    const row: Row = {
      id: this.samples.length + 1,
      code,
      kind,
      material,
      status: 'ready',
      ownerId: 1 + (this.samples.length % 3),
      properties: '{}',
      layerEstimate: kind === 'flake' ? 1 + (this.samples.length % 5) : null,
      createdAt: new Date(this.clock),
    };
    this.samples.push(row);
    return row;
  }

  step(type: string, parents: Row[], children: Row[]) {
    const id = this.steps.length + 1;
    this.steps.push({ id, type, operatorId: 1, startedAt: new Date(this.clock), parameters: '{}' });
    for (const parent of parents)
      for (const child of children) this.links.push({ parentId: parent.id, childId: child.id, stepId: id });
  }
}

function buildLab(): { lab: SyntheticLab; chainTails: Row[]; chainHeads: Row[]; devices: Row[] } {
  const lab = new SyntheticLab();
  const devices: Row[] = [];
  for (let c = 0; c < CRYSTALS; c += 1) {
    const material = MATERIALS[c % MATERIALS.length];
    const crystal = lab.sample('crystal', material);
    const chips = Array.from({ length: CHIPS_PER_CRYSTAL }, () => lab.sample('chip', material));
    lab.step('exfoliation', [crystal], chips);
    const flakes: Row[] = [];
    for (const chip of chips) {
      const found = Array.from({ length: FLAKES_PER_CHIP }, () => lab.sample('flake', material));
      lab.step('transfer', [chip], found);
      flakes.push(...found);
    }
    // Half the flakes are stacked in pairs; every stack becomes a device.
    for (let f = 0; f + 1 < flakes.length / 2; f += 2) {
      const stack = lab.sample('stack', material);
      lab.step('stacking', [flakes[f], flakes[f + 1]], [stack]);
      const device = lab.sample('device', material);
      lab.step('lithography', [stack], [device]);
      devices.push(device);
    }
  }
  const chainHeads: Row[] = [];
  const chainTails: Row[] = [];
  for (let c = 0; c < CHAINS; c += 1) {
    let previous = lab.sample('crystal', 'MoS2');
    chainHeads.push(previous);
    for (let g = 1; g < CHAIN_LENGTH; g += 1) {
      const next = lab.sample(g % 2 ? 'flake' : 'stack', 'MoS2');
      lab.step(g % 2 ? 'transfer' : 'annealing', [previous], [next]);
      previous = next;
    }
    chainTails.push(previous);
  }
  return { lab, chainTails, chainHeads, devices };
}

async function insertBatches(knex: Knex, table: string, rows: object[], size = 4_000) {
  for (let start = 0; start < rows.length; start += size) await knex(table).insert(rows.slice(start, start + size));
}

async function load(knex: Knex, lab: SyntheticLab) {
  await knex('users').insert(
    [1, 2, 3].map((id) => ({
      id,
      email: `bench${id}@lab.flakeline.test`,
      displayName: `Bench ${id}`,
      role: 'researcher',
      status: 'invited',
    })),
  );
  await insertBatches(knex, 'samples', lab.samples);
  await insertBatches(knex, 'steps', lab.steps);
  await insertBatches(knex, 'lineage_links', lab.links);
  let prevHash = GENESIS_HASH;
  const events = lab.samples.map((sample, index) => {
    const fields = {
      id: index + 1,
      occurredAt: sample.createdAt.toISOString(),
      actorId: sample.ownerId,
      type: 'sample.created',
      subjectCode: sample.code,
      stepId: null,
      payload: { kind: sample.kind, material: sample.material },
      prevHash,
    };
    const body = eventBody(fields);
    prevHash = sha256Hex(body);
    return { ...fields, occurredAt: sample.createdAt, payload: JSON.stringify(fields.payload), body, hash: prevHash };
  });
  await insertBatches(knex, 'history_events', events);
  await knex.raw("select setval('samples_id_seq', (select max(id) from samples))");
  await knex.raw("select setval('steps_id_seq', (select max(id) from steps))");
  await knex.raw("select setval('history_events_id_seq', (select max(id) from history_events))");
  await knex.raw('analyze');
}

/** The baseline: the same ancestry, fetched one generation per query. */
async function ancestryByGeneration(knex: Knex, sampleId: number): Promise<number> {
  const seen = new Set<number>();
  let frontier = [sampleId];
  while (frontier.length) {
    const parents: number[] = await knex('lineage_links').whereIn('child_id', frontier).distinct().pluck('parent_id');
    frontier = parents.filter((id) => !seen.has(id));
    for (const id of frontier) seen.add(id);
  }
  return seen.size;
}

async function timeEach<T>(label: string, inputs: T[], run: (input: T) => Promise<unknown>) {
  for (const input of inputs.slice(0, 3)) await run(input); // warm the cache and the query plans
  const times: number[] = [];
  for (const input of inputs) {
    const start = performance.now();
    await run(input);
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  const at = (q: number) => times[Math.min(times.length - 1, Math.floor(q * times.length))];
  const result = { label, runs: times.length, p50: at(0.5), p95: at(0.95) };
  process.stdout.write(
    `${label.padEnd(52)} ${String(result.runs).padStart(5)} runs   p50 ${result.p50.toFixed(2).padStart(8)} ms   p95 ${result.p95.toFixed(2).padStart(8)} ms\n`,
  );
  return result;
}

const pick = <T>(items: T[], count: number) => Array.from({ length: count }, () => items[randomInt(items.length)]);

async function main() {
  const secrets = loadLocalSecrets();
  ensureClusterRunning(secrets.superuserPassword);
  const urls = await ensureDatabase({ ...secrets, database: DATABASE, fresh: true });
  await prepareDatabase({ ownerUrl: urls.owner, appRole: APP_ROLE });

  progress('Building the synthetic lab');
  const { lab, chainTails, chainHeads, devices } = buildLab();
  const owner = createKnex(urls.owner, 2);
  const loadStart = performance.now();
  await load(owner, lab);
  await owner.destroy();
  progress(
    `Loaded ${lab.samples.length} samples, ${lab.steps.length} steps, ${lab.links.length} links, ${lab.samples.length} history events in ${((performance.now() - loadStart) / 1000).toFixed(1)} s`,
  );

  const knex = createKnex(urls.app, 4);
  Model.knex(knex);
  process.stdout.write(`\nOn this machine (${os.cpus().length} cores), PostgreSQL on loopback:\n`);
  await timeEach('code lookup (typed in lower case)', pick(lab.samples, 300), (sample) =>
    findSampleByCode(sample.code.toLowerCase()),
  );
  const filters = [
    { kind: 'flake', status: 'ready', sort: 'createdAt' },
    { material: 'WSe2', sort: 'code', order: 'asc' },
    { kind: 'flake', layersMin: '1', layersMax: '1' },
    { q: 'FK-4' },
    { kind: 'device', page: '20' },
  ].map((raw) => SampleListQuery.parse(raw));
  await timeEach('filtered list page (50 rows + total)', pick(filters, 100), async (query) => {
    const filtered = filteredSamples(knex, query);
    await Promise.all([
      filtered.clone().count({ count: '*' }).first(),
      sortedSamples(filtered.clone().select(LIST_COLUMNS), query)
        .limit(query.pageSize)
        .offset((query.page - 1) * query.pageSize),
    ]);
  });
  const tails = pick(chainTails, 100);
  const recursive = await timeEach('ancestry, one recursive query (50-deep chain)', tails, (tail) =>
    lineageOf(knex, tail.id, 'ancestors'),
  );
  const baseline = await timeEach('ancestry, one query per generation (baseline)', tails, (tail) =>
    ancestryByGeneration(knex, tail.id),
  );
  await timeEach('descendants, one recursive query (chain head)', pick(chainHeads, 100), (head) =>
    lineageOf(knex, head.id, 'descendants'),
  );
  await timeEach('ancestry of a device (stack of two flakes)', pick(devices, 100), (device) =>
    lineageOf(knex, device.id, 'ancestors'),
  );
  await timeEach(`history verification (${lab.samples.length} events)`, [0, 1, 2, 3, 4], () => verifyHistory(knex));
  process.stdout.write(
    `\nAncestry of a 50-deep chain: recursive query is ${(baseline.p50 / recursive.p50).toFixed(1)}x faster than one query per generation (p50).\n`,
  );
  await knex.destroy();
}

main().catch((error: unknown) => {
  process.stderr.write(`bench failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exit(1);
});
