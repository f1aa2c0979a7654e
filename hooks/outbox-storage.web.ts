/**
 * Steps waiting to sync, in the browser's local storage so they survive a reload or a closed
 * tab. When storage is refused (private window, full quota) the caller is told, so the person
 * is not promised a sync that cannot happen.
 */
const KEY = 'flakeline.step-outbox';
let fallback: string | null = null;

export function readOutbox(): string | null {
  try {
    return window.localStorage.getItem(KEY) ?? fallback;
  } catch {
    return fallback;
  }
}

export function writeOutbox(serialized: string): boolean {
  fallback = serialized;
  try {
    window.localStorage.setItem(KEY, serialized);
    return true;
  } catch {
    return false;
  }
}

/** A key that stays with one submission through every retry. */
export function newIdempotencyKey(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const random = () => Math.random().toString(36).slice(2, 10);
  return `step-${Date.now().toString(36)}-${random()}${random()}`;
}
