import type { RefObject } from 'react';
import type { View } from 'react-native';

/** Zoom by the mouse wheel exists only in a browser; touch screens use the buttons. */
export function useWheelZoom(_target: RefObject<View | null>, _onZoom: (factor: number, x: number, y: number) => void): void {}
