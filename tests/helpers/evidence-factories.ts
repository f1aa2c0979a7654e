import type { Knex } from 'knex';
import type { MicrographMetadata } from '../../shared/schemas/evidence';
import type { FileStore } from '../../server/files/file-store';
import type { EvidenceModel } from '../../server/models/evidence-models';
import type { SampleModel } from '../../server/models/sample-model';
import type { UserModel } from '../../server/models/user-model';
import { ingestEvidenceFile, type IngestedFile } from '../../server/services/evidence-ingest';
import { addEvidence } from '../../server/services/evidence-records';
import { encodePng, flakeColour, paintMicrograph } from './evidence-fixtures';
import { insertSample } from './sample-factories';

/** A small invented chip micrograph: MoS2 on 285 nm oxide at 0.2 µm a pixel, one monolayer patch. */
const SUBSTRATE = { red: 180, green: 140, blue: 210 };
const OXIDE = { kind: 'oxide-on-silicon' as const, oxideThicknessNm: 285 };
export const SMALL_CHIP_METADATA: MicrographMetadata = {
  umPerPixel: 0.2,
  material: 'MoS2',
  substrate: OXIDE,
  objectiveMagnification: 50,
};

export const smallChipPng = () =>
  encodePng(
    paintMicrograph({
      width: 200,
      height: 150,
      substrate: SUBSTRATE,
      patches: [
        {
          x: 60,
          y: 40,
          width: 80,
          height: 60,
          colour: flakeColour(SUBSTRATE, { material: 'MoS2', layers: 1, substrate: OXIDE }),
        },
      ],
      noise: 2,
    }),
  );

// The file is the same every time: ingested (decoded, analysed, stored) once per file store.
const ingested = new WeakMap<FileStore, Promise<IngestedFile>>();

/**
 * A chip with a micrograph whose candidate finder found the monolayer, written through the
 * services as an upload would be. Fast after the first call: the ingest is reused.
 */
export async function insertChipMicrograph(
  knex: Knex,
  files: FileStore,
  owner: UserModel,
): Promise<{ chip: SampleModel; evidence: EvidenceModel; sha256: string }> {
  let file = ingested.get(files);
  if (!file) {
    file = ingestEvidenceFile({
      files,
      data: smallChipPng(),
      originalName: 'chip.png',
      kind: 'micrograph',
      metadata: SMALL_CHIP_METADATA,
      findCandidates: true,
    });
    ingested.set(files, file);
  }
  const ingest = await file;
  const chip = await insertSample(knex, owner, {
    kind: 'chip',
    material: 'MoS2',
    properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
  });
  const evidence = await knex.transaction((trx) =>
    addEvidence({
      trx,
      actor: owner,
      target: { sample: chip },
      kind: 'micrograph',
      originalName: 'chip.png',
      metadata: SMALL_CHIP_METADATA,
      ingested: ingest,
    }),
  );
  return { chip, evidence, sha256: ingest.file.sha256 };
}

export async function insertCalibration(knex: Knex, owner: UserModel, microscope = 'Inverted microscope 1'): Promise<number> {
  const [row] = await knex('microscope_calibrations')
    .insert({ microscope, objectiveMagnification: 100, umPerPixel: 0.065, createdById: owner.id })
    .returning('id');
  return row.id;
}
