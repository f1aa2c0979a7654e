import type { AuditGap, AuditReport } from '../../shared/schemas/audit';
import type { AuditCollection } from '../services/audit/collect';

/** The audit as JSON: everything collected, the gaps and the verdict. */
export function presentAudit(audit: AuditCollection, gaps: AuditGap[]): AuditReport {
  const count = (check: string) => audit.evidence.filter((item) => item.file.check === check).length;
  return {
    subject: audit.subject,
    generatedAt: audit.generatedAt,
    verdict: gaps.length === 0 ? 'ready' : 'not_ready',
    gaps,
    records: audit.records,
    steps: audit.steps,
    evidence: audit.evidence,
    files: { checked: audit.evidence.length, intact: count('intact'), missing: count('missing'), altered: count('altered') },
    chain: audit.chain,
    events: audit.events.map(({ body: _body, payload: _payload, ...event }) => event),
    lensDesign: audit.lensDesign,
  };
}
