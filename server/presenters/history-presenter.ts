import type { HistoryEvent } from '../../shared/schemas/history';
import type { HistoryEventModel } from '../models/history-event-model';

export function presentHistoryEvent(event: HistoryEventModel): HistoryEvent {
  return {
    id: event.id,
    occurredAt: event.occurredAt.toISOString(),
    type: event.type,
    actor: event.actor ? { id: event.actor.id, displayName: event.actor.displayName } : null,
    subjectCode: event.subjectCode,
    stepId: event.stepId,
    payload: event.payload,
    prevHash: event.prevHash,
    hash: event.hash,
  };
}
