import { useQuery } from '@tanstack/react-query';
import { AuditEnvelope } from '@/shared/schemas/audit';
import { SharedAudit } from '@/shared/schemas/share-link';
import { apiFetch } from './api-client';
import { auditKeys, STALE_TIMES } from './query-keys';

const auditBase = (code: string) => `/api/samples/${encodeURIComponent(code)}`;
const sharedBase = (token: string) => `/api/shared/${encodeURIComponent(token)}`;

/** Where the two exports of an audit download from: the record's own (signed in) or a share link's. */
export interface AuditExports {
  pdf: string;
  jsonLd: string;
  /** File names for the browser's download, naming the record. */
  pdfName: string;
  jsonLdName: string;
}

const fileStem = (code: string) => `${code.replace(/[^A-Za-z0-9-]/g, '_')}-audit`;

export function auditExports(code: string): AuditExports {
  return {
    pdf: `${auditBase(code)}/audit.pdf`,
    jsonLd: `${auditBase(code)}/audit.jsonld`,
    pdfName: `${fileStem(code)}.pdf`,
    jsonLdName: `${fileStem(code)}.jsonld`,
  };
}

export function sharedAuditExports(token: string, code: string): AuditExports {
  return {
    pdf: `${sharedBase(token)}/audit.pdf`,
    jsonLd: `${sharedBase(token)}/audit.jsonld`,
    pdfName: `${fileStem(code)}.pdf`,
    jsonLdName: `${fileStem(code)}.jsonld`,
  };
}

/** A micrograph's small preview, served beside its file. */
export function thumbnailPath(sha256: string): string {
  return `/api/files/${encodeURIComponent(sha256)}/thumbnail`;
}

/** The publication audit of a record: ancestry, steps, evidence, file and chain checks, gaps. */
export function useAuditQuery(code: string) {
  return useQuery({
    queryKey: auditKeys.report(code),
    queryFn: async ({ signal }) => (await apiFetch(`${auditBase(code)}/audit`, { schema: AuditEnvelope, signal })).audit,
    enabled: code.length > 0,
    staleTime: STALE_TIMES.audit,
  });
}

/**
 * The audit behind a share link, for someone signed out. Each fetch is logged as an opening, so it
 * is not refetched on focus; an expired or revoked link answers 410 and is not retried.
 */
export function useSharedAuditQuery(token: string) {
  return useQuery({
    queryKey: auditKeys.shared(token),
    queryFn: ({ signal }) => apiFetch(sharedBase(token), { schema: SharedAudit, signal }),
    enabled: token.length > 0,
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });
}
