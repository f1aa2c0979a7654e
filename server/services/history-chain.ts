import { createHash } from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';
import type { Knex } from 'knex';
import type { HistoryEventType } from '../../shared/schemas/history';
import type { ChainVerification } from '../../shared/schemas/history';
import { HistoryEventModel } from '../models/history-event-model';

/** The hash a chain starts from. */
export const GENESIS_HASH = '0'.repeat(64);
// Any fixed number: the advisory lock that makes appends to the chain one at a time.
const CHAIN_LOCK_KEY = 0x466c616b;
const VERIFY_BATCH = 5_000;

export interface NewHistoryEvent {
  type: HistoryEventType;
  actorId: number | null;
  subjectCode?: string | null;
  stepId?: number | null;
  payload: Record<string, unknown>;
}

/** The hashed text of an event: fixed key order, so the same event always gives the same bytes. */
export function eventBody(event: {
  id: number;
  occurredAt: string;
  actorId: number | null;
  type: string;
  subjectCode: string | null;
  stepId: number | null;
  payload: Record<string, unknown>;
  prevHash: string;
}): string {
  return JSON.stringify({
    id: event.id,
    occurredAt: event.occurredAt,
    actorId: event.actorId,
    type: event.type,
    subjectCode: event.subjectCode,
    stepId: event.stepId,
    payload: event.payload,
    prevHash: event.prevHash,
  });
}

export const sha256Hex = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

/**
 * Appends events to the history inside the caller's transaction, so a change and its history
 * commit or roll back together. The chain lock is held until that transaction ends.
 */
export async function appendHistory(trx: Knex.Transaction, events: NewHistoryEvent[]): Promise<void> {
  if (events.length === 0) return;
  await trx.raw('select pg_advisory_xact_lock(?)', [CHAIN_LOCK_KEY]);
  const last = await trx('history_events').select('hash').orderBy('id', 'desc').first();
  let prevHash: string = last?.hash ?? GENESIS_HASH;
  const occurredAt = new Date().toISOString();
  const rows = [];
  for (const event of events) {
    const { rows: sequence } = await trx.raw("select nextval('history_events_id_seq')::bigint as id");
    const fields = {
      id: Number(sequence[0].id),
      occurredAt,
      actorId: event.actorId,
      type: event.type,
      subjectCode: event.subjectCode ?? null,
      stepId: event.stepId ?? null,
      // Through JSON once, so what is stored equals what was hashed (no undefined, no Dates).
      payload: JSON.parse(JSON.stringify(event.payload)) as Record<string, unknown>,
      prevHash,
    };
    const body = eventBody(fields);
    const hash = sha256Hex(body);
    rows.push({ ...fields, payload: JSON.stringify(fields.payload), body, hash });
    prevHash = hash;
  }
  await trx('history_events').insert(rows);
}

/** Why an event fails its check, or null when it is intact and follows `expectedPrevHash`. */
export function checkEvent(event: HistoryEventModel, expectedPrevHash: string): string | null {
  if (sha256Hex(event.body) !== event.hash) return 'its hash does not match its recorded content';
  if (event.prevHash !== expectedPrevHash) return 'it does not follow the event before it (the chain was cut or reordered)';
  const recorded = JSON.parse(event.body) as Record<string, unknown>;
  const columns = {
    id: event.id,
    occurredAt: event.occurredAt.toISOString(),
    actorId: event.actorId,
    type: event.type,
    subjectCode: event.subjectCode,
    stepId: event.stepId,
    payload: event.payload,
    prevHash: event.prevHash,
  };
  for (const [field, value] of Object.entries(columns)) {
    if (!isDeepStrictEqual(recorded[field], value)) return `its ${field} was changed after it was recorded`;
  }
  return null;
}

/** Recomputes the whole chain, oldest first, and names the first event that fails. */
export async function verifyHistory(knex: Knex): Promise<ChainVerification> {
  let expectedPrevHash = GENESIS_HASH;
  let checked = 0;
  let afterId = 0;
  for (;;) {
    const batch = await HistoryEventModel.query(knex).where('id', '>', afterId).orderBy('id').limit(VERIFY_BATCH);
    for (const event of batch) {
      const reason = checkEvent(event, expectedPrevHash);
      checked += 1;
      if (reason) return { checked, intact: false, headHash: null, firstBroken: { eventId: event.id, reason } };
      expectedPrevHash = event.hash;
    }
    if (batch.length < VERIFY_BATCH) break;
    afterId = batch[batch.length - 1].id;
  }
  return { checked, intact: true, headHash: checked ? expectedPrevHash : null, firstBroken: null };
}
