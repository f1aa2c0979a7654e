import { createHash } from 'node:crypto';
import type { Role } from '../../shared/roles';
import type { HistoryEvent } from '../../shared/schemas/history';
import { buildPerson } from '../helpers/factories';
import { codeWithBody, insertSample, insertStep, logStep, registerCrystal, stepBody } from '../helpers/sample-factories';
import { anonymousAgent, signedInAgent, type SessionAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, testAdminKnex, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp({ config: { signInLimits: { windowMs: 60_000, perAccount: 1_000, perAddress: 1_000 } } });
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const GENESIS_HASH = '0'.repeat(64);
const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

async function signedIn(role: Role = 'researcher') {
  const person = await buildPerson(lab.knex, { role });
  return { person, ...(await signedInAgent(lab.app, person.email)) };
}

async function historyOf(session: SessionAgent, code: string): Promise<HistoryEvent[]> {
  const response = await session.agent.get(`/api/samples/${encodeURIComponent(code)}/history`);
  if (response.status !== 200) throw new Error(`History of ${code}: ${response.status} ${JSON.stringify(response.body)}`);
  return response.body.events as HistoryEvent[];
}

/** The whole chain as stored, oldest first (read as the app's role may). */
const storedChain = () => lab.knex('history_events').orderBy('id');

/** A short, realistic history: a crystal, its exfoliation onto three chips, a second crystal. */
async function someHistory() {
  const person = await buildPerson(lab.knex);
  const crystal = await insertSample(lab.knex, person, { kind: 'crystal', material: 'MoS2' });
  const step = await insertStep(
    lab.knex,
    person,
    stepBody('exfoliation', { inputs: [{ code: crystal.code }], outputs: [{ kind: 'chip', count: 3 }] }),
  );
  await insertSample(lab.knex, person, { kind: 'crystal', material: 'WS2' });
  const ids = (await storedChain()).map((event) => event.id as number);
  return { person, crystal, step, ids };
}

/** A superuser changing the history behind the app's back, with the append-only triggers switched off. */
async function tamper(sql: string, bindings: readonly (string | number)[]) {
  await testAdminKnex().transaction(async (trx) => {
    await trx.raw('set local session_replication_role = replica');
    await trx.raw(sql, bindings);
  });
}

describe('GET /api/samples/:code/history', () => {
  it('401 unauthenticated when signed out', async () => {
    const person = await buildPerson(lab.knex);
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get(`/api/samples/${crystal.code}/history`);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('422 code_typo for a code with a wrong check symbol; 404 not_found for a code nobody has', async () => {
    const { person, agent } = await signedIn('reviewer');
    const crystal = await insertSample(lab.knex, person, { kind: 'crystal' });
    const typo = crystal.code.slice(0, -1) + (crystal.code.endsWith('0') ? '1' : '0');
    const typoResponse = await agent.get(`/api/samples/${typo}/history`);
    expect(typoResponse.status).toBe(422);
    expect(typoResponse.body.error.code).toBe('code_typo');
    const unknown = await agent.get(`/api/samples/${codeWithBody('CR', 'H4RDQ2')}/history`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
  });

  it('200 with an event for each kind of change, oldest first, each with its actor, time and step', async () => {
    const researcher = await signedIn('researcher');
    const manager = await signedIn('manager');
    const crystal = await registerCrystal(researcher.agent, researcher.csrfToken, { material: 'WSe2', name: 'WSe2 boule 1' });
    await researcher.agent
      .patch(`/api/samples/${crystal.code}`)
      .set('x-csrf-token', researcher.csrfToken)
      .send({ version: 1, name: 'WSe2 boule 1 (Se-rich end)' })
      .expect(200);
    await researcher.agent
      .patch(`/api/samples/${crystal.code}`)
      .set('x-csrf-token', researcher.csrfToken)
      .send({ version: 2, status: 'in_process' })
      .expect(200);
    const exfoliation = await logStep(
      researcher.agent,
      researcher.csrfToken,
      stepBody('exfoliation', { inputs: [{ code: crystal.code, consumed: true }], outputs: [{ kind: 'chip', count: 2 }] }),
    );
    const chips = exfoliation.outputs.map((output) => output.code);
    const anneal = await logStep(researcher.agent, researcher.csrfToken, stepBody('annealing', { treated: [chips[0]] }));
    const otherFlake = await insertSample(lab.knex, researcher.person, { kind: 'flake', material: 'WSe2' });
    const link = await logStep(
      researcher.agent,
      researcher.csrfToken,
      stepBody('transfer', { inputs: [{ code: otherFlake.code }], existingOutputs: [chips[0]] }),
    );
    await manager.agent
      .post(`/api/samples/${crystal.code}/retirement`)
      .set('x-csrf-token', manager.csrfToken)
      .send({ version: 4, reason: 'Fully exfoliated; nothing left to cleave' })
      .expect(200);

    const events = await historyOf(manager, crystal.code);
    const researcherRef = { id: researcher.person.id, displayName: researcher.person.displayName };
    expect(events.map((event) => [event.type, event.actor, event.subjectCode, event.stepId])).toEqual([
      ['sample.created', researcherRef, crystal.code, null],
      ['sample.edited', researcherRef, crystal.code, null],
      ['sample.status_changed', researcherRef, crystal.code, null],
      ['sample.used', researcherRef, crystal.code, exfoliation.id],
      ['sample.status_changed', researcherRef, crystal.code, exfoliation.id],
      ['sample.retired', { id: manager.person.id, displayName: manager.person.displayName }, crystal.code, null],
    ]);
    expect(events[0].payload).toMatchObject({ kind: 'crystal', material: 'WSe2', name: 'WSe2 boule 1', status: 'ready' });
    expect(events[1].payload).toEqual({
      version: 2,
      changes: { name: { from: 'WSe2 boule 1', to: 'WSe2 boule 1 (Se-rich end)' } },
    });
    expect(events[2].payload).toEqual({ version: 3, from: 'ready', to: 'in_process' });
    expect(events[3].payload).toEqual({ stepType: 'exfoliation', consumed: true, outputs: chips });
    expect(events[4].payload).toEqual({ from: 'in_process', to: 'used_up' });
    expect(events[5].payload).toMatchObject({ version: 5, reason: 'Fully exfoliated; nothing left to cleave' });
    for (const event of events) expect(new Date(event.occurredAt).toISOString()).toBe(event.occurredAt);
    const times = events.map((event) => Date.parse(event.occurredAt));
    expect([...times].sort((a, b) => a - b)).toEqual(times);

    const chipEvents = await historyOf(researcher, chips[0]);
    expect(chipEvents.map((event) => [event.type, event.stepId])).toEqual([
      ['sample.created', exfoliation.id],
      ['sample.treated', anneal.id],
      ['sample.linked', link.id],
    ]);
    expect(chipEvents[1].payload).toEqual({ stepType: 'annealing' });
    expect(chipEvents[2].payload).toEqual({ stepType: 'transfer', parents: [otherFlake.code] });

    const logged = await lab.knex('history_events').where({ type: 'step.logged' }).orderBy('id');
    expect(logged.map((event) => event.stepId)).toEqual([exfoliation.id, anneal.id, link.id]);
    expect(logged[0]).toMatchObject({ actorId: researcher.person.id, subjectCode: null });
    expect(logged[0].payload).toMatchObject({
      type: 'exfoliation',
      label: 'Exfoliation',
      operatorId: researcher.person.id,
      startedAt: '2026-12-03T09:30:00.000Z',
      inputs: [{ code: crystal.code, consumed: true }],
      treated: [],
      outputs: chips,
    });
  });

  it('200 events chain: each names the hash of the event before it, and its hash is the SHA-256 of its recorded body', async () => {
    const { crystal } = await someHistory();
    const session = await signedIn('reviewer');
    const events = await historyOf(session, crystal.code);
    const chain = await storedChain();
    expect(chain[0].prevHash).toBe(GENESIS_HASH);
    for (let i = 1; i < chain.length; i += 1) expect(chain[i].prevHash).toBe(chain[i - 1].hash);

    for (const event of events) {
      const index = chain.findIndex((stored) => stored.id === event.id);
      expect(event.prevHash).toBe(index === 0 ? GENESIS_HASH : chain[index - 1].hash);
      expect(event.hash).toBe(chain[index].hash);
    }

    // One event checked independently, from the body column as a superuser reads it.
    const checked = events[events.length - 1];
    const { body, hash } = await testAdminKnex()('history_events').where({ id: checked.id }).first('body', 'hash');
    expect(sha256(body)).toBe(hash);
    expect(checked.hash).toBe(sha256(body));
    expect(JSON.parse(body)).toEqual({
      id: checked.id,
      occurredAt: checked.occurredAt,
      actorId: checked.actor?.id ?? null,
      type: checked.type,
      subjectCode: checked.subjectCode,
      stepId: checked.stepId,
      payload: checked.payload,
      prevHash: checked.prevHash,
    });
  });
});

describe('GET /api/history/verify', () => {
  it('401 unauthenticated when signed out', async () => {
    const { agent } = await anonymousAgent(lab.app);
    const response = await agent.get('/api/history/verify');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('200 intact for an empty history', async () => {
    const { agent } = await signedIn('reviewer');
    const response = await agent.get('/api/history/verify');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ checked: 0, intact: true, headHash: null, firstBroken: null });
  });

  it('200 intact for an untouched chain, having checked every event, with the newest hash as head', async () => {
    const { ids } = await someHistory();
    const { agent } = await signedIn('reviewer');
    const chain = await storedChain();
    const response = await agent.get('/api/history/verify');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      checked: ids.length,
      intact: true,
      headHash: chain[chain.length - 1].hash,
      firstBroken: null,
    });
    expect(ids.length).toBe(7);
  });

  describe("the database keeps the history append-only for the app's own role", () => {
    it.each([
      ['UPDATE', () => lab.knex('history_events').where({ id: 2 }).update({ type: 'sample.retired' })],
      ['DELETE', () => lab.knex('history_events').where({ id: 2 }).delete()],
      ['TRUNCATE', () => lab.knex.raw('truncate table history_events')],
    ])('refuses %s, and the chain stays intact', async (_statement, run) => {
      await someHistory();
      const before = await storedChain();
      // 42501 insufficient_privilege: the role lacks the privilege, before any trigger is reached.
      await expect(run()).rejects.toMatchObject({ code: '42501', message: expect.stringContaining('permission denied') });
      expect(await storedChain()).toEqual(before);
      const { agent } = await signedIn('reviewer');
      expect((await agent.get('/api/history/verify')).body).toMatchObject({ intact: true, checked: before.length });
    });

    it('refuses a superuser too while the append-only triggers are on', async () => {
      await someHistory();
      await expect(testAdminKnex()('history_events').where({ id: 2 }).update({ type: 'sample.retired' })).rejects.toThrow(
        /append-only/,
      );
      await expect(testAdminKnex()('history_events').where({ id: 2 }).delete()).rejects.toThrow(/append-only/);
    });
  });

  describe('a chain altered by a superuser with the triggers switched off', () => {
    it('200 not intact, naming an event whose payload was edited', async () => {
      const { ids } = await someHistory();
      const target = ids[3];
      await tamper(`update history_events set payload = jsonb_set(payload, '{material}', '"graphene"') where id = ?`, [target]);
      const { agent } = await signedIn('reviewer');
      const response = await agent.get('/api/history/verify');
      expect(response.status).toBe(200);
      expect(response.body).toEqual({
        checked: 4,
        intact: false,
        headHash: null,
        firstBroken: { eventId: target, reason: expect.stringContaining('payload') },
      });
    });

    it('200 not intact, naming the event after one deleted from the middle', async () => {
      const { ids } = await someHistory();
      await tamper('delete from history_events where id = ?', [ids[2]]);
      const { agent } = await signedIn('reviewer');
      const response = await agent.get('/api/history/verify');
      expect(response.body).toMatchObject({ intact: false, checked: 3, firstBroken: { eventId: ids[3] } });
      expect(response.body.firstBroken.reason).toMatch(/does not follow/);
    });

    it('200 not intact, naming an event whose recorded body and hash were both rewritten, by the next one', async () => {
      const { ids } = await someHistory();
      const target = ids[1];
      const event = await testAdminKnex()('history_events').where({ id: target }).first();
      const forged = JSON.stringify({ ...JSON.parse(event.body), actorId: null });
      await tamper('update history_events set actor_id = null, body = ?, hash = ? where id = ?', [
        forged,
        sha256(forged),
        target,
      ]);
      const { agent } = await signedIn('reviewer');
      const response = await agent.get('/api/history/verify');
      expect(response.body).toMatchObject({ intact: false, checked: 3, firstBroken: { eventId: ids[2] } });
    });

    it('200 not intact, naming an event whose time was moved', async () => {
      const { ids } = await someHistory();
      await tamper("update history_events set occurred_at = occurred_at - interval '1 day' where id = ?", [ids[5]]);
      const { agent } = await signedIn('reviewer');
      const response = await agent.get('/api/history/verify');
      expect(response.body).toMatchObject({ intact: false, checked: 6, firstBroken: { eventId: ids[5] } });
      expect(response.body.firstBroken.reason).toMatch(/occurredAt/);
    });
  });
});
