import { useLocalSearchParams } from 'expo-router';
import { ScanScreen } from '@/components/scan/scan-screen';

/**
 * `?mode=move` opens in "put samples away"; `&box=<code>&slot=<slot>` (from a box's free slot)
 * starts the move with that box and slot chosen.
 */
export default function ScanRoute() {
  const { mode, box, slot } = useLocalSearchParams<{ mode?: string; box?: string; slot?: string }>();
  return (
    <ScanScreen
      initialMode={mode === 'move' ? 'move' : 'open'}
      presetBox={typeof box === 'string' && box.trim() ? box.trim() : null}
      presetSlot={typeof slot === 'string' && slot.trim() ? slot.trim() : null}
    />
  );
}
