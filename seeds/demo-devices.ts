import type { Knex } from 'knex';
import { MeasurementCreateInput } from '../shared/schemas/device';
import { ZonePlateDesignInput } from '../shared/schemas/zone-plate';
import type { UserModel } from '../server/models/user-model';
import { addMeasurement } from '../server/services/device-measurements';
import { saveLensDesign } from '../server/services/lens-designs';
import { findSampleByCode } from '../server/services/sample-lookup';

const daysAgo = (days: number, hour = 10) => {
  const date = new Date(Date.now() - days * 86_400_000);
  date.setUTCHours(hour, 0, 0, 0);
  return date.toISOString();
};

/**
 * The demo lens's design (the ZP-1 pattern its lithography step names: 632.8 nm, f = 1 mm, half
 * a millimetre across) and a few invented bench measurements: focal length at three laser lines,
 * and focal length and efficiency against a back-gate voltage.
 */
export async function seedDemoDevices(trx: Knex.Transaction, props: { researcher: UserModel; lensCode: string }) {
  const { researcher } = props;
  const device = await findSampleByCode(props.lensCode, { trx });
  await saveLensDesign({
    trx,
    actor: researcher,
    device,
    input: ZonePlateDesignInput.parse({ wavelengthNm: 632.8, focalLengthUm: 1000, apertureDiameterUm: 500 }),
  });
  const measurements: MeasurementCreateInput[] = [
    {
      kind: 'focal_length_vs_wavelength',
      rows: [
        { x: 532, y: 1181 },
        { x: 632.8, y: 1006 },
        { x: 780, y: 818, note: 'focus spot broader; laser diode' },
      ],
      instrument: 'Optical bench 2, knife-edge focus scan',
      measuredAt: daysAgo(3, 14),
      note: 'Three laser lines through the same 20× relay.',
    },
    {
      kind: 'focal_length_vs_gate_voltage',
      rows: [-30, -15, 0, 15, 30].map((volts, index) => ({ x: volts, y: [1003, 1004, 1006, 1007, 1009][index] })),
      instrument: 'Optical bench 2, back gate through the Si substrate',
      measuredAt: daysAgo(2, 11),
    },
    {
      kind: 'efficiency_vs_gate_voltage',
      rows: [-30, -15, 0, 15, 30].map((volts, index) => ({ x: volts, y: [4.1, 4.6, 5.2, 5.9, 6.3][index] })),
      instrument: 'Optical bench 2, power meter behind a 50 µm pinhole',
      measuredAt: daysAgo(2, 15),
      note: 'Efficiency: first-order focus power over power incident on the lens area.',
    },
  ];
  for (const measurement of measurements) {
    await addMeasurement({ trx, actor: researcher, device, input: MeasurementCreateInput.parse(measurement) });
  }
}
