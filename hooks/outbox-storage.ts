/**
 * Where steps waiting to sync are kept. Native builds have no key-value store installed, so
 * there they last only until the app is closed; the web build keeps them in local storage
 * (outbox-storage.web.ts) so a closed tab or a dead phone battery loses nothing.
 */
let kept: string | null = null;

export function readOutbox(): string | null {
  return kept;
}

export function writeOutbox(serialized: string): boolean {
  kept = serialized;
  return true;
}

/** A key that stays with one submission through every retry. */
export function newIdempotencyKey(): string {
  const random = () => Math.random().toString(36).slice(2, 10);
  return `step-${Date.now().toString(36)}-${random()}${random()}`;
}
