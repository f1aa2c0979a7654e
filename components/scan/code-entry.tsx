import { useState } from 'react';
import { StyleSheet, TextInput, View } from 'react-native';
import { fontFaces, radii, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Button, type IconName } from '@/components/ui/button';
import { Notice, type NoticeTone } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';

/** What went wrong with a scanned, typed or photographed code, in words. */
export interface ScanNotice {
  tone: NoticeTone;
  title: string;
  body?: string;
  testID?: string;
}

export interface CodeEntryProps {
  /** Reads the code; resolves to a notice to show under the field, or null when it was used. */
  onSubmit: (text: string) => Promise<ScanNotice | null>;
  submitTitle: string;
  submitIcon: IconName;
}

/**
 * Typing the code off the label: one large monospaced field, read forgivingly (any case,
 * spaces or hyphens, O for 0, I or L for 1), with a typo told apart from an unknown code.
 */
export function CodeEntry({ onSubmit, submitTitle, submitIcon }: CodeEntryProps) {
  const { colors } = useTheme();
  const [text, setText] = useState('');
  const [focused, setFocused] = useState(false);
  const [busy, setBusy] = useState(false);
  const [notice, setNotice] = useState<ScanNotice | null>(null);

  const submit = () => {
    if (!text.trim() || busy) return;
    setBusy(true);
    onSubmit(text)
      .then((answer) => {
        setNotice(answer);
        if (!answer || answer.tone === 'success') setText('');
      })
      .finally(() => setBusy(false));
  };

  return (
    <View style={styles.entry}>
      <Text variant="label" nativeID="code-entry-label">
        Type the code
      </Text>
      <Text variant="caption" tone="muted">
        As printed under the QR code, e.g. CH-4F7K2M and its check symbol. Case, spaces and hyphens do not matter.
      </Text>
      <TextInput
        value={text}
        onChangeText={(next) => {
          setText(next);
          setNotice(null);
        }}
        onSubmitEditing={submit}
        onFocus={() => setFocused(true)}
        onBlur={() => setFocused(false)}
        accessibilityLabel="Code"
        aria-labelledby="code-entry-label"
        autoCapitalize="characters"
        autoCorrect={false}
        autoComplete="off"
        spellCheck={false}
        returnKeyType="go"
        placeholder="CH-…"
        placeholderTextColor={colors.inkMuted}
        testID="code-entry-input"
        style={[
          styles.input,
          {
            color: colors.ink,
            backgroundColor: colors.surface,
            borderColor: notice && notice.tone !== 'success' ? colors.danger : focused ? colors.primary : colors.outline,
            borderWidth: focused ? sizes.focusRing - 1 : sizes.outline,
          },
        ]}
      />
      {notice ? (
        <Notice tone={notice.tone} title={notice.title} testID={notice.testID ?? 'code-entry-problem'}>
          {notice.body}
        </Notice>
      ) : null}
      <Button
        title={submitTitle}
        icon={submitIcon}
        onPress={submit}
        loading={busy}
        disabled={!text.trim()}
        testID="code-entry-submit"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  entry: { gap: space.sm, alignSelf: 'stretch' },
  input: {
    ...typeScale.title,
    fontFamily: fontFaces.monoMedium,
    minHeight: sizes.inputHeight + space.md,
    borderRadius: radii.md,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    letterSpacing: 1,
  },
});
