import type { PickedFile } from './picked-file';

/** Text exports of spectrometers and AFM software: CSV, tab- or space-separated columns. */
const ACCEPT = '.csv,.txt,.tsv,.dat,.asc,text/plain,text/csv';

export const canPickTextFiles = true;

/**
 * Opens the browser's file chooser for a spectrum or profile. The input is made on the spot and
 * removed afterwards, as the image picker does, so no hidden element sits in the page.
 */
export function pickTextFile(): Promise<PickedFile | null> {
  return new Promise((resolve) => {
    const input = document.createElement('input');
    input.type = 'file';
    input.accept = ACCEPT;
    input.style.display = 'none';
    const done = (file: File | null) => {
      input.remove();
      resolve(
        file
          ? {
              name: file.name,
              mediaType: file.type || 'text/plain',
              blob: file,
              byteSize: file.size,
              widthPx: null,
              heightPx: null,
            }
          : null,
      );
    };
    input.addEventListener('change', () => done(input.files?.[0] ?? null));
    input.addEventListener('cancel', () => done(null));
    document.body.appendChild(input);
    input.click();
  });
}
