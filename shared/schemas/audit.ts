/**
 * The publication audit of a record (usually a device): its whole ancestry back to every source,
 * every step with who did it and when, every piece of thickness evidence with its file checked
 * now, the history chain checked now, and the gaps that stand between the record and a paper.
 */
import { z } from 'zod';
import { SAMPLE_KINDS, SAMPLE_STATUSES } from '../samples';
import { EVIDENCE_KINDS } from './evidence';
import { ChainVerification } from './history';
import { PersonRef } from './sample';
import { ZonePlateDesignSummary } from './zone-plate';

export const AUDIT_GAP_KINDS = [
  'step_without_operator',
  'step_without_time',
  'no_thickness_evidence',
  'disagreeing_evidence',
  'file_missing',
  'file_altered',
  'edited_after_device',
  'ancestry_gap',
  'chain_broken',
] as const;
export type AuditGapKind = (typeof AUDIT_GAP_KINDS)[number];

/** Headings people read for each kind of gap. */
export const AUDIT_GAP_LABELS: Record<AuditGapKind, string> = {
  step_without_operator: 'Step with no operator',
  step_without_time: 'Step with no start time',
  no_thickness_evidence: 'No thickness evidence',
  disagreeing_evidence: 'Thickness evidence disagrees',
  file_missing: 'Evidence file missing',
  file_altered: 'Evidence file altered',
  edited_after_device: 'Edited after the record was made',
  ancestry_gap: 'Ancestry incomplete',
  chain_broken: 'History chain broken',
};

/** One thing to fix (or explain) before publishing; names what it is about. */
export const AuditGap = z
  .object({
    kind: z.enum(AUDIT_GAP_KINDS),
    message: z.string(),
    sampleCode: z.string().nullable(),
    stepId: z.number().nullable(),
    evidenceId: z.number().nullable(),
    eventId: z.number().nullable(),
  })
  .meta({ id: 'AuditGap' });
export type AuditGap = z.infer<typeof AuditGap>;

/** One record of the audited ancestry (the audited record itself is generation 0). */
export const AuditRecord = z
  .object({
    code: z.string(),
    kind: z.enum(SAMPLE_KINDS),
    material: z.string(),
    name: z.string().nullable(),
    status: z.enum(SAMPLE_STATUSES),
    layerEstimate: z.number().nullable(),
    /** 0 for the audited record, −1 for its parents, −2 for theirs… (nearest path). */
    generation: z.number().int(),
    owner: PersonRef,
    createdAt: z.iso.datetime(),
    parentCodes: z.array(z.string()),
    /** Ids of the steps that made it (usually one). */
    madeByStepIds: z.array(z.number()),
    /** A record with no recorded parents that may begin an ancestry: a crystal, a precursor lot, a grown film. */
    isSource: z.boolean(),
  })
  .meta({ id: 'AuditRecord' });
export type AuditRecord = z.infer<typeof AuditRecord>;

export const AuditStep = z
  .object({
    id: z.number(),
    type: z.string(),
    label: z.string(),
    operator: PersonRef.nullable(),
    startedAt: z.iso.datetime().nullable(),
    endedAt: z.iso.datetime().nullable(),
    instrument: z.string().nullable(),
    parameters: z.record(z.string(), z.unknown()),
    notes: z.string().nullable(),
    inputCodes: z.array(z.string()),
    outputCodes: z.array(z.string()),
    /** Records worked on in place (e.g. an etched device): neither made nor used up. */
    treatedCodes: z.array(z.string()),
  })
  .meta({ id: 'AuditStep' });
export type AuditStep = z.infer<typeof AuditStep>;

export const FILE_CHECK_RESULTS = ['intact', 'missing', 'altered'] as const;
export type FileCheckResult = (typeof FILE_CHECK_RESULTS)[number];

export const AuditFile = z
  .object({
    sha256: z.string(),
    byteSize: z.number(),
    mediaType: z.string(),
    /** Checked while the audit was made: the stored bytes still hash to `sha256`. */
    check: z.enum(FILE_CHECK_RESULTS),
    thumbnailSha256: z.string().nullable(),
  })
  .meta({ id: 'AuditFile' });
export type AuditFile = z.infer<typeof AuditFile>;

export const AuditEvidence = z
  .object({
    id: z.number(),
    kind: z.enum(EVIDENCE_KINDS),
    sampleCode: z.string().nullable(),
    stepId: z.number().nullable(),
    layerCount: z.number().int().nullable(),
    layerUncertainty: z.number().nullable(),
    layerMethod: z.string().nullable(),
    originalName: z.string().nullable(),
    file: AuditFile,
    createdBy: PersonRef.nullable(),
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'AuditEvidence' });
export type AuditEvidence = z.infer<typeof AuditEvidence>;

/** A history event of an audited record, with the hashes that tie it into the chain. */
export const AuditEvent = z
  .object({
    id: z.number(),
    occurredAt: z.iso.datetime(),
    type: z.string(),
    actor: PersonRef.nullable(),
    subjectCode: z.string().nullable(),
    stepId: z.number().nullable(),
    prevHash: z.string(),
    hash: z.string(),
  })
  .meta({ id: 'AuditEvent' });
export type AuditEvent = z.infer<typeof AuditEvent>;

export const AuditReport = z
  .object({
    subject: AuditRecord,
    generatedAt: z.iso.datetime(),
    verdict: z.enum(['ready', 'not_ready']),
    gaps: z.array(AuditGap),
    /** Every ancestor once and the record itself, nearest generation first. */
    records: z.array(AuditRecord),
    steps: z.array(AuditStep),
    evidence: z.array(AuditEvidence),
    files: z.object({ checked: z.number(), intact: z.number(), missing: z.number(), altered: z.number() }),
    /** The whole history chain, recomputed while the audit was made. */
    chain: ChainVerification,
    /** History events about the audited records and steps, oldest first. */
    events: z.array(AuditEvent),
    lensDesign: ZonePlateDesignSummary.nullable(),
  })
  .meta({ id: 'AuditReport' });
export type AuditReport = z.infer<typeof AuditReport>;

export const AuditEnvelope = z.object({ audit: AuditReport }).meta({ id: 'AuditEnvelope' });
export type AuditEnvelope = z.infer<typeof AuditEnvelope>;
