/**
 * The audit as W3C PROV-O in JSON-LD, for machines: records are prov:Entity, steps prov:Activity,
 * people prov:Agent/prov:Person; derivations carry the step that made them (qualified derivation);
 * evidence files are entities with their SHA-256; and a prov:Bundle holds the history events of
 * the audited records with the exact text that was hashed, so `npm run verify-audit` can
 * recompute each hash offline. IRIs of records are their label URLs.
 */
import type { AuditGap } from '../../../shared/schemas/audit';
import type { AuditCollection } from './collect';
import { AUDIT_CONTEXT, BUNDLE_TYPE, EVENT_TYPE, FILE_TYPE, eventsDigest } from './prov-format';

type Node = Record<string, unknown>;

export function auditJsonLd(audit: AuditCollection, gaps: AuditGap[], publicBaseUrl: string): Node {
  const base = publicBaseUrl.replace(/\/+$/, '');
  const iri = {
    record: (code: string) => `${base}/s/${encodeURI(code)}`,
    step: (id: number) => `${base}/api/steps/${id}`,
    person: (id: number) => `${base}/people/${id}`,
    file: (sha256: string) => `${base}/api/files/${sha256}`,
    evidence: (id: number) => `${base}/evidence/${id}`,
    event: (id: number) => `${base}/history/${id}`,
  };
  const auditIri = `${iri.record(audit.subject.code)}/audit/${audit.generatedAt}`;
  const bundleIri = `${auditIri}/history`;

  const people = new Map<number, string>();
  const person = (entry: { id: number; displayName: string } | null) => {
    if (!entry) return undefined;
    people.set(entry.id, entry.displayName);
    return iri.person(entry.id);
  };

  const records: Node[] = audit.records.map((record) => {
    const derivations = audit.links.filter((link) => link.childCode === record.code);
    return {
      '@id': iri.record(record.code),
      '@type': ['prov:Entity', 'flk:Sample'],
      'rdfs:label': record.code,
      'flk:code': record.code,
      'flk:kind': record.kind,
      'flk:material': record.material,
      ...(record.name ? { 'flk:name': record.name } : {}),
      'flk:status': record.status,
      ...(record.layerEstimate !== null ? { 'flk:layerEstimate': record.layerEstimate } : {}),
      'flk:generation': record.generation,
      'flk:isSource': record.isSource,
      'flk:recordedAt': record.createdAt,
      'prov:wasAttributedTo': person(record.owner),
      ...(record.madeByStepIds.length ? { 'prov:wasGeneratedBy': record.madeByStepIds.map(iri.step) } : {}),
      ...(record.parentCodes.length ? { 'prov:wasDerivedFrom': record.parentCodes.map(iri.record) } : {}),
      ...(derivations.length
        ? {
            'prov:qualifiedDerivation': derivations.map((link) => ({
              '@type': 'prov:Derivation',
              'prov:entity': iri.record(link.parentCode),
              'prov:hadActivity': iri.step(link.stepId),
            })),
          }
        : {}),
    };
  });

  const steps: Node[] = audit.steps.map((step) => ({
    '@id': iri.step(step.id),
    '@type': ['prov:Activity', 'flk:Step'],
    'rdfs:label': `${step.label} (step ${step.id})`,
    'flk:stepType': step.type,
    ...(step.startedAt ? { 'prov:startedAtTime': step.startedAt } : {}),
    ...(step.endedAt ? { 'prov:endedAtTime': step.endedAt } : {}),
    ...(step.operator ? { 'prov:wasAssociatedWith': person(step.operator) } : {}),
    ...(step.inputCodes.length + step.treatedCodes.length
      ? { 'prov:used': [...step.inputCodes, ...step.treatedCodes].map(iri.record) }
      : {}),
    ...(step.treatedCodes.length ? { 'flk:treated': step.treatedCodes.map(iri.record) } : {}),
    ...(step.instrument ? { 'flk:instrument': step.instrument } : {}),
    'flk:parameters': step.parameters,
    ...(step.notes ? { 'flk:notes': step.notes } : {}),
  }));

  const files = new Map<string, Node>();
  const evidence: Node[] = audit.evidence.map((item) => {
    if (!files.has(item.file.sha256)) {
      files.set(item.file.sha256, {
        '@id': iri.file(item.file.sha256),
        '@type': ['prov:Entity', FILE_TYPE],
        'flk:sha256': item.file.sha256,
        'flk:byteSize': item.file.byteSize,
        'flk:mediaType': item.file.mediaType,
        ...(item.originalName ? { 'flk:originalName': item.originalName } : {}),
        'flk:checkAtExport': item.file.check,
      });
    }
    return {
      '@id': iri.evidence(item.id),
      '@type': ['prov:Entity', 'flk:ThicknessEvidence'],
      'flk:evidenceKind': item.kind,
      'flk:about': item.sampleCode ? iri.record(item.sampleCode) : iri.step(item.stepId as number),
      'flk:file': iri.file(item.file.sha256),
      'prov:wasDerivedFrom': iri.file(item.file.sha256),
      ...(item.layerCount !== null ? { 'flk:layerCount': item.layerCount } : {}),
      ...(item.layerUncertainty !== null ? { 'flk:layerUncertainty': item.layerUncertainty } : {}),
      ...(item.layerMethod ? { 'flk:layerMethod': item.layerMethod } : {}),
      ...(item.createdBy ? { 'prov:wasAttributedTo': person(item.createdBy) } : {}),
      'flk:recordedAt': item.createdAt,
    };
  });

  const events: Node[] = audit.events.map((event) => ({
    '@id': iri.event(event.id),
    '@type': ['prov:Entity', EVENT_TYPE],
    'flk:eventId': event.id,
    'flk:eventType': event.type,
    'prov:generatedAtTime': event.occurredAt,
    ...(event.subjectCode
      ? { 'flk:about': iri.record(event.subjectCode) }
      : event.stepId
        ? { 'flk:about': iri.step(event.stepId) }
        : {}),
    ...(event.actor ? { 'prov:wasAttributedTo': person(event.actor) } : {}),
    'flk:body': event.body,
    'flk:prevHash': event.prevHash,
    'flk:hash': event.hash,
  }));

  const agents: Node[] = [...people.entries()]
    .sort(([a], [b]) => a - b)
    .map(([id, displayName]) => ({ '@id': iri.person(id), '@type': ['prov:Agent', 'prov:Person'], 'rdfs:label': displayName }));

  const head = audit.chain.headHash;
  return {
    '@context': AUDIT_CONTEXT,
    '@graph': [
      {
        '@id': auditIri,
        '@type': ['prov:Entity', 'flk:Audit'],
        'rdfs:label': `Audit of ${audit.subject.code}`,
        'flk:audited': iri.record(audit.subject.code),
        'prov:generatedAtTime': audit.generatedAt,
        'flk:verdict': gaps.length === 0 ? 'ready' : 'not_ready',
        'flk:gap': gaps.map((entry) => ({ '@type': 'flk:Gap', 'flk:gapKind': entry.kind, 'rdfs:comment': entry.message })),
        'flk:chainIntact': audit.chain.intact,
        'flk:chainEventsChecked': audit.chain.checked,
        ...(head ? { 'flk:chainHeadHash': head } : {}),
      },
      ...records,
      ...steps,
      ...agents,
      ...evidence,
      ...files.values(),
      {
        '@id': bundleIri,
        '@type': [BUNDLE_TYPE, 'prov:Entity'],
        'rdfs:label': `History events of the records in the audit of ${audit.subject.code}`,
        'flk:eventCount': events.length,
        'flk:eventsDigest': eventsDigest(audit.events.map((event) => event.hash)),
        ...(head ? { 'flk:chainHeadHash': head } : {}),
        '@graph': events,
      },
    ],
  };
}
