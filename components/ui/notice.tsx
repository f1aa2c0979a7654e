import Ionicons from '@expo/vector-icons/Ionicons';
import { Children, type ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { radii, sizes, space, useTheme, type Palette } from '@/components/theme';
import type { IconName } from './button';
import { Text } from './text';

export type NoticeTone = 'info' | 'success' | 'warn' | 'error';

const TONES: Record<NoticeTone, { background: keyof Palette; text: keyof Palette; icon: IconName }> = {
  info: { background: 'infoSoft', text: 'onInfoSoft', icon: 'information-circle-outline' },
  success: { background: 'successSoft', text: 'onSuccessSoft', icon: 'checkmark-circle-outline' },
  warn: { background: 'warnSoft', text: 'onWarnSoft', icon: 'alert-circle-outline' },
  error: { background: 'dangerSoft', text: 'onDangerSoft', icon: 'close-circle-outline' },
};

export interface NoticeProps {
  tone: NoticeTone;
  title?: string;
  /** Plain strings become paragraphs in the notice's colour. */
  children?: ReactNode;
  /** A button or link that resolves the notice, e.g. "Try again". */
  action?: ReactNode;
  testID?: string;
}

/** A banner for outcomes and problems. Errors are announced as alerts; the rest politely. */
export function Notice({ tone, title, children, action, testID }: NoticeProps) {
  const { colors } = useTheme();
  const look = TONES[tone];
  const color = colors[look.text];
  return (
    <View
      testID={testID}
      accessibilityRole={tone === 'error' ? 'alert' : undefined}
      accessibilityLiveRegion={tone === 'error' ? 'assertive' : 'polite'}
      style={[styles.notice, { backgroundColor: colors[look.background] }]}
    >
      <Ionicons name={look.icon} size={sizes.icon} color={color} style={styles.icon} />
      <View style={styles.body}>
        {title ? (
          <Text variant="label" style={{ color }}>
            {title}
          </Text>
        ) : null}
        {Children.map(children, (child) => (typeof child === 'string' ? <Text style={{ color }}>{child}</Text> : child))}
        {action ? <View style={styles.action}>{action}</View> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  notice: {
    flexDirection: 'row',
    gap: space.md,
    padding: space.lg,
    borderRadius: radii.md,
    alignItems: 'flex-start',
  },
  icon: { marginTop: space.xxs },
  body: { flex: 1, gap: space.xs },
  action: { marginTop: space.sm, flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
