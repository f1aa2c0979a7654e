import type { Response } from 'express';
import type { AuditGap } from '../../../shared/schemas/audit';
import type { AuditCollection, AuditFileStore } from './collect';
import { auditPdf } from './pdf';
import { auditJsonLd } from './prov-jsonld';

type Audited = { audit: AuditCollection; gaps: AuditGap[] };

/** A file name safe in a Content-Disposition header: the code's check symbol may be * ~ $ = or U. */
const fileName = (audit: AuditCollection, extension: string) =>
  `flakeline-audit-${audit.subject.code.replace(/[^A-Za-z0-9-]/g, '_')}-${audit.generatedAt.slice(0, 10)}.${extension}`;

export async function sendAuditPdf(res: Response, { audit, gaps }: Audited, files: AuditFileStore): Promise<void> {
  const pdf = await auditPdf(audit, gaps, files);
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `inline; filename="${fileName(audit, 'pdf')}"`);
  res.send(pdf);
}

export function sendAuditJsonLd(res: Response, { audit, gaps }: Audited, publicBaseUrl: string): void {
  res.setHeader('Content-Type', 'application/ld+json; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${fileName(audit, 'jsonld')}"`);
  res.send(JSON.stringify(auditJsonLd(audit, gaps, publicBaseUrl), null, 2));
}
