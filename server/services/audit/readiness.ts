/**
 * The readiness list: what stands between an audited record and a paper. Each gap names the
 * record, step, evidence item or event it is about. No gaps: ready.
 */
import type { AuditGap, AuditGapKind } from '../../../shared/schemas/audit';
import type { SampleKind } from '../../../shared/samples';
import type { AuditCollection, CollectedEvent } from './collect';

/** Records whose thickness is part of what a paper claims. */
const THICKNESS_KINDS: readonly SampleKind[] = ['flake', 'film'];

/**
 * Changes to what a record says: its fields, its retirement, a status set by hand, and edits to
 * what its evidence says. Not its use in later steps, its storage place, or evidence added or
 * analysed later (more evidence is not a changed claim).
 */
function isEdit(event: Pick<CollectedEvent, 'type' | 'stepId'>): boolean {
  if (['sample.edited', 'sample.retired', 'evidence.edited'].includes(event.type)) return true;
  // A status set by hand; a step using a sample up sets it too, with its step id.
  return event.type === 'sample.status_changed' && event.stepId === null;
}

const gap = (kind: AuditGapKind, message: string, about: Partial<Omit<AuditGap, 'kind' | 'message'>> = {}): AuditGap => ({
  kind,
  message,
  sampleCode: about.sampleCode ?? null,
  stepId: about.stepId ?? null,
  evidenceId: about.evidenceId ?? null,
  eventId: about.eventId ?? null,
});

export function readinessGaps(audit: AuditCollection): AuditGap[] {
  const gaps: AuditGap[] = [];

  if (!audit.chain.intact) {
    const broken = audit.chain.firstBroken;
    gaps.push(
      gap('chain_broken', `The history chain fails at event ${broken?.eventId}: ${broken?.reason}.`, {
        eventId: broken?.eventId ?? null,
      }),
    );
  }

  // Oldest generation first, so the list reads from the sources towards the record.
  const records = [...audit.records].sort((a, b) => a.generation - b.generation || a.code.localeCompare(b.code));
  for (const record of records) {
    if (record.parentCodes.length === 0 && !record.isSource) {
      gaps.push(
        gap(
          'ancestry_gap',
          `${record.code} (${record.kind}, ${record.material}) has no recorded parents, yet a ${record.kind} is made from something: its origin is not in the log.`,
          { sampleCode: record.code },
        ),
      );
    }
  }

  for (const step of audit.steps) {
    const made = [...step.outputCodes, ...step.treatedCodes];
    const what = `Step ${step.id} (${step.label}${made.length ? ` → ${made.join(', ')}` : ''})`;
    if (!step.operator) gaps.push(gap('step_without_operator', `${what} names no operator.`, { stepId: step.id }));
    if (!step.startedAt) gaps.push(gap('step_without_time', `${what} has no start time.`, { stepId: step.id }));
  }

  for (const record of records) {
    if (!THICKNESS_KINDS.includes(record.kind)) continue;
    const counts = audit.evidence.filter((item) => item.sampleCode === record.code && item.layerCount !== null);
    const distinct = [...new Set(counts.map((item) => item.layerCount as number))].sort((a, b) => a - b);
    if (distinct.length === 0) {
      gaps.push(
        gap(
          'no_thickness_evidence',
          `${record.code} (${record.kind}, ${record.material}) has no thickness evidence with a layer count.`,
          {
            sampleCode: record.code,
          },
        ),
      );
    } else if (distinct.length > 1) {
      const said = counts.map((item) => `${item.kind} #${item.id} says ${item.layerCount}`).join(', ');
      gaps.push(
        gap('disagreeing_evidence', `The thickness evidence of ${record.code} disagrees: ${said}.`, {
          sampleCode: record.code,
          evidenceId: counts[0].id,
        }),
      );
    }
  }

  for (const item of audit.evidence) {
    if (item.file.check === 'intact') continue;
    const kind = item.file.check === 'missing' ? 'file_missing' : 'file_altered';
    const state = item.file.check === 'missing' ? 'is missing from storage' : 'no longer matches its checksum';
    gaps.push(
      gap(
        kind,
        `The file of ${item.kind} evidence #${item.id}${item.sampleCode ? ` on ${item.sampleCode}` : ''} ${state} (SHA-256 ${item.file.sha256.slice(0, 12)}…).`,
        {
          sampleCode: item.sampleCode,
          stepId: item.stepId,
          evidenceId: item.id,
        },
      ),
    );
  }

  const madeAt = audit.subjectCreatedAt.getTime();
  const ancestorCodes = new Set(audit.records.filter((record) => record.generation < 0).map((record) => record.code));
  for (const event of audit.events) {
    if (!event.subjectCode || !ancestorCodes.has(event.subjectCode) || !isEdit(event)) continue;
    if (Date.parse(event.occurredAt) <= madeAt) continue;
    gaps.push(
      gap(
        'edited_after_device',
        `${event.subjectCode} was changed (${event.type}, event ${event.id}) on ${event.occurredAt.slice(0, 16).replace('T', ' ')} UTC, after ${audit.subject.code} was made.`,
        { sampleCode: event.subjectCode, eventId: event.id },
      ),
    );
  }
  return gaps;
}
