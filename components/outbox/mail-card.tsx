import { StyleSheet, View } from 'react-native';
import type { CapturedMail } from '@/shared/schemas/mail';
import { radii, space, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { formatDateTime } from '@/components/ui/format';
import { Heading, Text } from '@/components/ui/text';
import { MailBody } from './mail-body';

export function MailCard({ mail }: { mail: CapturedMail }) {
  const { colors } = useTheme();
  return (
    <Card testID={`mail-${mail.id}`}>
      <View style={styles.head}>
        <Heading level={2}>{mail.subject || '(no subject)'}</Heading>
        <Text variant="caption" tone="muted">
          {`To ${mail.to.join(', ')} · ${formatDateTime(mail.receivedAt)}`}
        </Text>
        <Text variant="caption" tone="muted">{`From ${mail.from}`}</Text>
      </View>
      <View style={[styles.body, { backgroundColor: colors.sunken }]}>
        <MailBody text={mail.text} />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  head: { gap: space.xxs },
  body: { borderRadius: radii.md, padding: space.lg },
});
