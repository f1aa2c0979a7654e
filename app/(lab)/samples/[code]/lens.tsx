import { useLocalSearchParams } from 'expo-router';
import { LensDesignerScreen } from '@/components/devices/lens-designer-screen';

/** The zone-plate lens designer of a device. */
export default function LensDesignRoute() {
  const { code } = useLocalSearchParams<{ code: string }>();
  return <LensDesignerScreen code={typeof code === 'string' ? code.trim() : ''} />;
}
