/**
 * Gathers everything an audit reports about one record: its ancestry (one recursive query), the
 * steps that made or treated those records, their thickness evidence with each file re-checked,
 * the history events about them with the exact hashed text, and the whole chain re-verified.
 */
import type { Knex } from 'knex';
import type { AuditEvidence, AuditRecord, AuditStep, FileCheckResult } from '../../../shared/schemas/audit';
import type { ChainVerification } from '../../../shared/schemas/history';
import type { ZonePlateDesignSummary } from '../../../shared/schemas/zone-plate';
import type { SampleKind, SampleStatus } from '../../../shared/samples';
import { STEP_TYPE_LABELS, type StepType } from '../../../shared/steps';
import type { SampleModel } from '../../models/sample-model';
import { verifyHistory } from '../history-chain';
import { currentDesignOf } from '../lens-designs';
import { lineageOf } from '../lineage';

/** What the audit needs from the file store (see server/files): re-check a file, read one. */
export interface AuditFileStore {
  verify(sha256: string): Promise<FileCheckResult>;
  read(sha256: string): Promise<Buffer>;
}

/** A history event of an audited record with the exact text its hash was computed from. */
export interface CollectedEvent {
  id: number;
  occurredAt: string;
  type: string;
  actor: { id: number; displayName: string } | null;
  subjectCode: string | null;
  stepId: number | null;
  payload: Record<string, unknown>;
  body: string;
  prevHash: string;
  hash: string;
}

export interface ParentLink {
  parentCode: string;
  childCode: string;
  stepId: number;
}

export interface AuditCollection {
  generatedAt: string;
  subject: AuditRecord;
  /** Subject first, then ancestors by generation (−1, −2…) and code. */
  records: AuditRecord[];
  links: ParentLink[];
  steps: AuditStep[];
  evidence: AuditEvidence[];
  events: CollectedEvent[];
  chain: ChainVerification;
  lensDesign: ZonePlateDesignSummary | null;
  /** When the audited record was made (its record's creation). */
  subjectCreatedAt: Date;
}

/** Kinds that begin an ancestry: nothing in the lab made them. A grown film is one when its growth run is logged. */
const SOURCE_KINDS: readonly SampleKind[] = ['crystal', 'precursor'];

interface RecordRow {
  id: number;
  code: string;
  kind: SampleKind;
  material: string;
  name: string | null;
  status: SampleStatus;
  layerEstimate: number | null;
  createdAt: Date;
  ownerId: number;
  ownerName: string | null;
}

const iso = (value: Date | string | null) => (value === null ? null : new Date(value).toISOString());

export async function collectAudit(props: { knex: Knex; files: AuditFileStore; sample: SampleModel }): Promise<AuditCollection> {
  const { knex, files, sample } = props;
  const generatedAt = new Date().toISOString();
  const ancestors = await lineageOf(knex, sample.id, 'ancestors');
  const generationOf = new Map<string, number>([[sample.code, 0], ...ancestors.map((a) => [a.code, -a.generation] as const)]);
  const codes = [...generationOf.keys()];

  const recordRows: RecordRow[] = await knex('samples as s')
    .leftJoin('users as u', 'u.id', 's.owner_id')
    .whereIn('s.code', codes)
    .select(
      's.id',
      's.code',
      's.kind',
      's.material',
      's.name',
      's.status',
      's.layer_estimate',
      's.created_at',
      's.owner_id',
      'u.display_name as ownerName',
    );
  const ids = recordRows.map((row) => row.id);

  const links: ParentLink[] = await knex('lineage_links as l')
    .join('samples as p', 'p.id', 'l.parent_id')
    .join('samples as c', 'c.id', 'l.child_id')
    .whereIn('l.child_id', ids)
    .orderBy(['l.step_id', 'p.code', 'c.code'])
    .select('p.code as parentCode', 'c.code as childCode', 'l.step_id as stepId');

  // Steps that made a record of the ancestry or worked on one in place.
  const participations: { stepId: number; role: string; code: string; position: number }[] = await knex('step_samples as ss')
    .join('samples as s', 's.id', 'ss.sample_id')
    .whereIn(
      'ss.step_id',
      knex('step_samples').whereIn('sample_id', ids).whereIn('role', ['output', 'treated']).select('step_id'),
    )
    .orderBy(['ss.step_id', 'ss.role', 'ss.position'])
    .select('ss.step_id', 'ss.role', 's.code', 'ss.position');
  const stepIds = [...new Set(participations.map((row) => row.stepId))];
  const stepRows = await knex('steps as st')
    .leftJoin('users as u', 'u.id', 'st.operator_id')
    .whereIn('st.id', stepIds)
    .orderBy([{ column: 'st.started_at', nulls: 'first' }, 'st.id'])
    .select('st.*', 'u.display_name as operatorName');

  const madeBy = new Map<string, number[]>();
  for (const row of participations) {
    if (row.role !== 'output' || !generationOf.has(row.code)) continue;
    madeBy.set(row.code, [...(madeBy.get(row.code) ?? []), row.stepId]);
  }
  const stepTypeOf = new Map<number, string>(stepRows.map((row: { id: number; type: string }) => [row.id, row.type]));
  const parentsOf = new Map<string, string[]>();
  for (const link of links) {
    const list = parentsOf.get(link.childCode) ?? [];
    if (!list.includes(link.parentCode)) list.push(link.parentCode);
    parentsOf.set(link.childCode, list);
  }

  const records: AuditRecord[] = recordRows
    .map((row) => {
      const parentCodes = parentsOf.get(row.code) ?? [];
      const madeByStepIds = madeBy.get(row.code) ?? [];
      const grown = row.kind === 'film' && madeByStepIds.some((id) => stepTypeOf.get(id) === 'cvd_growth');
      return {
        code: row.code,
        kind: row.kind,
        material: row.material,
        name: row.name,
        status: row.status,
        layerEstimate: row.layerEstimate,
        generation: generationOf.get(row.code) ?? 0,
        owner: { id: row.ownerId, displayName: row.ownerName ?? 'Unknown' },
        createdAt: new Date(row.createdAt).toISOString(),
        parentCodes,
        madeByStepIds,
        isSource: parentCodes.length === 0 && (SOURCE_KINDS.includes(row.kind) || grown),
      };
    })
    .sort((a, b) => b.generation - a.generation || a.code.localeCompare(b.code));

  const steps: AuditStep[] = stepRows.map(
    (row: {
      id: number;
      type: string;
      operatorId: number | null;
      operatorName: string | null;
      startedAt: Date | null;
      endedAt: Date | null;
      instrument: string | null;
      parameters: Record<string, unknown>;
      notes: string | null;
    }) => {
      const of = (role: string) => participations.filter((p) => p.stepId === row.id && p.role === role).map((p) => p.code);
      return {
        id: row.id,
        type: row.type,
        label: STEP_TYPE_LABELS[row.type as StepType] ?? row.type,
        operator: row.operatorId === null ? null : { id: row.operatorId, displayName: row.operatorName ?? 'Unknown' },
        startedAt: iso(row.startedAt),
        endedAt: iso(row.endedAt),
        instrument: row.instrument,
        parameters: row.parameters ?? {},
        notes: row.notes,
        inputCodes: of('input'),
        outputCodes: of('output'),
        treatedCodes: of('treated'),
      };
    },
  );

  const evidence = await collectEvidence(knex, files, ids, stepIds);

  const eventRows = await knex('history_events as e')
    .leftJoin('users as u', 'u.id', 'e.actor_id')
    .where((query) => query.whereIn('e.subject_code', codes).orWhereIn('e.step_id', stepIds))
    .orderBy('e.id')
    .select('e.*', 'u.display_name as actorName');
  const events: CollectedEvent[] = eventRows.map(
    (row: {
      id: number;
      occurredAt: Date;
      type: string;
      actorId: number | null;
      actorName: string | null;
      subjectCode: string | null;
      stepId: number | null;
      payload: Record<string, unknown>;
      body: string;
      prevHash: string;
      hash: string;
    }) => ({
      id: row.id,
      occurredAt: new Date(row.occurredAt).toISOString(),
      type: row.type,
      actor: row.actorId === null ? null : { id: row.actorId, displayName: row.actorName ?? 'Unknown' },
      subjectCode: row.subjectCode,
      stepId: row.stepId,
      payload: row.payload,
      body: row.body,
      prevHash: row.prevHash,
      hash: row.hash,
    }),
  );

  const subject = records.find((record) => record.code === sample.code) as AuditRecord;
  return {
    generatedAt,
    subject,
    records,
    links,
    steps,
    evidence,
    events,
    chain: await verifyHistory(knex),
    lensDesign: sample.kind === 'device' ? ((await currentDesignOf(knex, sample.id))?.summary ?? null) : null,
    subjectCreatedAt: sample.createdAt,
  };
}

/** Evidence on the records or their steps, each file re-checked once however often it is used. */
async function collectEvidence(
  knex: Knex,
  files: AuditFileStore,
  sampleIds: number[],
  stepIds: number[],
): Promise<AuditEvidence[]> {
  const rows = await knex('evidence as ev')
    .join('stored_files as f', 'f.id', 'ev.file_id')
    .leftJoin('samples as s', 's.id', 'ev.sample_id')
    .leftJoin('users as u', 'u.id', 'ev.created_by_id')
    .where((query) => query.whereIn('ev.sample_id', sampleIds).orWhereIn('ev.step_id', stepIds))
    .orderBy('ev.id')
    .select(
      'ev.id',
      'ev.kind',
      's.code as sampleCode',
      'ev.step_id',
      'ev.layer_count',
      'ev.layer_uncertainty',
      'ev.layer_method',
      'ev.original_name',
      'ev.created_by_id',
      'u.display_name as createdByName',
      'ev.created_at',
      'f.sha256',
      'f.byte_size',
      'f.media_type',
      'f.thumbnail_sha256',
    );
  const checks = new Map<string, Promise<FileCheckResult>>();
  const check = (sha256: string) => {
    if (!checks.has(sha256)) checks.set(sha256, files.verify(sha256));
    return checks.get(sha256) as Promise<FileCheckResult>;
  };
  const results: AuditEvidence[] = [];
  // One at a time: a lab's evidence files can be large and the disk or object store is shared.
  for (const row of rows) {
    results.push({
      id: row.id,
      kind: row.kind,
      sampleCode: row.sampleCode ?? null,
      stepId: row.stepId ?? null,
      layerCount: row.layerCount ?? null,
      layerUncertainty: row.layerUncertainty ?? null,
      layerMethod: row.layerMethod ?? null,
      originalName: row.originalName ?? null,
      file: {
        sha256: row.sha256,
        byteSize: Number(row.byteSize),
        mediaType: row.mediaType,
        check: await check(row.sha256),
        thumbnailSha256: row.thumbnailSha256 ?? null,
      },
      createdBy: row.createdById === null ? null : { id: row.createdById, displayName: row.createdByName ?? 'Unknown' },
      createdAt: new Date(row.createdAt).toISOString(),
    });
  }
  return results;
}
