/**
 * Read-only links to one record's audit for a reviewer outside the lab: issued by a manager,
 * expiring, revocable; the token is shown once and kept only as its SHA-256.
 */
import { z } from 'zod';
import { AuditReport } from './audit';
import { PersonRef } from './sample';

/** Longest a share link may live (common practice, no source: a journal's review round). */
export const SHARE_LINK_MAX_DAYS = 90;
export const SHARE_LINK_DEFAULT_DAYS = 14;
/** 32 random bytes in base64url. */
export const SHARE_TOKEN_LENGTH = 43;

export const ShareLinkCreateInput = z
  .object({
    expiresInDays: z
      .number({ error: 'Give the number of days the link works.' })
      .int('Give a whole number of days.')
      .min(1, 'The link must work for at least one day.')
      .max(SHARE_LINK_MAX_DAYS, `A link can work for at most ${SHARE_LINK_MAX_DAYS} days.`)
      .default(SHARE_LINK_DEFAULT_DAYS),
  })
  .meta({ id: 'ShareLinkCreateInput' });
export type ShareLinkCreateInput = z.input<typeof ShareLinkCreateInput>;

export const SHARE_LINK_STATUSES = ['active', 'expired', 'revoked'] as const;
export type ShareLinkStatus = (typeof SHARE_LINK_STATUSES)[number];

export const ShareLink = z
  .object({
    id: z.number(),
    sampleCode: z.string(),
    status: z.enum(SHARE_LINK_STATUSES),
    createdBy: PersonRef,
    createdAt: z.iso.datetime(),
    expiresAt: z.iso.datetime(),
    revokedAt: z.iso.datetime().nullable(),
    revokedBy: PersonRef.nullable(),
    openCount: z.number().int(),
    lastOpenedAt: z.iso.datetime().nullable(),
  })
  .meta({ id: 'ShareLink' });
export type ShareLink = z.infer<typeof ShareLink>;

/** Answer to creating a link: the only time the token (and the URL holding it) is shown. */
export const ShareLinkCreated = z
  .object({ shareLink: ShareLink, token: z.string(), url: z.string() })
  .meta({ id: 'ShareLinkCreated' });
export type ShareLinkCreated = z.infer<typeof ShareLinkCreated>;

export const ShareLinkEnvelope = z.object({ shareLink: ShareLink }).meta({ id: 'ShareLinkEnvelope' });
export type ShareLinkEnvelope = z.infer<typeof ShareLinkEnvelope>;

export const ShareLinkList = z.object({ shareLinks: z.array(ShareLink) }).meta({ id: 'ShareLinkList' });
export type ShareLinkList = z.infer<typeof ShareLinkList>;

export const ShareTokenParam = z.object({
  token: z
    .string({ error: 'The link is incomplete.' })
    .regex(new RegExp(`^[A-Za-z0-9_-]{${SHARE_TOKEN_LENGTH}}$`), 'The link is incomplete or damaged.'),
});

/** What an outside reviewer sees through a link: the audit and how long the link still works. */
export const SharedAudit = z
  .object({ audit: AuditReport, sampleCode: z.string(), expiresAt: z.iso.datetime() })
  .meta({ id: 'SharedAudit' });
export type SharedAudit = z.infer<typeof SharedAudit>;
