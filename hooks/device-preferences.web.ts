/**
 * Small choices remembered on this device (e.g. the last label sheet), in the browser's local
 * storage. Storage can be missing or refuse writes (private windows, full quota); a choice that
 * cannot be kept is simply asked again next time.
 */
export function readDevicePreference(key: string): string | null {
  try {
    return window.localStorage.getItem(`flakeline.${key}`);
  } catch {
    return null;
  }
}

export function writeDevicePreference(key: string, value: string): void {
  try {
    window.localStorage.setItem(`flakeline.${key}`, value);
  } catch {
    // Not kept; see above.
  }
}
