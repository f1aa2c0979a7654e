import { useEffect, useRef, type RefObject } from 'react';
import type { View } from 'react-native';

/** One wheel notch (about 100 px of scroll) zooms by this factor (common practice, no source). */
const ZOOM_PER_100PX = 1.15;

/**
 * Zooms about the pointer when the wheel turns over the picture. The listener is not passive so
 * the page does not scroll at the same time; react-native-web's View is a DOM element underneath.
 */
export function useWheelZoom(target: RefObject<View | null>, onZoom: (factor: number, x: number, y: number) => void): void {
  const latest = useRef(onZoom);
  latest.current = onZoom;
  useEffect(() => {
    const element = target.current as unknown as HTMLElement | null;
    if (!element || typeof element.addEventListener !== 'function') return;
    const onWheel = (event: WheelEvent) => {
      event.preventDefault();
      const box = element.getBoundingClientRect();
      // Lines and pages (some mice, Firefox) are turned into pixels at a typical line height.
      const pixels = event.deltaMode === 1 ? event.deltaY * 16 : event.deltaMode === 2 ? event.deltaY * box.height : event.deltaY;
      latest.current(ZOOM_PER_100PX ** (-pixels / 100), event.clientX - box.left, event.clientY - box.top);
    };
    element.addEventListener('wheel', onWheel, { passive: false });
    return () => element.removeEventListener('wheel', onWheel);
  }, [target]);
}
