import {
  blankMeasurement,
  parseMeasurementForm,
  type MeasurementFormValues,
} from '../../../components/devices/measurement-form-values';

// Row rules come from the shared MeasurementCreateInput schema; this checks the form feeds it
// faithfully and puts its messages on the rows as typed (the app's own rules, no source needed).
const at = new Date(2026, 2, 3, 14, 5);
const form = (patch: Partial<MeasurementFormValues>): MeasurementFormValues => ({ ...blankMeasurement(at), ...patch });

describe('reading the add-a-measurement form', () => {
  it('sends the typed rows as numbers with the local time as an ISO instant, dropping empty rows', () => {
    const result = parseMeasurementForm(
      form({
        rows: [
          { x: '632.8', y: '1000' },
          { x: '', y: '' },
          { x: '532', y: '1189,5' },
        ],
        instrument: ' Knife-edge bench ',
      }),
    );
    expect(result).toEqual({
      ok: true,
      input: {
        kind: 'focal_length_vs_wavelength',
        rows: [
          { x: 632.8, y: 1000 },
          { x: 532, y: 1189.5 },
        ],
        instrument: 'Knife-edge bench',
        measuredAt: at.toISOString(),
      },
    });
  });

  it('puts a row’s message on the row typed, even after an empty row was dropped', () => {
    const result = parseMeasurementForm(
      form({
        kind: 'efficiency_vs_gate_voltage',
        rows: [
          { x: '', y: '' },
          { x: '-20', y: '140' },
        ],
      }),
    );
    expect(!result.ok && result.errors['rows.1.y']).toEqual(['An efficiency is between 0 and 100 %.']);
  });

  it('refuses a date that does not exist and an empty measurement', () => {
    const result = parseMeasurementForm(form({ date: '2026-04-31', rows: [{ x: '', y: '' }] }));
    expect(!result.ok && result.errors.measuredAt?.[0]).toMatch(/YYYY-MM-DD/);
    expect(!result.ok && result.errors.rows).toEqual(['Enter at least one row.']);
  });
});
