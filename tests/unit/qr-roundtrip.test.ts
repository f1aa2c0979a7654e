import os from 'node:os';
import { Worker } from 'node:worker_threads';
import { CODE_BODY_LENGTH, formatCode, parseCode } from '../../shared/codes';
import { BOX_CODE_PREFIX, SAMPLE_CODE_PREFIXES } from '../../shared/samples';

const PREFIXES = [...Object.values(SAMPLE_CODE_PREFIXES), BOX_CODE_PREFIX];
const BASE_URL = 'http://127.0.0.1:8080';
const CODE_VALUES = 32 ** CODE_BODY_LENGTH;

/** A small seeded generator (mulberry32), so a failing code can be found again from the seed. */
function seededRandom(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Printer and scanner, for each text: the `qrcode` package draws the symbol as a PNG (error
 * correction Q, a two-module margin, 4 px per module, as on our labels), pngjs reads the PNG back
 * into pixels, and jsQR (github.com/cozmo/jsQR) decodes them. jsQR is a general-purpose decoder
 * that shares no code with the encoder: the independent reference for what a scanner sees.
 * It runs in worker threads because pixel loops run several times slower inside Jest's sandbox
 * than in plain Node, and 1,000 symbols should take seconds, not half a minute.
 */
const PRINT_AND_SCAN = `
const { parentPort, workerData } = require('node:worker_threads');
const QRCode = require(workerData.modules.qrcode);
const { PNG } = require(workerData.modules.pngjs);
const jsQR = require(workerData.modules.jsqr);
(async () => {
  const decoded = [];
  for (const text of workerData.texts) {
    const png = await QRCode.toBuffer(text, { errorCorrectionLevel: 'Q', margin: 2, scale: 4 });
    const image = PNG.sync.read(png);
    const pixels = new Uint8ClampedArray(image.data.buffer, image.data.byteOffset, image.data.length);
    const found = jsQR(pixels, image.width, image.height, { inversionAttempts: 'dontInvert' });
    decoded.push(found ? found.data : null);
  }
  parentPort.postMessage(decoded);
})();
`;

const MODULES = { qrcode: require.resolve('qrcode'), pngjs: require.resolve('pngjs'), jsqr: require.resolve('jsqr') };

/** What jsQR reads from a PNG QR of each text, in order (null where it finds no symbol). */
async function printAndScan(texts: string[]): Promise<(string | null)[]> {
  const workers = Math.max(1, Math.min(4, os.availableParallelism(), Math.ceil(texts.length / 100)));
  const share = Math.ceil(texts.length / workers);
  const parts = Array.from({ length: workers }, (_, index) => texts.slice(index * share, (index + 1) * share));
  const results = await Promise.all(
    parts.map(
      (part) =>
        new Promise<(string | null)[]>((resolve, reject) => {
          const worker = new Worker(PRINT_AND_SCAN, { eval: true, workerData: { modules: MODULES, texts: part } });
          worker.once('message', (decoded: (string | null)[]) => {
            resolve(decoded);
            void worker.terminate();
          });
          worker.once('error', reject);
          worker.once('exit', (exitCode) => reject(new Error(`The QR worker stopped early (exit code ${exitCode}).`)));
        }),
    ),
  );
  return results.flat();
}

/** What a scanned label says: the code after `/s/` in one of our URLs, otherwise the text itself. */
function codeInScan(text: string): string {
  const match = /^https?:\/\/[^/]+\/s\/([^/?#]+)$/.exec(text);
  return match ? decodeURIComponent(match[1]) : text;
}

describe('QR labels: code → URL → PNG → jsQR → code', () => {
  it('1,000 random codes over every prefix survive the round trip unchanged', async () => {
    const seed = 20261202;
    const random = seededRandom(seed);
    const values = [0, CODE_VALUES - 1, ...Array.from({ length: 998 }, () => Math.floor(random() * CODE_VALUES))];
    const codes = values.map((value, index) => formatCode(PREFIXES[index % PREFIXES.length], value));
    const urls = codes.map((code) => `${BASE_URL}/s/${code}`);
    const scans = await printAndScan(urls);
    const failures: string[] = [];
    for (const [index, value] of values.entries()) {
      const [code, url, decoded] = [codes[index], urls[index], scans[index]];
      const parsed = decoded === null ? null : parseCode(codeInScan(decoded), PREFIXES);
      if (decoded !== url || !parsed?.ok || parsed.code !== code || parsed.value !== value) {
        failures.push(`${code} (seed ${seed}, #${index}) read back as ${JSON.stringify(decoded)}`);
      }
    }
    expect(failures).toEqual([]);
    expect(scans).toHaveLength(1000);
    expect(new Set(codes.map((code) => code.split('-')[0]))).toEqual(new Set(PREFIXES));
  });

  it.each([
    ['a web address that is not a label', 'https://example.org/x'],
    ['plain text', 'Glovebox 2, shelf B'],
    ['a label URL whose code has an unknown prefix', `${BASE_URL}/s/XX-4F7K2MQ`],
  ])('parseCode calls %s malformed after it goes through a QR and jsQR', async (_what, text) => {
    const [decoded] = await printAndScan([text]);
    expect(decoded).toBe(text);
    expect(parseCode(codeInScan(decoded as string), PREFIXES)).toMatchObject({ ok: false, reason: 'malformed' });
  });

  it('a scanned label whose code has a changed symbol is a typo, not a different code', async () => {
    const code = formatCode('CH', 123_456_789 % CODE_VALUES);
    const changed = code.slice(0, 5) + (code[5] === 'Z' ? 'Y' : 'Z') + code.slice(6);
    const [decoded] = await printAndScan([`${BASE_URL}/s/${changed}`]);
    expect(decoded).toBe(`${BASE_URL}/s/${changed}`);
    expect(parseCode(codeInScan(decoded as string), PREFIXES)).toMatchObject({ ok: false, reason: 'check_failed' });
  });
});
