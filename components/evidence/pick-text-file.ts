import type { PickedFile } from './picked-file';

/**
 * The app on a phone has no document picker installed, so spectra and profiles (text files from
 * the instrument's computer) are added from the web app there; the screen says so.
 */
export const canPickTextFiles = false;

export async function pickTextFile(): Promise<PickedFile | null> {
  return null;
}
