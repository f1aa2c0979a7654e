import { launchImageLibraryAsync } from 'expo-image-picker';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import type { ScanNotice } from './code-entry';
import { decodeQrInPhoto } from './decode-photo';

export interface PhotoReaderProps {
  /** Uses the QR code's text; resolves to a notice to show, or null when it was used. */
  onText: (text: string) => Promise<ScanNotice | null>;
}

/** Reads the QR code in a photo of a label: for when the live camera cannot be used. */
export function PhotoReader({ onText }: PhotoReaderProps) {
  const [busy, setBusy] = useState(false);
  const [notice, setNotice] = useState<ScanNotice | null>(null);

  const pick = async () => {
    setNotice(null);
    const picked = await launchImageLibraryAsync({ mediaTypes: ['images'], quality: 1 });
    const asset = picked.canceled ? null : picked.assets[0];
    if (!asset) return;
    setBusy(true);
    try {
      const text = await decodeQrInPhoto(asset);
      setNotice(
        text === null
          ? {
              tone: 'warn',
              title: 'No QR code found in that photo',
              body: 'Take it closer to the label, square on and in focus, then try again.',
              testID: 'photo-no-code',
            }
          : await onText(text),
      );
    } catch {
      setNotice({ tone: 'error', title: 'Could not read that photo', body: 'Choose a JPEG or PNG picture of the label.' });
    } finally {
      setBusy(false);
    }
  };

  return (
    <View style={styles.reader}>
      <Text variant="label">Read a photo of the label</Text>
      <Text variant="caption" tone="muted">
        Take a picture with the phone’s own camera app, then choose it here.
      </Text>
      <Button
        title="Choose a photo"
        icon="image-outline"
        variant="secondary"
        onPress={() => void pick()}
        loading={busy}
        testID="photo-pick"
      />
      {notice ? (
        <Notice tone={notice.tone} title={notice.title} testID={notice.testID ?? 'photo-problem'}>
          {notice.body}
        </Notice>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  reader: { gap: space.sm, alignSelf: 'stretch' },
});
