import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import {
  SHARE_LINK_DEFAULT_DAYS,
  SHARE_LINK_MAX_DAYS,
  ShareLinkCreateInput,
  type ShareLink,
  type ShareLinkCreated,
  type ShareLinkStatus,
} from '@/shared/schemas/share-link';
import { SectionStatus } from '@/components/samples/section-status';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { DotPill, type PillLook } from '@/components/ui/badges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { formatDateTime } from '@/components/ui/format';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Heading, Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { describeError } from '@/hooks/api-client';
import { useCreateShareLinkMutation, useRevokeShareLinkMutation, useShareLinksQuery } from '@/hooks/use-share-links';
import { copyText } from './copy-text';

const STATUS_WORDS: Record<ShareLinkStatus, string> = { active: 'Active', expired: 'Expired', revoked: 'Revoked' };
const STATUS_LOOKS: Record<ShareLinkStatus, PillLook> = {
  active: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' },
  expired: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' },
  revoked: { background: 'dangerSoft', text: 'onDangerSoft', dot: 'onDangerSoft' },
};

/** Read-only links to this audit for a reviewer outside the lab: issue, list, withdraw (managers). */
export function ShareLinksCard({ code }: { code: string }) {
  const links = useShareLinksQuery(code);
  return (
    <Card
      title="Share with an outside reviewer"
      lead="A link that opens this audit read-only, without an account, until it expires or you revoke it. Every opening is written to the record's history."
      testID="share-links"
    >
      <CreateShareLink code={code} />
      {!links.data ? (
        <SectionStatus query={links} what="the share links" />
      ) : links.data.length === 0 ? (
        <Text tone="muted">No links issued yet.</Text>
      ) : (
        <View style={styles.list} role="list" accessibilityLabel="Share links">
          {links.data.map((link) => (
            <ShareLinkRow key={link.id} code={code} link={link} />
          ))}
        </View>
      )}
    </Card>
  );
}

function CreateShareLink({ code }: { code: string }) {
  const create = useCreateShareLinkMutation(code);
  const [days, setDays] = useState(String(SHARE_LINK_DEFAULT_DAYS));
  const [errors, setErrors] = useState<string[]>([]);
  const [created, setCreated] = useState<ShareLinkCreated | null>(null);

  const submit = () => {
    const typed = days.trim();
    const parsed = ShareLinkCreateInput.safeParse({ expiresInDays: typed === '' ? undefined : Number(typed) });
    if (!parsed.success) {
      setErrors(parsed.error.issues.map((issue) => issue.message));
      return;
    }
    setCreated(null);
    create.mutate(parsed.data, { onSuccess: setCreated });
  };

  return (
    <View style={styles.stack}>
      <View style={styles.createRow}>
        <View style={styles.days}>
          <TextField
            label="Link works for (days)"
            hint={`1 to ${SHARE_LINK_MAX_DAYS} days.`}
            value={days}
            onChangeText={(text) => {
              setDays(text);
              setErrors([]);
            }}
            inputMode="numeric"
            keyboardType="number-pad"
            errors={errors}
            testID="share-link-days"
          />
        </View>
        {/* A button hugs the start of its row; this wrapper lets the row line it up with the input. */}
        <View style={styles.createButton}>
          <Button
            title="Create share link"
            icon="link-outline"
            onPress={submit}
            loading={create.isPending}
            testID="share-link-create"
          />
        </View>
      </View>
      <FormProblem title="Could not create the link" error={create.error} />
      {created ? <CreatedLink created={created} /> : null}
    </View>
  );
}

/** The address is shown this once: the server keeps only its hash. */
function CreatedLink({ created }: { created: ShareLinkCreated }) {
  const { colors } = useTheme();
  const [copied, setCopied] = useState<boolean | null>(null);
  return (
    <Notice
      tone="success"
      title="Link created: copy it now"
      testID="share-link-created"
      action={
        <Button
          title={copied ? 'Copied' : 'Copy link'}
          icon={copied ? 'checkmark' : 'copy-outline'}
          variant="secondary"
          onPress={() => void copyText(created.url).then(setCopied)}
          testID="share-link-copy"
        />
      }
    >
      {`It works until ${formatDateTime(created.shareLink.expiresAt)}. Flakeline keeps only a fingerprint of it, so this is the only time it is shown.`}
      <Text
        variant="code"
        selectable
        style={[styles.url, { backgroundColor: colors.surface, borderColor: colors.hairline }]}
        testID="share-link-url"
      >
        {created.url}
      </Text>
      {copied === false ? <Text>Copying is not available here; select the address and copy it.</Text> : null}
    </Notice>
  );
}

function ShareLinkRow({ code, link }: { code: string; link: ShareLink }) {
  const { colors } = useTheme();
  const revoke = useRevokeShareLinkMutation(code);
  const [confirming, setConfirming] = useState(false);
  const opened =
    link.openCount === 0
      ? 'Not opened yet'
      : `Opened ${link.openCount} ${link.openCount === 1 ? 'time' : 'times'}${link.lastOpenedAt ? `, last ${formatDateTime(link.lastOpenedAt)}` : ''}`;
  return (
    <View role="listitem" style={[styles.row, { borderColor: colors.hairline }]} testID={`share-link-${link.id}`}>
      <View style={styles.rowHead}>
        <Heading level={3}>{`Link ${link.id}`}</Heading>
        <DotPill
          label={STATUS_WORDS[link.status]}
          look={STATUS_LOOKS[link.status]}
          testID={`share-link-${link.id}-${link.status}`}
        />
      </View>
      <Text variant="caption">{`Issued by ${link.createdBy.displayName} on ${formatDateTime(link.createdAt)}`}</Text>
      <Text variant="caption">
        {link.status === 'revoked'
          ? `Revoked${link.revokedBy ? ` by ${link.revokedBy.displayName}` : ''}${link.revokedAt ? ` on ${formatDateTime(link.revokedAt)}` : ''}`
          : `${link.status === 'expired' ? 'Expired' : 'Expires'} ${formatDateTime(link.expiresAt)}`}
      </Text>
      <Text variant="caption" tone="muted">
        {opened}
      </Text>
      {link.status === 'active' && !confirming ? (
        <Button
          title="Revoke"
          icon="close-circle-outline"
          variant="quiet"
          onPress={() => setConfirming(true)}
          testID={`share-link-${link.id}-revoke`}
        />
      ) : null}
      {link.status === 'active' && confirming ? (
        <Notice
          tone="warn"
          title="Revoke this link?"
          action={
            <>
              <Button
                title="Revoke now"
                variant="danger"
                loading={revoke.isPending}
                onPress={() => revoke.mutate(link.id)}
                testID={`share-link-${link.id}-revoke-confirm`}
              />
              <Button title="Keep it" variant="quiet" onPress={() => setConfirming(false)} />
            </>
          }
        >
          Anyone holding it will see a page saying it was withdrawn.
          {revoke.error ? describeError(revoke.error) : null}
        </Notice>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
  createRow: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-end' },
  days: { flexGrow: 1, flexBasis: 200 },
  createButton: { paddingBottom: space.xxs },
  url: { borderWidth: sizes.hairline, borderRadius: radii.sm, padding: space.sm },
  list: { gap: space.md },
  row: { borderWidth: sizes.hairline, borderRadius: radii.md, padding: space.md, gap: space.xxs },
  rowHead: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md },
});
