import Ionicons from '@expo/vector-icons/Ionicons';
import { CameraView, useCameraPermissions, type BarcodeScanningResult } from 'expo-camera';
import { useCallback, useEffect, useRef, useState } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import { darkPalette, radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { configureQrDecoder } from './configure-decoder';
import { cameraHasTorch } from './torch-support';

// Before any camera in this module can scan: the web decoder must load our own WebAssembly.
configureQrDecoder();

/** The camera's surroundings stay dark in both schemes, as in any viewfinder. */
const chrome = darkPalette;

/** The square that frames the label, as a share of the preview's shorter side. */
const FRAME_SHARE = 0.62;
const CORNER = space.xl;
const CORNER_STROKE = 4;

export interface ScanCameraProps {
  /** Called with the text of every QR code seen (the same code many times a second). */
  onScan: (text: string) => void;
  /** One line over the preview saying what to point at. */
  prompt: string;
  height: number;
}

type CameraProblem = 'absent' | 'refused' | 'failed';

/**
 * The live preview that reads QR codes, or, when there is no camera or it is refused, a plain
 * statement of why (the screen offers a photo and typing instead).
 */
export function ScanCamera({ onScan, prompt, height }: ScanCameraProps) {
  const [permission, requestPermission] = useCameraPermissions();
  const [available, setAvailable] = useState<boolean | null>(null);
  /** Whether Flakeline asked for the camera on this visit, and whether the answer is in. */
  const [request, setRequest] = useState<'not_yet' | 'pending' | 'answered'>('not_yet');
  const [mountError, setMountError] = useState<string | null>(null);
  const [ready, setReady] = useState(false);
  const [torchAvailable, setTorchAvailable] = useState(false);
  const [torchOn, setTorchOn] = useState(false);
  const container = useRef<View>(null);

  // expo-camera's web scanner keeps the first handler it is given, so it gets one that never
  // changes and always calls the newest `onScan`.
  const latestOnScan = useRef(onScan);
  useEffect(() => {
    latestOnScan.current = onScan;
  }, [onScan]);
  const handleScanned = useCallback((result: BarcodeScanningResult) => latestOnScan.current(result.data), []);

  useEffect(() => {
    let current = true;
    CameraView.isAvailableAsync()
      .then((answer) => current && setAvailable(answer))
      .catch(() => current && setAvailable(false));
    return () => {
      current = false;
    };
  }, []);

  // Ask once on arrival, the way people expect of a scan screen; never nag after a refusal.
  const undetermined = permission !== null && !permission.granted && permission.status === 'undetermined';
  const ask = useCallback(() => {
    setMountError(null);
    setRequest('pending');
    requestPermission()
      .catch(() => undefined)
      .finally(() => setRequest('answered'));
  }, [requestPermission]);
  useEffect(() => {
    if (available && undetermined && request === 'not_yet') ask();
  }, [available, undetermined, request, ask]);

  useEffect(() => {
    if (ready) setTorchAvailable(cameraHasTorch(container.current));
  }, [ready]);

  const problem: CameraProblem | null =
    available === false
      ? 'absent'
      : mountError
        ? 'failed'
        : permission &&
            !permission.granted &&
            request !== 'pending' &&
            (request === 'answered' || !permission.canAskAgain || permission.status === 'denied')
          ? 'refused'
          : null;

  if (problem) {
    return <CameraUnavailable problem={problem} detail={mountError} onRetry={problem === 'absent' ? null : ask} />;
  }

  const live = available === true && permission?.granted === true;
  return (
    <View
      ref={container}
      style={[styles.viewfinder, { height, backgroundColor: chrome.sunken }]}
      testID="scan-camera"
      accessibilityLabel="Camera preview"
    >
      {live ? (
        <CameraView
          style={StyleSheet.absoluteFill}
          facing="back"
          barcodeScannerSettings={{ barcodeTypes: ['qr'] }}
          onBarcodeScanned={handleScanned}
          enableTorch={torchOn}
          onCameraReady={() => setReady(true)}
          onMountError={(event) => setMountError(event.message || 'The camera could not be started.')}
        />
      ) : (
        <View style={styles.waiting} accessibilityRole="progressbar" accessibilityLabel="Starting the camera">
          <ActivityIndicator color={chrome.primary} size="large" />
          <Text style={{ color: chrome.ink }}>
            {permission && !permission.granted ? 'Allow the camera when your browser asks.' : 'Starting the camera…'}
          </Text>
        </View>
      )}
      {live ? <Frame height={height} /> : null}
      {live ? (
        <View style={[styles.promptBand, { backgroundColor: chrome.sunken }]} pointerEvents="none">
          <Text variant="label" style={[styles.promptText, { color: chrome.ink }]} testID="scan-prompt">
            {prompt}
          </Text>
        </View>
      ) : null}
      {live && torchAvailable ? (
        <Pressable
          accessibilityRole="button"
          accessibilityLabel={torchOn ? 'Turn the torch off' : 'Turn the torch on'}
          aria-pressed={torchOn}
          onPress={() => setTorchOn(!torchOn)}
          testID="scan-torch"
          style={({ pressed }) => [
            styles.torch,
            { backgroundColor: torchOn ? chrome.primary : pressed ? chrome.hairline : chrome.surface },
          ]}
        >
          <Ionicons
            name={torchOn ? 'flashlight' : 'flashlight-outline'}
            size={sizes.icon}
            color={torchOn ? chrome.onPrimary : chrome.ink}
          />
        </Pressable>
      ) : null}
    </View>
  );
}

/** Four corner marks around the middle of the preview: where the label should sit. */
function Frame({ height }: { height: number }) {
  const side = Math.round(height * FRAME_SHARE);
  const stroke = { borderColor: chrome.primary };
  return (
    <View style={styles.frameLayer} pointerEvents="none">
      <View style={{ width: side, height: side }}>
        <View style={[styles.corner, styles.topLeft, stroke]} />
        <View style={[styles.corner, styles.topRight, stroke]} />
        <View style={[styles.corner, styles.bottomLeft, stroke]} />
        <View style={[styles.corner, styles.bottomRight, stroke]} />
      </View>
    </View>
  );
}

const PROBLEM_WORDS: Record<
  CameraProblem,
  { title: string; body: string; icon: 'videocam-off-outline' | 'lock-closed-outline' | 'warning-outline' }
> = {
  absent: {
    title: 'No camera found',
    body: 'This device has no camera Flakeline can use. Read a photo of the label or type the code below.',
    icon: 'videocam-off-outline',
  },
  refused: {
    title: 'The camera is blocked',
    body: 'Flakeline was not allowed to use the camera. Allow it in the browser’s site settings, or read a photo of the label or type the code below.',
    icon: 'lock-closed-outline',
  },
  failed: {
    title: 'The camera did not start',
    body: 'Another app may be using it. Close that app and try again, or read a photo of the label or type the code below.',
    icon: 'warning-outline',
  },
};

function CameraUnavailable({
  problem,
  detail,
  onRetry,
}: {
  problem: CameraProblem;
  detail: string | null;
  onRetry: (() => void) | null;
}) {
  const { colors } = useTheme();
  const words = PROBLEM_WORDS[problem];
  return (
    <View
      style={[styles.unavailable, { backgroundColor: colors.surface, borderColor: colors.hairline }]}
      accessibilityRole="alert"
      testID="scan-camera-unavailable"
    >
      <Ionicons name={words.icon} size={sizes.iconLarge} color={colors.inkMuted} />
      <Text variant="heading" style={styles.center}>
        {words.title}
      </Text>
      <Text tone="muted" style={styles.center}>
        {words.body}
      </Text>
      {detail ? (
        <Text variant="caption" tone="muted" style={styles.center}>
          {detail}
        </Text>
      ) : null}
      {onRetry ? <Button title="Try the camera again" icon="camera-outline" variant="secondary" onPress={onRetry} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  viewfinder: { borderRadius: radii.lg, overflow: 'hidden', alignSelf: 'stretch' },
  waiting: { flex: 1, alignItems: 'center', justifyContent: 'center', gap: space.md, padding: space.xl },
  frameLayer: { position: 'absolute', top: 0, right: 0, bottom: 0, left: 0, alignItems: 'center', justifyContent: 'center' },
  corner: { position: 'absolute', width: CORNER, height: CORNER },
  topLeft: { top: 0, left: 0, borderTopWidth: CORNER_STROKE, borderLeftWidth: CORNER_STROKE, borderTopLeftRadius: radii.sm },
  topRight: { top: 0, right: 0, borderTopWidth: CORNER_STROKE, borderRightWidth: CORNER_STROKE, borderTopRightRadius: radii.sm },
  bottomLeft: {
    bottom: 0,
    left: 0,
    borderBottomWidth: CORNER_STROKE,
    borderLeftWidth: CORNER_STROKE,
    borderBottomLeftRadius: radii.sm,
  },
  bottomRight: {
    bottom: 0,
    right: 0,
    borderBottomWidth: CORNER_STROKE,
    borderRightWidth: CORNER_STROKE,
    borderBottomRightRadius: radii.sm,
  },
  promptBand: {
    position: 'absolute',
    left: 0,
    right: 0,
    bottom: 0,
    paddingVertical: space.sm,
    paddingHorizontal: space.lg,
    opacity: 0.88,
  },
  promptText: { textAlign: 'center' },
  torch: {
    position: 'absolute',
    top: space.md,
    right: space.md,
    width: sizes.touchTarget,
    height: sizes.touchTarget,
    borderRadius: radii.pill,
    alignItems: 'center',
    justifyContent: 'center',
  },
  unavailable: {
    alignSelf: 'stretch',
    alignItems: 'center',
    gap: space.md,
    padding: space.xl,
    borderRadius: radii.lg,
    borderWidth: sizes.hairline,
  },
  center: { textAlign: 'center', maxWidth: sizes.narrowWidth },
});
