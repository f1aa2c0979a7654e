import { z } from 'zod';
import { EDITABLE_STATUSES, SAMPLE_KINDS, SAMPLE_STATUSES } from '../samples';

export const SAMPLE_NAME_MAX_LENGTH = 120;
export const SAMPLE_NOTE_MAX_LENGTH = 4000;
export const MATERIAL_MAX_LENGTH = 60;
export const RETIREMENT_REASON_MAX_LENGTH = 500;
export const SAMPLE_PAGE_SIZE_MAX = 200;

const text = (max: number, label: string) => z.string().trim().max(max, `${label} has at most ${max} characters.`);
const positive = (label: string) => z.number({ error: `${label} must be a number.` }).positive(`${label} must be above zero.`);

export const SampleKindField = z.enum(SAMPLE_KINDS, { error: 'Choose a kind of sample.' });
export const MaterialField = z
  .string({ error: 'Name the material.' })
  .trim()
  .min(1, 'Name the material.')
  .max(MATERIAL_MAX_LENGTH, `A material name has at most ${MATERIAL_MAX_LENGTH} characters.`);

export const SUBSTRATES = ['si_sio2', 'sapphire', 'quartz', 'other'] as const;
export const SUBSTRATE_LABELS: Record<(typeof SUBSTRATES)[number], string> = {
  si_sio2: 'Si with SiO2',
  sapphire: 'Sapphire',
  quartz: 'Quartz',
  other: 'Other',
};

/** Kind-specific facts, all optional: labs fill in what they know. Units are in the names. */
export const SampleProperties = z
  .object({
    supplier: text(120, 'Supplier').optional(),
    supplierLot: text(60, 'Supplier lot').optional(),
    growthMethod: text(60, 'Growth method').optional(),
    substrate: z.enum(SUBSTRATES, { error: 'Choose a substrate.' }).optional(),
    oxideThicknessNm: positive('Oxide thickness').max(10_000, 'Oxide thickness above 10 µm is not a chip oxide.').optional(),
    chipWidthMm: positive('Chip width').max(300, 'Chip width above 300 mm is larger than a wafer.').optional(),
    chipHeightMm: positive('Chip height').max(300, 'Chip height above 300 mm is larger than a wafer.').optional(),
    positionXUm: z.number({ error: 'Position x must be a number.' }).optional(),
    positionYUm: z.number({ error: 'Position y must be a number.' }).optional(),
    flakeSizeUm: positive('Flake size').max(100_000, 'A flake above 10 cm is not a flake.').optional(),
    deviceType: text(60, 'Device type').optional(),
  })
  .strict()
  .meta({ id: 'SampleProperties' });
export type SampleProperties = z.infer<typeof SampleProperties>;

export const SampleCreateInput = z
  .object({
    kind: SampleKindField,
    material: MaterialField,
    name: text(SAMPLE_NAME_MAX_LENGTH, 'A name').optional(),
    note: text(SAMPLE_NOTE_MAX_LENGTH, 'A note').optional(),
    status: z.enum(EDITABLE_STATUSES, { error: 'Choose a status.' }).optional(),
    properties: SampleProperties.optional(),
  })
  .meta({ id: 'SampleCreateInput' });
export type SampleCreateInput = z.input<typeof SampleCreateInput>;

/** An edit names the version it started from; a stale one is refused with the current record. */
export const SampleUpdateInput = z
  .object({
    version: z.number({ error: 'Send the version you edited.' }).int().positive(),
    material: MaterialField.optional(),
    name: text(SAMPLE_NAME_MAX_LENGTH, 'A name').nullable().optional(),
    note: text(SAMPLE_NOTE_MAX_LENGTH, 'A note').nullable().optional(),
    status: z.enum(EDITABLE_STATUSES, { error: 'Choose a status (retiring is separate).' }).optional(),
    ownerId: z.number().int().positive().optional(),
    properties: SampleProperties.optional(),
  })
  .meta({ id: 'SampleUpdateInput' });
export type SampleUpdateInput = z.input<typeof SampleUpdateInput>;

export const RetireSampleInput = z
  .object({
    version: z.number().int().positive(),
    reason: z.string().trim().min(3, 'Say why the record is retired.').max(RETIREMENT_REASON_MAX_LENGTH),
  })
  .meta({ id: 'RetireSampleInput' });
export type RetireSampleInput = z.input<typeof RetireSampleInput>;

export const PersonRef = z.object({ id: z.number(), displayName: z.string() }).meta({ id: 'PersonRef' });

export const SampleSummary = z
  .object({
    code: z.string(),
    kind: z.enum(SAMPLE_KINDS),
    material: z.string(),
    name: z.string().nullable(),
    status: z.enum(SAMPLE_STATUSES),
    layerEstimate: z.number().nullable(),
  })
  .meta({ id: 'SampleSummary' });
export type SampleSummary = z.infer<typeof SampleSummary>;

/** Where a sample sits: a box (with its own code) and a slot such as B3. */
export const SampleLocation = z
  .object({ boxCode: z.string(), boxName: z.string(), slot: z.string(), placePath: z.string().nullable() })
  .meta({ id: 'SampleLocation' });
export type SampleLocation = z.infer<typeof SampleLocation>;

export const Sample = SampleSummary.extend({
  note: z.string().nullable(),
  owner: PersonRef,
  properties: SampleProperties,
  version: z.number(),
  retiredReason: z.string().nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
  madeBy: z.object({ stepId: z.number(), type: z.string(), startedAt: z.iso.datetime().nullable() }).nullable(),
  parents: z.array(SampleSummary),
  children: z.array(SampleSummary),
  location: SampleLocation.nullable(),
}).meta({ id: 'Sample' });
export type Sample = z.infer<typeof Sample>;

export const SampleEnvelope = z.object({ sample: Sample }).meta({ id: 'SampleEnvelope' });

export const SAMPLE_SORTS = ['code', 'createdAt', 'updatedAt', 'material', 'kind', 'status'] as const;

const csvList = <T extends readonly [string, ...string[]]>(values: T, label: string) =>
  z
    .union([z.string(), z.array(z.string())])
    .transform((value) => (Array.isArray(value) ? value : value.split(',')).map((item) => item.trim()).filter(Boolean))
    .pipe(z.array(z.enum(values, { error: `Unknown ${label}.` })));

const optionalNumber = (label: string) =>
  z
    .string()
    .regex(/^-?\d+(\.\d+)?$/, `${label} must be a number.`)
    .transform(Number)
    .optional();

/** Filters of the sample list, as query-string fields (also used for CSV export). */
export const SampleListQuery = z
  .object({
    kind: csvList(SAMPLE_KINDS, 'kind').optional(),
    status: csvList(SAMPLE_STATUSES, 'status').optional(),
    material: z.string().trim().max(MATERIAL_MAX_LENGTH).optional(),
    ownerId: z.string().regex(/^\d+$/, 'Owner must be a person id.').transform(Number).optional(),
    layersMin: optionalNumber('Minimum layer count'),
    layersMax: optionalNumber('Maximum layer count'),
    /** Exactly this combined layer call from the sample's thickness evidence. */
    layers: z
      .string()
      .regex(/^[1-9]\d{0,2}$/, 'Layers is a whole number from 1.')
      .transform(Number)
      .optional(),
    createdFrom: z.iso.datetime({ offset: true, error: 'Use an ISO date-time, e.g. 2026-11-01T00:00:00Z.' }).optional(),
    createdTo: z.iso.datetime({ offset: true, error: 'Use an ISO date-time, e.g. 2026-11-30T23:59:59Z.' }).optional(),
    q: z.string().trim().max(100, 'Search text has at most 100 characters.').optional(),
    /** Ready chips nothing has been made from yet: the ones still to be searched for flakes. */
    awaitingSearch: z
      .enum(['true', 'false'], { error: 'awaitingSearch is true or false.' })
      .transform((value) => value === 'true')
      .optional(),
    sort: z.enum(SAMPLE_SORTS, { error: 'Unknown sort field.' }).default('createdAt'),
    order: z.enum(['asc', 'desc']).default('desc'),
    page: z.string().regex(/^\d+$/).transform(Number).pipe(z.number().int().min(1)).default(1),
    pageSize: z
      .string()
      .regex(/^\d+$/)
      .transform(Number)
      .pipe(z.number().int().min(1).max(SAMPLE_PAGE_SIZE_MAX, `At most ${SAMPLE_PAGE_SIZE_MAX} per page.`))
      .default(50),
  })
  .meta({ id: 'SampleListQuery' });
export type SampleListQuery = z.input<typeof SampleListQuery>;
export type SampleListFilters = z.output<typeof SampleListQuery>;

export const SampleListRow = SampleSummary.extend({
  owner: PersonRef,
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
}).meta({ id: 'SampleListRow' });
export type SampleListRow = z.infer<typeof SampleListRow>;

export const SampleListPage = z
  .object({ samples: z.array(SampleListRow), total: z.number(), page: z.number(), pageSize: z.number() })
  .meta({ id: 'SampleListPage' });
export type SampleListPage = z.infer<typeof SampleListPage>;

export const SampleCodeParam = z.object({
  code: z.string().trim().min(1).max(40, 'That is too long to be a code.'),
});
