import { useCallback, useState } from 'react';
import type { LayoutChangeEvent } from 'react-native';

/**
 * The width a view was given, for drawings (plots, the micrograph) that must be sized in
 * pixels. Zero until the first layout, so callers draw nothing rather than a wrong size.
 */
export function useLayoutWidth(): { width: number; onLayout: (event: LayoutChangeEvent) => void } {
  const [width, setWidth] = useState(0);
  const onLayout = useCallback((event: LayoutChangeEvent) => {
    const next = Math.floor(event.nativeEvent.layout.width);
    setWidth((current) => (current === next ? current : next));
  }, []);
  return { width, onLayout };
}
