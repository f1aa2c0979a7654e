/**
 * Small choices remembered on this device (e.g. the last label sheet). The web build keeps them
 * in local storage (device-preferences.web.ts); elsewhere they last until the app is closed,
 * since no key-value store is installed for native builds.
 */
const remembered = new Map<string, string>();

export function readDevicePreference(key: string): string | null {
  return remembered.get(key) ?? null;
}

export function writeDevicePreference(key: string, value: string): void {
  remembered.set(key, value);
}
