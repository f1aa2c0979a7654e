import { setZXingModuleOverrides } from 'barcode-detector';

/** Served by our own server (server/http/web-app.ts), never fetched from a CDN. */
export const QR_DECODER_WASM_PATH = '/vendor/zxing_reader.wasm';

let configured = false;

/**
 * Points the web QR decoder at our own copy of its WebAssembly. Left alone, the decoder loads it
 * from a public CDN, which the lab network may block and the CSP refuses. expo-camera's web
 * scanner uses this same `barcode-detector` module when the browser has no native detector, so
 * this must run before the first frame is scanned: it is called when the scan screen's module
 * loads.
 */
export function configureQrDecoder(): void {
  if (configured) return;
  configured = true;
  setZXingModuleOverrides({
    locateFile: (path: string, prefix: string) => (path.endsWith('.wasm') ? QR_DECODER_WASM_PATH : prefix + path),
  });
}
