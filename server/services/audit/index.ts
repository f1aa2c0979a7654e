import type { Knex } from 'knex';
import type { AuditGap } from '../../../shared/schemas/audit';
import type { SampleModel } from '../../models/sample-model';
import { collectAudit, type AuditCollection, type AuditFileStore } from './collect';
import { readinessGaps } from './readiness';

export type { AuditCollection, AuditFileStore } from './collect';

/** Collects a record's audit and judges its readiness: the input to the JSON, PDF and PROV exports. */
export async function auditOf(props: {
  knex: Knex;
  files: AuditFileStore;
  sample: SampleModel;
}): Promise<{ audit: AuditCollection; gaps: AuditGap[] }> {
  const audit = await collectAudit(props);
  return { audit, gaps: readinessGaps(audit) };
}
