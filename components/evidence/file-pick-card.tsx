import Ionicons from '@expo/vector-icons/Ionicons';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { EvidenceKind } from '@/shared/schemas/evidence';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { isImageKind } from './evidence-form-values';
import { KIND_ICONS } from './layer-words';
import { pickImage, type ImageSource } from './pick-image';
import { canPickTextFiles, pickTextFile } from './pick-text-file';
import { formatBytes, type PickedFile } from './picked-file';

export interface FilePickCardProps {
  kind: EvidenceKind;
  file: PickedFile | null;
  onPick: (file: PickedFile) => void;
  errors: readonly string[];
}

type Problem = 'camera_denied' | 'unreadable' | null;

/** Choosing the file: the camera or the photo library for micrographs, a text file for spectra and profiles. */
export function FilePickCard({ kind, file, onPick, errors }: FilePickCardProps) {
  const { colors } = useTheme();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<Problem>(null);
  const image = isImageKind(kind);

  const run = async (pick: () => Promise<PickedFile | null | 'camera_denied'>) => {
    setProblem(null);
    setBusy(true);
    try {
      const picked = await pick();
      if (picked === 'camera_denied') setProblem('camera_denied');
      else if (picked) onPick(picked);
    } catch {
      setProblem('unreadable');
    } finally {
      setBusy(false);
    }
  };

  const fromImages = (source: ImageSource) =>
    run(async () => {
      const result = await pickImage(source);
      return result.kind === 'picked' ? result.file : result.kind === 'camera_denied' ? 'camera_denied' : null;
    });

  return (
    <Card title="File" testID="evidence-file">
      {image ? (
        <Text variant="caption" tone="muted">
          JPEG, PNG or TIFF, straight from the microscope camera: no filters, no cropping to a different scale.
        </Text>
      ) : null}
      <View style={styles.buttons}>
        {image ? (
          <>
            <Button
              title="Take a photo"
              icon="camera-outline"
              variant="secondary"
              disabled={busy}
              onPress={() => void fromImages('camera')}
              testID="evidence-camera"
            />
            <Button
              title={file ? 'Choose another image' : 'Choose an image'}
              icon="image-outline"
              variant="secondary"
              loading={busy}
              onPress={() => void fromImages('library')}
              testID="evidence-pick-image"
            />
          </>
        ) : canPickTextFiles ? (
          <Button
            title={file ? 'Choose another file' : 'Choose a file'}
            icon="document-text-outline"
            variant="secondary"
            loading={busy}
            onPress={() => void run(pickTextFile)}
            testID="evidence-pick-text"
          />
        ) : null}
      </View>
      {!image && !canPickTextFiles ? (
        <Notice tone="info" title="Add spectra and profiles from a computer">
          Open Flakeline in a browser on the instrument’s computer, or one the file was copied to, and add it there.
        </Notice>
      ) : null}
      {file ? (
        <View style={[styles.picked, { backgroundColor: colors.sunken }]} testID="evidence-picked">
          <Ionicons name={KIND_ICONS[kind]} size={sizes.icon} color={colors.primary} />
          <View style={styles.pickedText}>
            <Text variant="label" numberOfLines={1}>
              {file.name}
            </Text>
            <Text variant="caption" tone="muted">
              {[
                file.byteSize !== null ? formatBytes(file.byteSize) : null,
                file.widthPx && file.heightPx ? `${file.widthPx} × ${file.heightPx} pixels` : null,
              ]
                .filter(Boolean)
                .join(' · ')}
            </Text>
          </View>
        </View>
      ) : null}
      {problem === 'camera_denied' ? (
        <Notice tone="warn" title="No access to the camera">
          Allow Flakeline to use the camera in the phone’s settings, or take the picture with the camera app and choose it here.
        </Notice>
      ) : null}
      {problem === 'unreadable' ? (
        <Notice tone="error" title="That file could not be opened">
          {image ? 'Choose a JPEG, PNG or TIFF image.' : 'Choose a CSV or plain-text file.'}
        </Notice>
      ) : null}
      {errors.map((message) => (
        <Text key={message} variant="caption" tone="danger">
          {message}
        </Text>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  picked: { flexDirection: 'row', alignItems: 'center', gap: space.md, padding: space.md, borderRadius: radii.md },
  pickedText: { flex: 1, gap: space.xxs },
});
