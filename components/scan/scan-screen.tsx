import { useRouter } from 'expo-router';
import { useCallback, useRef, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { describeError, isApiError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { useRecordLookup, type RecordRef } from '@/hooks/use-scan';
import { CodeEntry, type ScanNotice } from './code-entry';
import { MoveChainPanel, movePrompt, useMoveChain } from './move-chain';
import { PhotoReader } from './photo-reader';
import { readCode, recordPath } from './read-code';
import { ScanCamera } from './scan-camera';

export type ScanMode = 'open' | 'move';

const MODE_CHOICES: { value: ScanMode; label: string }[] = [
  { value: 'open', label: 'Open the record' },
  { value: 'move', label: 'Put samples away' },
];

/** The camera reads a label several times a second; the same text is acted on again only after this pause. */
const REPEAT_PAUSE_MS = 3000;
const CAMERA_HEIGHT_PHONE = 320;
const CAMERA_HEIGHT_WIDE = 420;
/** Long QR contents (web addresses, vCards) are cut short in the notice. */
const QUOTE_MAX = 80;

export interface ScanScreenProps {
  initialMode: ScanMode;
  /** From a box's free slot ("Scan its label instead"): the box and slot to put the sample in. */
  presetBox: string | null;
  presetSlot: string | null;
}

function quote(text: string): string {
  return text.length > QUOTE_MAX ? `${text.slice(0, QUOTE_MAX)}…` : text;
}

const NOUNS: Record<RecordRef['kind'], string> = { sample: 'sample', box: 'box' };

/** Scan a label (or read a photo of it, or type its code) to open the record or put samples away. */
export function ScanScreen({ initialMode, presetBox, presetSlot }: ScanScreenProps) {
  const router = useRouter();
  const { isWide, isPhone } = useBreakpoints();
  const lookup = useRecordLookup();
  const [preset] = useState(() => (presetBox ? readCode(presetBox) : null));
  const chain = useMoveChain({ boxCode: preset?.kind === 'box' ? preset.code : null, slot: presetSlot });
  const [mode, setMode] = useState<ScanMode>(initialMode);
  const [notice, setNotice] = useState<ScanNotice | null>(null);
  const busy = useRef(false);
  const recent = useRef<{ text: string; at: number } | null>(null);

  /** Reads a code from any source and acts on it; resolves to what should be said about it, if anything. */
  const actOn = useCallback(
    async (text: string): Promise<ScanNotice | null> => {
      const read = readCode(text);
      if (read.kind === 'foreign') {
        return {
          tone: 'warn',
          title: 'This QR is not a Flakeline label',
          body: `It says “${quote(read.text)}”. Flakeline labels carry a sample or box code such as CH-… or BX-….`,
          testID: 'scan-foreign',
        };
      }
      if (read.kind === 'typo') {
        return { tone: 'warn', title: 'This code has a typo', body: read.message, testID: 'scan-typo' };
      }
      try {
        const found = await lookup(read);
        if (mode === 'open') {
          router.push(recordPath(read));
          return null;
        }
        chain.accept(found);
        return null;
      } catch (error) {
        if (isApiError(error, 'not_found')) {
          return {
            tone: 'warn',
            title: `No ${NOUNS[read.kind]} has the code ${read.code}`,
            body: 'The code is well formed but not in this lab’s records. The label may belong to another lab.',
            testID: 'scan-not-found',
          };
        }
        if (isApiError(error, 'code_typo')) {
          return { tone: 'warn', title: 'This code has a typo', body: describeError(error), testID: 'scan-typo' };
        }
        return { tone: 'error', title: `Could not look up ${read.code}`, body: describeError(error) };
      }
    },
    [lookup, mode, router, chain],
  );

  const onCameraText = useCallback(
    (text: string) => {
      if (busy.current) return;
      const now = Date.now();
      const last = recent.current;
      if (last && last.text === text && now - last.at < REPEAT_PAUSE_MS) return;
      const read = readCode(text);
      if (mode === 'move' && (read.kind === 'sample' || read.kind === 'box') && chain.holds(read)) return;
      recent.current = { text, at: now };
      busy.current = true;
      actOn(text)
        .then(setNotice)
        .finally(() => {
          busy.current = false;
        });
    },
    [actOn, mode, chain],
  );

  const changeMode = (next: ScanMode) => {
    setMode(next);
    setNotice(null);
    recent.current = null;
  };

  const prompt = mode === 'open' ? 'Point at a sample’s or box’s label' : movePrompt(chain.state);

  const camera = (
    <View style={styles.column}>
      <ScanCamera onScan={onCameraText} prompt={prompt} height={isWide ? CAMERA_HEIGHT_WIDE : CAMERA_HEIGHT_PHONE} />
      {notice ? (
        <Notice tone={notice.tone} title={notice.title} testID={notice.testID ?? 'scan-notice'}>
          {notice.body}
        </Notice>
      ) : null}
    </View>
  );

  const fallbacks = (
    <Card testID="scan-fallbacks">
      <CodeEntry
        onSubmit={actOn}
        submitTitle={mode === 'open' ? 'Open' : 'Use this code'}
        submitIcon={mode === 'open' ? 'arrow-forward' : 'checkmark'}
      />
      <PhotoReader onText={actOn} />
    </Card>
  );

  const modeChoice = (
    <ChoiceChips
      label="When a label is read"
      choices={MODE_CHOICES}
      value={mode}
      onChange={changeMode}
      large={!isPhone}
      testID="scan-mode"
    />
  );

  return (
    <Screen
      title="Scan"
      lead="Point the camera at a Flakeline label to open its record, or put samples away box by box."
      width={isWide ? 'wide' : 'reading'}
      testID="scan-screen"
    >
      {modeChoice}
      {isWide ? (
        <View style={styles.split}>
          <View style={styles.main}>{camera}</View>
          <View style={styles.side}>
            {mode === 'move' ? <MoveChainPanel chain={chain} /> : null}
            {fallbacks}
          </View>
        </View>
      ) : (
        <>
          {camera}
          {mode === 'move' ? <MoveChainPanel chain={chain} /> : null}
          {fallbacks}
        </>
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  column: { gap: space.md },
  split: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 1.2, minWidth: 0 },
  side: { flex: 1, minWidth: 0, gap: space.lg },
});
