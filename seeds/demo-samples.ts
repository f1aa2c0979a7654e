import type { Knex } from 'knex';
import { StepCreateInput, type StepCreateInput as StepCreateInputShape } from '../shared/schemas/step';
import type { UserModel } from '../server/models/user-model';
import { registerSample } from '../server/services/sample-registry';
import { logStep } from '../server/services/step-logger';
import { createBox, createPlace, moveSample } from '../server/services/storage';
import { seedDemoDevices } from './demo-devices';

/**
 * The demo lab's samples: invented suppliers, lots and runs. Two bulk crystals are exfoliated
 * onto oxidised silicon chips; flakes are transferred off two chips, stacked and patterned into
 * a zone-plate lens; a CVD run grows WS2 films from two precursor lots. Chips sit in a box in a
 * desiccator.
 */
const daysAgo = (days: number, hour = 10) => {
  const date = new Date(Date.now() - days * 86_400_000);
  date.setUTCHours(hour, 0, 0, 0);
  return date.toISOString();
};

export async function seedDemoSamples(trx: Knex.Transaction, people: { manager: UserModel; researcher: UserModel }) {
  const { manager, researcher } = people;
  const log = async (actor: UserModel, input: StepCreateInputShape) =>
    logStep({ trx, actor, input: StepCreateInput.parse(input) });
  const outputsOf = async (stepId: number) =>
    (await trx('step_samples as ss')
      .join('samples as s', 's.id', 'ss.sample_id')
      .where({ 'ss.step_id': stepId, 'ss.role': 'output' })
      .orderBy('ss.position')
      .pluck('s.code')) as string[];

  const mos2 = await registerSample({
    trx,
    actor: researcher,
    input: {
      kind: 'crystal',
      material: 'MoS2',
      name: 'MoS2 bulk, lot NV-2211',
      properties: {
        supplier: 'Northvale Crystal Works (invented)',
        supplierLot: 'NV-2211',
        growthMethod: 'chemical vapour transport',
      },
    },
  });
  const hbn = await registerSample({
    trx,
    actor: researcher,
    input: {
      kind: 'crystal',
      material: 'hBN',
      name: 'hBN flux batch FB-07',
      properties: { supplier: 'In-house flux growth', supplierLot: 'FB-07', growthMethod: 'flux' },
    },
  });

  const mos2Run = await log(researcher, {
    type: 'exfoliation',
    startedAt: daysAgo(12),
    instrument: 'Tape station 1',
    inputs: [{ code: mos2.code }],
    outputs: [
      { kind: 'chip', count: 4, properties: { substrate: 'si_sio2', oxideThicknessNm: 285, chipWidthMm: 10, chipHeightMm: 10 } },
    ],
    parameters: {
      method: 'adhesive_tape',
      tapeType: 'low-tack blue tape',
      peelCycles: 6,
      substrate: 'si_sio2',
      oxideThicknessNm: 285,
      pretreatment: 'o2_plasma',
    },
  });
  const hbnRun = await log(researcher, {
    type: 'exfoliation',
    startedAt: daysAgo(11),
    instrument: 'Tape station 1',
    inputs: [{ code: hbn.code }],
    outputs: [{ kind: 'chip', count: 2, properties: { substrate: 'si_sio2', oxideThicknessNm: 90 } }],
    parameters: { method: 'adhesive_tape', peelCycles: 4, substrate: 'si_sio2', oxideThicknessNm: 90 },
  });
  const mos2Chips = await outputsOf(mos2Run.id);
  const hbnChips = await outputsOf(hbnRun.id);

  const pickUp = async (chip: string, name: string, days: number) =>
    (
      await outputsOf(
        (
          await log(researcher, {
            type: 'transfer',
            startedAt: daysAgo(days, 14),
            instrument: 'Transfer stage',
            inputs: [{ code: chip }],
            outputs: [{ kind: 'flake', name, properties: { positionXUm: 1820, positionYUm: 2440, flakeSizeUm: 38 } }],
            parameters: { method: 'dry', stampPolymer: 'PC on PDMS', temperatureC: 90 },
          })
        ).id,
      )
    )[0];
  const monolayer = await pickUp(mos2Chips[0], 'MoS2 1L candidate A', 9);
  const hbnFlake = await pickUp(hbnChips[0], 'hBN ~20 nm', 9);

  const stack = (
    await outputsOf(
      (
        await log(researcher, {
          type: 'stacking',
          startedAt: daysAgo(8, 15),
          instrument: 'Transfer stage',
          inputs: [
            { code: hbnFlake, consumed: true },
            { code: monolayer, consumed: true },
          ],
          outputs: [{ kind: 'stack', material: 'MoS2 on hBN', name: 'hBN / MoS2 lens stack' }],
          parameters: { stampPolymer: 'PC on PDMS', temperatureC: 110 },
        })
      ).id,
    )
  )[0];
  const lens = (
    await outputsOf(
      (
        await log(researcher, {
          type: 'lithography',
          startedAt: daysAgo(6, 9),
          instrument: 'E-beam writer',
          inputs: [{ code: stack, consumed: true }],
          outputs: [{ kind: 'device', name: 'Zone-plate lens ZP-1', properties: { deviceType: 'zone-plate lens' } }],
          parameters: {
            resist: 'PMMA 950K',
            doseUCPerCm2: 350,
            acceleratingVoltageKV: 30,
            patternReference: 'ZP-1 rings, 632.8 nm, f = 1 mm',
          },
        })
      ).id,
    )
  )[0];
  await log(researcher, {
    type: 'etching',
    startedAt: daysAgo(5, 11),
    instrument: 'Plasma etcher',
    treated: [lens],
    parameters: { gas: 'SF6/O2', powerW: 50, pressureMTorr: 40, durationS: 20 },
  });
  await seedDemoDevices(trx, { researcher, lensCode: lens });

  const tungstenOxide = await registerSample({
    trx,
    actor: researcher,
    input: {
      kind: 'precursor',
      material: 'WO3',
      name: 'WO3 powder, lot CG-118',
      properties: { supplier: 'Copperfield Reagents (invented)', supplierLot: 'CG-118' },
    },
  });
  const sulfur = await registerSample({
    trx,
    actor: researcher,
    input: {
      kind: 'precursor',
      material: 'S',
      name: 'Sulfur powder, lot CG-042',
      properties: { supplier: 'Copperfield Reagents (invented)', supplierLot: 'CG-042' },
    },
  });
  await log(researcher, {
    type: 'cvd_growth',
    startedAt: daysAgo(4, 8),
    endedAt: daysAgo(4, 13),
    instrument: 'Tube furnace 2',
    inputs: [{ code: tungstenOxide.code }, { code: sulfur.code }],
    outputs: [{ kind: 'film', material: 'WS2', count: 2, properties: { substrate: 'sapphire' } }],
    parameters: {
      precursors: ['WO3 powder', 'sulfur powder'],
      zoneTemperaturesC: [180, 850],
      rampRateCPerMin: 25,
      holdTimeMin: 15,
      carrierGas: 'Ar',
      carrierFlowSccm: 80,
      hydrogenFlowSccm: 5,
      pressureTorr: 760,
      outcome: 'Triangular monolayer domains near the sapphire edge',
    },
  });

  const room = await createPlace(trx, { name: 'Lab 2.14', kind: 'room' });
  const desiccator = await createPlace(trx, { name: 'Desiccator B', kind: 'desiccator', parentId: room.id });
  const box = await createBox(trx, { name: 'MoS2 chips, autumn', placeId: desiccator.id, rows: 4, columns: 6 });
  for (const [index, chip] of mos2Chips.slice(1).entries()) {
    await moveSample({ trx, actor: manager, code: chip, to: { boxCode: box.code, slot: `A${index + 1}` } });
  }
}
