import type { Href } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { ApiError, describeError, isApiError, type ApiErrorCode } from '@/hooks/api-client';
import { Notice } from '@/components/ui/notice';
import { TextLink } from '@/components/ui/text-link';

const TITLES: Partial<Record<ApiErrorCode, string>> = {
  link_invalid: 'This link does not work',
  link_expired: 'This link has expired',
  link_used: 'This link has already been used',
};

/** Whether a failure is about the e-mailed link itself (so the form is no use and a new link is). */
export function isLinkProblem(error: unknown): boolean {
  return isApiError(error, 'link_invalid', 'link_expired', 'link_used');
}

export interface LinkProblemProps {
  /** The server's refusal, or null when the link was visibly incomplete before asking. */
  error: unknown;
  /** What the person should do instead, e.g. ask for a new reset link. */
  nextStep: string;
  nextHref: Href;
  nextLabel: string;
}

export function LinkProblem({ error, nextStep, nextHref, nextLabel }: LinkProblemProps) {
  const title = (error instanceof ApiError ? TITLES[error.code] : undefined) ?? 'This link is incomplete';
  const explanation = error
    ? describeError(error)
    : 'Part of the link seems to be missing. Open it again from the e-mail, or copy the whole address.';
  return (
    <View style={styles.problem} testID="link-problem">
      <Notice tone="warn" title={title}>
        {explanation}
        {nextStep}
      </Notice>
      <TextLink href={nextHref}>{nextLabel}</TextLink>
    </View>
  );
}

const styles = StyleSheet.create({
  problem: { gap: space.sm },
});
