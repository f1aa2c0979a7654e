import { StyleSheet, View } from 'react-native';
import type { UploadProgress } from '@/hooks/upload-with-progress';
import { radii, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { formatBytes } from './picked-file';

export interface UploadProgressBarProps {
  progress: UploadProgress | null;
  /** Bytes of the file, for the total when the platform does not report one. */
  fileBytes: number | null;
  onCancel: () => void;
}

/**
 * How much of the file has gone: a bar and the numbers. When every byte is sent the server is
 * still checking and analysing the file, which the label says rather than sitting at 100 %.
 */
export function UploadProgressBar({ progress, fileBytes, onCancel }: UploadProgressBarProps) {
  const { colors } = useTheme();
  const total = progress?.totalBytes ?? fileBytes;
  const sent = progress?.sentBytes ?? 0;
  const fraction = total ? Math.min(1, sent / total) : 0;
  const percent = Math.round(fraction * 100);
  const allSent = total !== null && sent >= total && total > 0;
  const label = allSent
    ? 'Sent. Checking the file and computing…'
    : total
      ? `${percent} % sent: ${formatBytes(sent)} of ${formatBytes(total)}`
      : 'Uploading…';
  return (
    <View style={styles.box} testID="upload-progress">
      <View
        accessibilityRole="progressbar"
        accessibilityLabel="Upload progress"
        accessibilityValue={{ min: 0, max: 100, now: percent }}
        style={[styles.track, { backgroundColor: colors.sunken, borderColor: colors.outline }]}
      >
        <View style={[styles.fill, { width: `${percent}%`, backgroundColor: colors.primary }]} />
      </View>
      <View style={styles.row}>
        <Text variant="caption" style={styles.label} testID="upload-progress-label">
          {label}
        </Text>
        {allSent ? null : <Button title="Cancel upload" variant="quiet" icon="close" onPress={onCancel} testID="upload-cancel" />}
      </View>
    </View>
  );
}

const TRACK_HEIGHT = space.md;

const styles = StyleSheet.create({
  box: { gap: space.xs },
  track: { height: TRACK_HEIGHT, borderRadius: radii.pill, borderWidth: 1, overflow: 'hidden' },
  fill: { height: '100%', borderRadius: radii.pill },
  row: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  label: { flexShrink: 1 },
});
