import { Wordmark } from '@/components/brand/wordmark';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { describeError, isApiError } from '@/hooks/api-client';
import { sharedAuditExports, useSharedAuditQuery } from '@/hooks/use-audit';
import { AuditReportView } from './audit-report';

/** A record's audit opened through a share link by someone outside the lab, signed out and read-only. */
export function SharedAuditScreen({ token }: { token: string }) {
  const shared = useSharedAuditQuery(token);

  let body;
  if (!token) {
    body = (
      <LinkProblem title="This link is incomplete" detail="Check that the whole address was copied." testID="shared-incomplete" />
    );
  } else if (!shared.data) {
    if (isApiError(shared.error, 'share_link_expired')) {
      body = <LinkProblem title="This link has expired" detail={describeError(shared.error)} testID="shared-expired" />;
    } else if (isApiError(shared.error, 'share_link_revoked')) {
      body = <LinkProblem title="This link was withdrawn" detail={describeError(shared.error)} testID="shared-revoked" />;
    } else if (isApiError(shared.error, 'not_found', 'validation_failed', 'link_invalid')) {
      body = (
        <LinkProblem
          title="This link does not open an audit"
          detail="It may have been mistyped or cut short. Ask the lab that sent it for the full address."
          testID="shared-unknown"
        />
      );
    } else if (shared.isError) {
      body = (
        <ErrorState
          title="Could not open the audit"
          error={shared.error}
          onRetry={() => void shared.refetch()}
          retrying={shared.isFetching}
        />
      );
    } else {
      body = <LoadingState label="Checking the ancestry, files and history chain…" />;
    }
  } else {
    const { audit, sampleCode, expiresAt } = shared.data;
    body = (
      <>
        <Notice tone="info" title={`Shared audit of ${sampleCode}`} testID="shared-audit-notice">
          {`A read-only copy made for you now. The link works until ${formatDateTime(expiresAt)}; each opening is recorded by the lab.`}
        </Notice>
        <AuditReportView audit={audit} exports={sharedAuditExports(token, sampleCode)} reach="shared" />
      </>
    );
  }

  return (
    <Screen title="Publication audit" above={<Wordmark />} testID="shared-audit-screen">
      {body}
    </Screen>
  );
}

function LinkProblem({ title, detail, testID }: { title: string; detail: string; testID: string }) {
  return (
    <EmptyState icon="link-outline" title={title} testID={testID}>
      {detail}
    </EmptyState>
  );
}
