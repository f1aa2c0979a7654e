import type { Knex } from 'knex';
import { Model } from 'objection';
import type { FileStore } from '../server/files/file-store';
import { UserModel } from '../server/models/user-model';
import { uploadEvidence } from '../server/services/evidence-changes';

/** Small deterministic wiggle, so the demo files look measured without a random generator. */
const wiggle = (i: number, size: number) =>
  size * (Math.sin(i * 12.9898) * 43758.5453 - Math.floor(Math.sin(i * 12.9898) * 43758.5453) - 0.5);

const lorentzian = (x: number, centre: number, fwhm: number, height: number) => height / (1 + ((x - centre) / (fwhm / 2)) ** 2);

/** An invented Raman spectrum of the demo MoS2 flake (532 nm line): two peaks 19 cm⁻¹ apart on a sloping background. */
function demoMos2Raman(): string {
  const lines = ['# Raman shift (cm-1), counts — demo lab, invented'];
  for (let i = 0; i <= 400; i += 1) {
    const x = 300 + i * 0.5;
    const y = 120 + 0.4 * (x - 300) + lorentzian(x, 385.4, 3.1, 640) + lorentzian(x, 404.4, 4.7, 1010) + wiggle(i, 18);
    lines.push(`${x.toFixed(1)},${y.toFixed(1)}`);
  }
  return lines.join('\n') + '\n';
}

/** An invented AFM line profile across the edge of the demo hBN flake: about 20 nm high. */
function demoHbnProfile(): string {
  const lines = ['# position (um), height (nm) — demo lab, invented'];
  for (let i = 0; i <= 300; i += 1) {
    const x = i * 0.02;
    const height = (x < 2.7 ? 0 : 20.4) + 0.05 * x + wiggle(i + 1000, 0.5);
    lines.push(`${x.toFixed(3)}\t${height.toFixed(3)}`);
  }
  return lines.join('\n') + '\n';
}

async function attach(
  knex: Knex,
  files: FileStore,
  actor: UserModel,
  flakeName: string,
  kind: 'raman' | 'afm',
  name: string,
  text: string,
  metadata: object,
) {
  const flake = await knex('samples').where({ kind: 'flake', name: flakeName }).first('code');
  if (!flake) throw new Error(`The demo lab has no flake named ${flakeName}`);
  await uploadEvidence({
    knex,
    files,
    actor,
    target: { sampleCode: flake.code },
    kind,
    metadataJson: JSON.stringify(metadata),
    file: { buffer: Buffer.from(text, 'utf8'), originalname: name, mimetype: 'text/csv' },
  });
}

/**
 * Thickness evidence on the two flakes of the demo lens, through the same upload service people
 * use: a Raman spectrum of the MoS2 flake and an AFM profile of the hBN flake.
 */
export async function seedDemoEvidence(knex: Knex, files: FileStore, researcherEmail: string): Promise<void> {
  // The upload service reads records through the models' default connection, as it does in the server.
  const previous = Model.knex();
  Model.knex(knex);
  try {
    await attachDemoFiles(knex, files, researcherEmail);
  } finally {
    Model.knex(previous);
  }
}

async function attachDemoFiles(knex: Knex, files: FileStore, researcherEmail: string): Promise<void> {
  const researcher = await UserModel.query(knex).findOne({ email: researcherEmail }).throwIfNotFound();
  await attach(knex, files, researcher, 'MoS2 1L candidate A', 'raman', 'candidate-A-raman.csv', demoMos2Raman(), {
    laserNm: 532,
    material: 'MoS2',
  });
  await attach(knex, files, researcher, 'hBN ~20 nm', 'afm', 'hbn-edge-profile.txt', demoHbnProfile(), {
    material: 'hBN',
    offsetNm: 0.3,
  });
}
