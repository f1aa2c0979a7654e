/**
 * Whether the camera shown inside `container` can switch its torch on. Browsers expose this as a
 * capability of the video track (Chrome on Android does; desktop webcams have none), so the
 * torch button is offered only when the running camera says it has one.
 */
export function cameraHasTorch(container: unknown): boolean {
  if (!(container instanceof HTMLElement)) return false;
  const stream = container.querySelector('video')?.srcObject;
  if (!(stream instanceof MediaStream)) return false;
  const track = stream.getVideoTracks()[0];
  if (!track || typeof track.getCapabilities !== 'function') return false;
  const capabilities: MediaTrackCapabilities & { torch?: boolean } = track.getCapabilities();
  return capabilities.torch === true;
}
