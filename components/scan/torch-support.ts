/** Phones have a torch beside the back camera; expo-camera ignores the setting where there is none. */
export function cameraHasTorch(_container: unknown): boolean {
  return true;
}
