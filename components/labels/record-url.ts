import * as Linking from 'expo-linking';
import { Platform } from 'react-native';

/**
 * The address a record's QR code carries: `<origin>/s/<code>`, which the app resolves to the
 * record (after sign-in if needed). On the web the origin is the one the page was loaded from,
 * so a code shown on screen matches the printed labels of the same server.
 */
export function recordUrl(code: string): string {
  if (Platform.OS === 'web' && typeof window !== 'undefined') return `${window.location.origin}/s/${code}`;
  return Linking.createURL(`/s/${code}`);
}
