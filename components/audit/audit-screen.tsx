import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Notice } from '@/components/ui/notice';
import { describeError, isApiError } from '@/hooks/api-client';
import { auditExports, useAuditQuery } from '@/hooks/use-audit';
import { useSessionQuery } from '@/hooks/use-session';
import { AuditReportView } from './audit-report';
import { BackToRecord } from './back-to-record';
import { ShareLinksCard } from './share-links-card';

/** A record's publication audit inside the lab; managers also share it from here. */
export function AuditScreen({ code }: { code: string }) {
  const audit = useAuditQuery(code);
  const session = useSessionQuery();
  const isManager = session.data?.role === 'manager';

  let body;
  if (!audit.data) {
    body = isApiError(audit.error, 'not_found', 'code_typo') ? (
      <Notice tone="warn" title={`No record has the code ${code}`} testID="audit-missing">
        {describeError(audit.error)}
      </Notice>
    ) : audit.isError ? (
      <ErrorState
        title="Could not make the audit"
        error={audit.error}
        onRetry={() => void audit.refetch()}
        retrying={audit.isFetching}
      />
    ) : (
      // Every file is re-hashed and the whole chain recomputed, so this can take a few seconds.
      <LoadingState label="Checking the ancestry, files and history chain…" />
    );
  } else {
    body = (
      <>
        <AuditReportView audit={audit.data} exports={auditExports(code)} reach="lab" />
        {isManager ? <ShareLinksCard code={code} /> : null}
      </>
    );
  }

  return (
    <Screen
      title="Audit"
      lead="Everything a paper's readers may ask about this record: where it came from, who did what, the evidence, and whether the records still check out."
      above={<BackToRecord code={code} />}
      testID="audit-screen"
    >
      {body}
    </Screen>
  );
}
