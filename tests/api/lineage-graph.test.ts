import type { LineageGraph } from '../../shared/schemas/lineage-graph';
import { buildPerson } from '../helpers/factories';
import { insertDeepDevice } from '../helpers/device-factories';
import { insertSample, insertStep, outputCodes, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const path = (code: string) => `/api/samples/${encodeURIComponent(code)}/lineage-graph`;

/**
 * A diamond: one crystal exfoliated into three flakes; two of them stacked; the stack patterned
 * into a device. The third flake is a sibling, not a relative of the stack.
 */
async function diamond() {
  const owner = await buildPerson(lab.knex);
  const crystal = await insertSample(lab.knex, owner, { kind: 'crystal', material: 'hBN' });
  const exfoliation = await insertStep(
    lab.knex,
    owner,
    stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'flake', count: 3 }] }),
  );
  const [top, bottom, sibling] = await outputCodes(lab.knex, exfoliation.id);
  const stacking = await insertStep(
    lab.knex,
    owner,
    stepBody('stacking', {
      startedAt: '2026-12-04T11:00:00.000Z',
      endedAt: '2026-12-04T12:00:00.000Z',
      inputs: [{ code: bottom }, { code: top }],
      outputs: [{ kind: 'stack' }],
    }),
  );
  const [stack] = await outputCodes(lab.knex, stacking.id);
  const lithography = await insertStep(
    lab.knex,
    owner,
    stepBody('lithography', { inputs: [{ code: stack }], outputs: [{ kind: 'device' }] }),
  );
  const [device] = await outputCodes(lab.knex, lithography.id);
  return { owner, crystal: crystal.code, top, bottom, sibling, stack, device, steps: { exfoliation, stacking, lithography } };
}

describe('GET /api/samples/:code/lineage-graph', () => {
  it('401 for a signed-out caller', async () => {
    const { stack } = await diamond();
    const { agent } = await anonymousAgent(lab.app);
    expect((await agent.get(path(stack))).status).toBe(401);
  });

  it('404 for an unknown record', async () => {
    const reviewer = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent } = await signedInAgent(lab.app, reviewer.email);
    expect((await agent.get(path('SK-000000'))).status).toBe(404);
  });

  it('ancestors (negative generations), the record (0) and descendants, each once, with every link and its step', async () => {
    const scene = await diamond();
    const reviewer = await buildPerson(lab.knex, { role: 'reviewer' });
    const { agent } = await signedInAgent(lab.app, reviewer.email);
    const response = await agent.get(path(scene.stack));
    expect(response.status).toBe(200);
    const graph = response.body as LineageGraph;
    expect(graph.code).toBe(scene.stack);
    const generationOf = Object.fromEntries(graph.nodes.map((node) => [node.code, node.generation]));
    expect(generationOf).toEqual({
      [scene.crystal]: -2,
      [scene.top]: -1,
      [scene.bottom]: -1,
      [scene.stack]: 0,
      [scene.device]: 1,
    });
    expect(graph.nodes.find((node) => node.code === scene.stack)).toMatchObject({
      kind: 'stack',
      material: 'hBN',
      layerEstimate: null,
    });
    const edges = graph.edges.map((edge) => `${edge.parentCode}→${edge.childCode}@${edge.step.type}`).sort();
    expect(edges).toEqual(
      [
        `${scene.crystal}→${scene.top}@exfoliation`,
        `${scene.crystal}→${scene.bottom}@exfoliation`,
        `${scene.top}→${scene.stack}@stacking`,
        `${scene.bottom}→${scene.stack}@stacking`,
        `${scene.stack}→${scene.device}@lithography`,
      ].sort(),
    );
    expect(graph.edges.find((edge) => edge.step.type === 'stacking')?.step).toEqual({
      id: scene.steps.stacking.id,
      type: 'stacking',
      startedAt: '2026-12-04T11:00:00.000Z',
    });
  });

  it('a 30-generation, two-parent ancestry: every ancestor once, at its nearest generation', async () => {
    const owner = await buildPerson(lab.knex);
    const deep = await insertDeepDevice(lab.knex, owner, 30);
    const { agent } = await signedInAgent(lab.app, owner.email);
    const graph = (await agent.get(path(deep.device))).body as LineageGraph;
    const codes = graph.nodes.map((node) => node.code);
    expect(new Set(codes).size).toBe(codes.length);
    expect(codes.sort()).toEqual([...deep.ancestors, deep.device].sort());
    const generationOf = new Map(graph.nodes.map((node) => [node.code, node.generation]));
    expect(generationOf.get(deep.stacks[29])).toBe(-1);
    expect(generationOf.get(deep.stacks[0])).toBe(-30);
    // The second crystal's nearest flake joins at the last stacking (generation 30): crystal at −3.
    expect(generationOf.get(deep.crystals[1])).toBe(-3);
    expect(Math.min(...generationOf.values())).toBe(-deep.depth);
    // Two parents per stack, one per exfoliated flake and the device: 30·2 + 31 + 1 links.
    expect(graph.edges).toHaveLength(30 * 2 + 31 + 1);
  });
});
