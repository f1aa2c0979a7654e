import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useSyncExternalStore } from 'react';
import { z } from 'zod';
import { StepCreateInput, StepEnvelope, type StepCreate } from '@/shared/schemas/step';
import { ApiError, apiFetch, isApiError } from './api-client';
import { newIdempotencyKey, readOutbox, writeOutbox } from './outbox-storage';
import { sampleKeys, stepKeys } from './query-keys';
import { useSessionQuery } from './use-session';

/** An unusual but allowed value the server noticed (e.g. many more peel cycles than usual). */
export const StepWarning = z.object({ path: z.unknown().optional(), message: z.string() });
export type StepWarning = z.infer<typeof StepWarning>;

/** The answer to logging a step; servers without warnings yet answer without the list. */
export const StepCreated = StepEnvelope.extend({ warnings: z.array(StepWarning).default([]) });
export type StepCreated = z.infer<typeof StepCreated>;

/**
 * waiting: kept on the device until the server can be reached; sending: on its way now;
 * refused: the server answered and said no (e.g. the crystal was retired meanwhile) — kept until
 * the person edits or discards it, never dropped.
 */
export type OutboxState = 'waiting' | 'sending' | 'refused';

const OutboxProblem = z.object({
  status: z.number(),
  code: z.string(),
  message: z.string(),
  fields: z.record(z.string(), z.array(z.string())).default({}),
});
export type OutboxProblem = z.infer<typeof OutboxProblem>;

const StoredItem = z.object({
  key: z.string(),
  userId: z.number(),
  createdAt: z.string(),
  /** One line for the list: "Exfoliation of CR-…, 4 chips". */
  summary: z.string(),
  body: z.unknown(),
  state: z.enum(['waiting', 'sending', 'refused']),
  problem: OutboxProblem.nullable().default(null),
  attempts: z.number().default(0),
});

export interface OutboxItem extends Omit<z.infer<typeof StoredItem>, 'body'> {
  body: StepCreate;
}

export interface SyncedRun {
  key: string;
  stepId: number;
  summary: string;
  syncedAt: string;
}

interface OutboxSnapshot {
  items: readonly OutboxItem[];
  synced: readonly SyncedRun[];
  syncing: boolean;
  /** False when the device refused to keep the queue (private window, full storage). */
  persisted: boolean;
}

function load(): OutboxItem[] {
  const raw = readOutbox();
  if (!raw) return [];
  let parsed: unknown;
  try {
    parsed = JSON.parse(raw);
  } catch {
    return [];
  }
  const list = z.array(StoredItem).safeParse(parsed);
  if (!list.success) return [];
  return list.data.flatMap((item) => {
    const body = StepCreateInput.safeParse(item.body);
    if (!body.success) return [];
    // A send cut short by closing the app is simply waiting again.
    return [{ ...item, body: body.data, state: item.state === 'sending' ? 'waiting' : item.state }];
  });
}

let snapshot: OutboxSnapshot = { items: [], synced: [], syncing: false, persisted: true };
let loaded = false;
const listeners = new Set<() => void>();

function ensureLoaded() {
  if (loaded) return;
  loaded = true;
  snapshot = { ...snapshot, items: load() };
}

function update(patch: Partial<OutboxSnapshot>) {
  snapshot = { ...snapshot, ...patch };
  if (patch.items) snapshot.persisted = writeOutbox(JSON.stringify(patch.items));
  listeners.forEach((listener) => listener());
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function getSnapshot(): OutboxSnapshot {
  ensureLoaded();
  return snapshot;
}

const setItem = (key: string, change: (item: OutboxItem) => OutboxItem) =>
  update({ items: snapshot.items.map((item) => (item.key === key ? change(item) : item)) });

const removeItem = (key: string) => update({ items: snapshot.items.filter((item) => item.key !== key) });

/** A refusal worth keeping: the server answered. Anything that never reached it is "waiting". */
function isUnreachable(error: unknown): boolean {
  return isApiError(error, 'network_unreachable') || !(error instanceof ApiError);
}

function problemOf(error: ApiError): OutboxProblem {
  return { status: error.status, code: error.code, message: error.message, fields: error.fields };
}

/** The same key and body every time: a replay returns the first answer and creates nothing. */
function postStep(key: string, body: StepCreate): Promise<StepCreated> {
  return apiFetch('/api/steps', { method: 'POST', body, headers: { 'Idempotency-Key': key }, schema: StepCreated });
}

function rememberSynced(item: OutboxItem, created: StepCreated) {
  const run: SyncedRun = { key: item.key, stepId: created.step.id, summary: item.summary, syncedAt: new Date().toISOString() };
  update({ synced: [run, ...snapshot.synced.filter((other) => other.key !== item.key)].slice(0, 10) });
}

let running: Promise<void> | null = null;

/** Retry timing: judgement for a bench phone on flaky Wi-Fi (common practice, no source). */
const ONLINE_SETTLE_MS = 1500;
const RETRY_EVERY_MS = 15_000;

/** Sends every waiting run of this person, one after another; stops at the first unreachable. */
function syncAll(userId: number, onSent: () => void): Promise<void> {
  if (running) return running;
  const run = async () => {
    update({ syncing: true });
    try {
      for (const item of snapshot.items.filter((entry) => entry.userId === userId && entry.state === 'waiting')) {
        setItem(item.key, (current) => ({ ...current, state: 'sending', attempts: current.attempts + 1 }));
        try {
          const created = await postStep(item.key, item.body);
          removeItem(item.key);
          rememberSynced(item, created);
          onSent();
        } catch (error) {
          if (isUnreachable(error) || !(error instanceof ApiError)) {
            setItem(item.key, (current) => ({ ...current, state: 'waiting' }));
            break;
          }
          setItem(item.key, (current) => ({ ...current, state: 'refused', problem: problemOf(error) }));
        }
      }
    } finally {
      update({ syncing: false });
    }
  };
  // Cleared in a later tick, so a run with nothing to send cannot leave a finished promise behind.
  running = run().finally(() => {
    running = null;
  });
  return running;
}

export type SubmitResult = { kind: 'sent'; created: StepCreated } | { kind: 'queued'; key: string };

export interface StepSubmission {
  /** Made once per press of the submit button and kept through every retry of it. */
  key: string;
  body: StepCreate;
  summary: string;
  /** The refused run this one corrects; it leaves the queue once this one is sent or queued. */
  replaces?: string | null;
}

export { newIdempotencyKey };

/**
 * Logging a step that survives a bad network: sent at once when the server answers, kept on
 * the device and sent again (same idempotency key) when it does not — on app start, when the
 * browser comes back online and on "Sync now".
 */
export function useStepOutbox() {
  const queryClient = useQueryClient();
  const session = useSessionQuery();
  const userId = session.data?.id ?? null;
  const state = useSyncExternalStore(subscribe, getSnapshot, getSnapshot);

  const refresh = useCallback(() => {
    void queryClient.invalidateQueries({ queryKey: stepKeys.all });
    void queryClient.invalidateQueries({ queryKey: sampleKeys.all });
  }, [queryClient]);

  const syncNow = useCallback(() => (userId === null ? Promise.resolve() : syncAll(userId, refresh)), [userId, refresh]);

  const waiting = state.items.some((item) => item.userId === userId && item.state === 'waiting');

  useEffect(() => {
    if (userId === null) return undefined;
    void syncNow();
    if (typeof window === 'undefined' || typeof window.addEventListener !== 'function') return undefined;
    // The "online" event can arrive a moment before requests get through; a second try follows.
    let later: ReturnType<typeof setTimeout> | undefined;
    const online = () => {
      void syncNow();
      later = setTimeout(() => void syncNow(), ONLINE_SETTLE_MS);
    };
    window.addEventListener('online', online);
    return () => {
      window.removeEventListener('online', online);
      clearTimeout(later);
    };
  }, [userId, syncNow]);

  // "Online" is not always announced (lab Wi-Fi that drops packets, not the link): keep trying.
  useEffect(() => {
    if (!waiting) return undefined;
    const timer = setInterval(() => void syncNow(), RETRY_EVERY_MS);
    return () => clearInterval(timer);
  }, [waiting, syncNow]);

  const submit = useCallback(
    async ({ key, body, summary, replaces }: StepSubmission): Promise<SubmitResult> => {
      if (userId === null) throw new ApiError(401, 'unauthenticated', '');
      try {
        const created = await postStep(key, body);
        if (replaces) removeItem(replaces);
        removeItem(key);
        refresh();
        return { kind: 'sent', created };
      } catch (error) {
        if (!isUnreachable(error)) throw error;
        const item: OutboxItem = {
          key,
          userId,
          createdAt: new Date().toISOString(),
          summary,
          body,
          state: 'waiting',
          problem: null,
          attempts: 1,
        };
        update({
          items: [...snapshot.items.filter((other) => other.key !== key && other.key !== replaces), item],
        });
        return { kind: 'queued', key };
      }
    },
    [userId, refresh],
  );

  const discard = useCallback((key: string) => removeItem(key), []);

  return {
    items: state.items.filter((item) => item.userId === userId),
    synced: state.synced,
    syncing: state.syncing,
    persisted: state.persisted,
    submit,
    syncNow,
    discard,
  };
}

/** One run in the queue, for the form that corrects a refused run. */
export function useOutboxItem(key: string | null): OutboxItem | null {
  const state = useSyncExternalStore(subscribe, getSnapshot, getSnapshot);
  return key ? (state.items.find((item) => item.key === key) ?? null) : null;
}
