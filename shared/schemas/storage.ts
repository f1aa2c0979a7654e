import { z } from 'zod';
import { SampleLocation, SampleSummary } from './sample';

export { SampleLocation };

export const PLACE_KINDS = ['room', 'cabinet', 'desiccator', 'glovebox', 'fridge', 'freezer', 'shelf', 'other'] as const;
export const PLACE_KIND_LABELS: Record<(typeof PLACE_KINDS)[number], string> = {
  room: 'Room',
  cabinet: 'Cabinet',
  desiccator: 'Desiccator',
  glovebox: 'Glovebox',
  fridge: 'Fridge',
  freezer: 'Freezer',
  shelf: 'Shelf',
  other: 'Other',
};
export const BOX_MAX_ROWS = 26;
export const BOX_MAX_COLUMNS = 50;

const name = (label: string) => z.string().trim().min(1, `Enter a ${label}.`).max(120, `A ${label} has at most 120 characters.`);

export const StoragePlace = z
  .object({
    id: z.number(),
    name: z.string(),
    kind: z.enum(PLACE_KINDS),
    parentId: z.number().nullable(),
    path: z.string(),
    note: z.string().nullable(),
    boxCount: z.number(),
  })
  .meta({ id: 'StoragePlace' });
export type StoragePlace = z.infer<typeof StoragePlace>;

export const StoragePlaceList = z.object({ places: z.array(StoragePlace) }).meta({ id: 'StoragePlaceList' });
export const StoragePlaceEnvelope = z.object({ place: StoragePlace }).meta({ id: 'StoragePlaceEnvelope' });

export const StoragePlaceCreateInput = z
  .object({
    name: name('name'),
    kind: z.enum(PLACE_KINDS, { error: 'Choose what kind of place this is.' }),
    parentId: z.number().int().positive().nullable().optional(),
    note: z.string().trim().max(1000).optional(),
  })
  .meta({ id: 'StoragePlaceCreateInput' });
export type StoragePlaceCreateInput = z.input<typeof StoragePlaceCreateInput>;

const AxisLabelsField = z.enum(['letters', 'numbers']);

export const BoxCreateInput = z
  .object({
    name: name('box name'),
    placeId: z.number().int().positive().nullable().optional(),
    rows: z
      .number({ error: 'Rows must be a number.' })
      .int()
      .min(1, 'At least one row.')
      .max(BOX_MAX_ROWS, `At most ${BOX_MAX_ROWS} rows (A–Z).`),
    columns: z
      .number({ error: 'Columns must be a number.' })
      .int()
      .min(1, 'At least one column.')
      .max(BOX_MAX_COLUMNS, `At most ${BOX_MAX_COLUMNS} columns.`),
    rowLabels: AxisLabelsField.default('letters'),
    columnLabels: AxisLabelsField.default('numbers'),
    note: z.string().trim().max(1000).optional(),
  })
  .superRefine((box, context) => {
    if (box.columnLabels === 'letters' && box.columns > 26) {
      context.addIssue({ code: 'custom', path: ['columns'], message: 'Lettered columns stop at Z (26).' });
    }
  })
  .meta({ id: 'BoxCreateInput' });
export type BoxCreateInput = z.input<typeof BoxCreateInput>;

export const BoxSummary = z
  .object({
    code: z.string(),
    name: z.string(),
    placeId: z.number().nullable(),
    placePath: z.string().nullable(),
    rows: z.number(),
    columns: z.number(),
    rowLabels: AxisLabelsField,
    columnLabels: AxisLabelsField,
    occupied: z.number(),
  })
  .meta({ id: 'BoxSummary' });
export type BoxSummary = z.infer<typeof BoxSummary>;

export const BoxList = z.object({ boxes: z.array(BoxSummary) }).meta({ id: 'BoxList' });

export const BoxSlot = z.object({ slot: z.string(), row: z.number(), column: z.number(), sample: SampleSummary.nullable() });
export const Box = BoxSummary.extend({ note: z.string().nullable(), slots: z.array(BoxSlot) }).meta({ id: 'Box' });
export type Box = z.infer<typeof Box>;
export const BoxEnvelope = z.object({ box: Box }).meta({ id: 'BoxEnvelope' });

export const BoxCodeParam = z.object({ code: z.string().trim().min(1).max(40) });

export const MoveSampleInput = z
  .object({
    boxCode: z.string().trim().min(1, 'Scan or type the box code.'),
    slot: z.string().trim().min(1, 'Name the slot, e.g. B3.').max(6),
  })
  .meta({ id: 'MoveSampleInput' });
export type MoveSampleInput = z.input<typeof MoveSampleInput>;

export const SampleLocationEnvelope = z
  .object({ code: z.string(), location: SampleLocation.nullable() })
  .meta({ id: 'SampleLocationEnvelope' });
