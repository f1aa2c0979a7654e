import { useEffect, useState } from 'react';

/**
 * Pause after the last keystroke before searching: long enough to finish typing a code, short
 * enough to feel immediate (common practice, no source).
 */
export const TYPING_PAUSE_MS = 300;

/** The value once it has stopped changing for `delay` ms, so a search is not sent on every key. */
export function useDebouncedValue<T>(value: T, delay: number = TYPING_PAUSE_MS): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), delay);
    return () => clearTimeout(timer);
  }, [value, delay]);
  return settled;
}
