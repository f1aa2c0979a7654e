import { z } from 'zod';

export const HISTORY_EVENT_TYPES = [
  'sample.created',
  'sample.edited',
  'sample.status_changed',
  'sample.retired',
  'sample.used',
  'sample.treated',
  'sample.linked',
  'sample.moved',
  'step.logged',
  'samples.imported',
  'lab_settings.changed',
  'lens_design.saved',
  'measurement.added',
  'measurement.deleted',
  'share_link.created',
  'share_link.revoked',
  'share_link.opened',
  'evidence.added',
  'evidence.edited',
  'evidence.analysed',
  'calibration.created',
  'calibration.retired',
] as const;
export type HistoryEventType = (typeof HISTORY_EVENT_TYPES)[number];

export const HistoryEvent = z
  .object({
    id: z.number(),
    occurredAt: z.iso.datetime(),
    type: z.string(),
    actor: z.object({ id: z.number(), displayName: z.string() }).nullable(),
    subjectCode: z.string().nullable(),
    stepId: z.number().nullable(),
    payload: z.record(z.string(), z.unknown()),
    prevHash: z.string(),
    hash: z.string(),
  })
  .meta({ id: 'HistoryEvent' });
export type HistoryEvent = z.infer<typeof HistoryEvent>;

export const HistoryList = z.object({ events: z.array(HistoryEvent) }).meta({ id: 'HistoryList' });
export type HistoryList = z.infer<typeof HistoryList>;

export const ChainVerification = z
  .object({
    checked: z.number(),
    intact: z.boolean(),
    headHash: z.string().nullable(),
    firstBroken: z.object({ eventId: z.number(), reason: z.string() }).nullable(),
  })
  .meta({ id: 'ChainVerification' });
export type ChainVerification = z.infer<typeof ChainVerification>;
