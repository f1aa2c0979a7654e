import { monitorEventLoopDelay } from 'node:perf_hooks';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { Jimp } from 'jimp';
import { rgbContrast } from '../../shared/optics/contrast';
import { analyzeRaman } from '../../shared/evidence/raman';
import { parseTwoColumn } from '../../shared/evidence/spectrum-parse';
import type { MicrographMetadata } from '../../shared/schemas/evidence';
import { REPO_ROOT } from '../config';
import { sha256Of } from '../files/file-store';
import { createFileStore } from '../files/file-store';
import { ingestEvidenceFile, type StageRunner } from '../services/evidence-ingest';
import { progress } from './progress';

/**
 * `npm run bench:evidence`: ingests a synthetic 12-megapixel (4000 × 3000) JPEG chip micrograph
 * through the upload service (sniff, decode, candidate finder, thumbnail, hash and store) and
 * times each stage and the process's peak memory; then times a fit of a 2,000-point Raman
 * spectrum. Targets from the issue: ingest under 2 s and 500 MB. Figures, not pass/fail.
 *
 * The micrograph is made in a child process, so the memory of making it does not count.
 */
const WIDTH = 4000;
const HEIGHT = 3000;
const UM_PER_PIXEL = 0.1;
const INGEST_RUNS = 3;
const RAMAN_POINTS = 2000;
const RAMAN_FITS = 20;
const OXIDE = { kind: 'oxide-on-silicon' as const, oxideThicknessNm: 285 };
const METADATA: MicrographMetadata = { umPerPixel: UM_PER_PIXEL, material: 'MoS2', substrate: OXIDE, objectiveMagnification: 50 };

/**
 * An invented chip: MoS2 on 285 nm oxide with elliptical monolayer, bilayer and thick flakes, and
 * ±8 counts of noise so the file is as large as a camera's (about 3 MB). jimp's encoder writes
 * full-resolution colour (4:4:4); most cameras halve the colour resolution (4:2:0), which decodes
 * faster, so this is the harder case.
 */
async function makeMicrograph(file: string): Promise<void> {
  const substrate = [180, 140, 210];
  const colourOf = (layers: number) => {
    const contrast = rgbContrast({ material: 'MoS2', layers, substrate: OXIDE });
    return [substrate[0] * (1 - contrast.red), substrate[1] * (1 - contrast.green), substrate[2] * (1 - contrast.blue)];
  };
  const flakes = [
    { cx: 900, cy: 700, rx: 260, ry: 140, colour: colourOf(1) },
    { cx: 2600, cy: 1500, rx: 180, ry: 220, colour: colourOf(1) },
    { cx: 1700, cy: 2300, rx: 300, ry: 120, colour: colourOf(2) },
    { cx: 3300, cy: 600, rx: 400, ry: 350, colour: colourOf(12) },
  ];
  const image = new Jimp({ width: WIDTH, height: HEIGHT, color: 0 });
  const data = image.bitmap.data;
  let seed = 12345;
  const noise = () => {
    seed = (seed * 1103515245 + 12345) >>> 0;
    return ((seed >>> 16) / 65536 - 0.5) * 16;
  };
  for (let y = 0; y < HEIGHT; y += 1) {
    for (let x = 0; x < WIDTH; x += 1) {
      const flake = flakes.find((f) => ((x - f.cx) / f.rx) ** 2 + ((y - f.cy) / f.ry) ** 2 <= 1);
      const colour = flake?.colour ?? substrate;
      const i = (y * WIDTH + x) * 4;
      for (let c = 0; c < 3; c += 1) data[i + c] = Math.max(0, Math.min(255, Math.round(colour[c] + noise())));
      data[i + 3] = 255;
    }
  }
  writeFileSync(file, await image.getBuffer('image/jpeg', { quality: 90 }));
}

/** A monolayer-MoS2-like spectrum with two Lorentzian modes, a sloping background and noise (invented). */
function ramanSpectrum(): string {
  let seed = 99;
  const noise = () => {
    seed = (seed * 1103515245 + 12345) >>> 0;
    return ((seed >>> 16) / 65536 - 0.5) * 20;
  };
  const lines = ['shift_cm-1,counts'];
  for (let i = 0; i < RAMAN_POINTS; i += 1) {
    const x = 100 + (600 * i) / (RAMAN_POINTS - 1);
    const lorentz = (centre: number, fwhm: number, height: number) => height / (1 + ((2 * (x - centre)) / fwhm) ** 2);
    lines.push(`${x.toFixed(3)},${(300 + 0.3 * x + lorentz(385, 3.5, 800) + lorentz(403.5, 4.5, 1000) + noise()).toFixed(2)}`);
  }
  return lines.join('\n');
}

const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(0)} MB`;
const ms = (value: number) => `${value.toFixed(0)} ms`;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

async function main() {
  if (process.argv[2] === '--make-micrograph') {
    await makeMicrograph(process.argv[3]);
    return;
  }
  const scratch = mkdtempSync(path.join(os.tmpdir(), 'flakeline-bench-evidence-'));
  try {
    const file = path.join(scratch, 'chip.jpg');
    progress(`Making a synthetic ${WIDTH} × ${HEIGHT} JPEG micrograph (in a child process)`);
    const made = spawnSync(path.join(REPO_ROOT, 'node_modules', '.bin', 'tsx'), [__filename, '--make-micrograph', file], {
      stdio: 'inherit',
    });
    if (made.status !== 0) throw new Error('Making the micrograph failed.');
    const data = readFileSync(file);
    const files = createFileStore({ backend: 'local', dir: path.join(scratch, 'blobs') });
    const rssAtStart = process.memoryUsage().rss;

    progress(`Ingesting it ${INGEST_RUNS} times through the upload service`);
    const runs: { stages: Map<string, number>; total: number; candidates: number }[] = [];
    let peakAfterFirst = 0;
    // How long the server's event loop could not answer anyone else while images were ingested.
    const stalls = monitorEventLoopDelay({ resolution: 10 });
    stalls.enable();
    for (let run = 0; run < INGEST_RUNS; run += 1) {
      rmSync(path.join(scratch, 'blobs'), { recursive: true, force: true });
      const stages = new Map<string, number>();
      const timed: StageRunner = async (stage, work) => {
        const started = performance.now();
        try {
          return await work();
        } finally {
          stages.set(stage, (stages.get(stage) ?? 0) + performance.now() - started);
        }
      };
      const started = performance.now();
      const ingested = await ingestEvidenceFile({
        files,
        data,
        originalName: 'chip.jpg',
        declaredType: 'image/jpeg',
        kind: 'micrograph',
        metadata: METADATA,
        findCandidates: true,
        stage: timed,
      });
      runs.push({ stages, total: performance.now() - started, candidates: ingested.analysis.candidates?.candidates.length ?? 0 });
      if (run === 0) peakAfterFirst = process.resourceUsage().maxRSS * 1024;
    }
    stalls.disable();
    const longestStallMs = stalls.max / 1e6;
    const peakRss = process.resourceUsage().maxRSS * 1024;
    const hashStarted = performance.now();
    sha256Of(data);
    const hashMs = performance.now() - hashStarted;

    progress(`Fitting a ${RAMAN_POINTS}-point Raman spectrum ${RAMAN_FITS} times`);
    const text = ramanSpectrum();
    const parseStarted = performance.now();
    const parsed = parseTwoColumn(text);
    const parseMs = performance.now() - parseStarted;
    if (!parsed.ok) throw new Error(parsed.message);
    const fitTimes: number[] = [];
    let layers: number | null = null;
    for (let i = 0; i < RAMAN_FITS; i += 1) {
      const started = performance.now();
      layers = analyzeRaman({ x: parsed.x, y: parsed.y }, { material: 'MoS2', laserNm: 532 }).estimate?.layers ?? null;
      fitTimes.push(performance.now() - started);
    }

    const stageNames = [...runs[0].stages.keys()];
    const lines = [
      '',
      `Evidence ingest of a ${WIDTH} × ${HEIGHT} JPEG (${mb(data.length)}), ${INGEST_RUNS} runs, on ${os.cpus().length} cores (load average ${os.loadavg()[0].toFixed(1)}):`,
      ...stageNames.map(
        (stage) => `  ${stage.padEnd(10)} ${runs.map((run) => ms(run.stages.get(stage) ?? 0).padStart(8)).join('')}`,
      ),
      `  ${'total'.padEnd(10)} ${runs.map((run) => ms(run.total).padStart(8)).join('')}   (target under 2000 ms; median ${ms(median(runs.map((run) => run.total)))})`,
      `  SHA-256 of the file alone: ${ms(hashMs)} (inside "store", which also reads back any stored copy)`,
      `  candidates found: ${runs[0].candidates}`,
      `  peak resident memory: ${mb(peakAfterFirst)} after the first ingest, ${mb(peakRss)} after all (target under 500 MB; ${mb(rssAtStart)} before the first)`,
      `  longest event-loop stall while ingesting: ${ms(longestStallMs)} (no other request is answered meanwhile)`,
      `  slowest stage: ${stageNames.reduce((a, b) => (median(runs.map((r) => r.stages.get(a) ?? 0)) >= median(runs.map((r) => r.stages.get(b) ?? 0)) ? a : b))}`,
      '',
      `Raman fit of ${RAMAN_POINTS} points (MoS2 rule): parse ${ms(parseMs)}, fit median ${ms(median(fitTimes))}, fastest ${ms(Math.min(...fitTimes))} over ${RAMAN_FITS} fits; layer call ${layers ?? 'none'}`,
      '',
    ];
    process.stdout.write(lines.join('\n'));
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  process.stderr.write(
    `flakeline: the evidence benchmark failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
  );
  process.exit(1);
});
