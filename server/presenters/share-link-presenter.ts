import type { ShareLink, ShareLinkStatus } from '../../shared/schemas/share-link';
import type { ShareLinkModel } from '../models/share-link-model';

export function shareLinkStatus(link: Pick<ShareLinkModel, 'revokedAt' | 'expiresAt'>, now = Date.now()): ShareLinkStatus {
  if (link.revokedAt) return 'revoked';
  return link.expiresAt.getTime() <= now ? 'expired' : 'active';
}

/** A link as its manager sees it; never the token (it is not stored). */
export function presentShareLink(link: ShareLinkModel, sampleCode: string): ShareLink {
  return {
    id: link.id,
    sampleCode,
    status: shareLinkStatus(link),
    createdBy: { id: link.createdById, displayName: link.createdBy?.displayName ?? 'Unknown' },
    createdAt: link.createdAt.toISOString(),
    expiresAt: link.expiresAt.toISOString(),
    revokedAt: link.revokedAt?.toISOString() ?? null,
    revokedBy: link.revokedById === null ? null : { id: link.revokedById, displayName: link.revokedBy?.displayName ?? 'Unknown' },
    openCount: link.openCount,
    lastOpenedAt: link.lastOpenedAt?.toISOString() ?? null,
  };
}
