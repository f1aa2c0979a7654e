import { z } from 'zod';

export const LABEL_SHAPES = ['round', 'rectangle'] as const;
/** Label text smaller than this is not legible on a printed label (common practice, no source). */
export const LABEL_MIN_SIDE_MM = 8;

const mm = (label: string, max = 1000) =>
  z
    .number({ error: `${label} must be a number of millimetres.` })
    .min(0, `${label} cannot be negative.`)
    .max(max);

export const LabelTemplate = z
  .object({
    id: z.number(),
    name: z.string(),
    shape: z.enum(LABEL_SHAPES),
    labelWidthMm: z.number(),
    labelHeightMm: z.number(),
    pageWidthMm: z.number(),
    pageHeightMm: z.number(),
    columns: z.number(),
    rows: z.number(),
    marginLeftMm: z.number(),
    marginTopMm: z.number(),
    columnGapMm: z.number(),
    rowGapMm: z.number(),
    builtIn: z.boolean(),
  })
  .meta({ id: 'LabelTemplate' });
export type LabelTemplate = z.infer<typeof LabelTemplate>;

export const LabelTemplateList = z.object({ templates: z.array(LabelTemplate) }).meta({ id: 'LabelTemplateList' });
export const LabelTemplateEnvelope = z.object({ template: LabelTemplate }).meta({ id: 'LabelTemplateEnvelope' });

export const LabelTemplateCreateInput = z
  .object({
    name: z.string().trim().min(1, 'Name the template.').max(120),
    shape: z.enum(LABEL_SHAPES, { error: 'Choose round or rectangle.' }),
    labelWidthMm: mm('Label width', 300).min(
      LABEL_MIN_SIDE_MM,
      `Labels narrower than ${LABEL_MIN_SIDE_MM} mm cannot hold a readable code.`,
    ),
    labelHeightMm: mm('Label height', 300).min(
      LABEL_MIN_SIDE_MM,
      `Labels lower than ${LABEL_MIN_SIDE_MM} mm cannot hold a readable code.`,
    ),
    pageWidthMm: mm('Page width').positive('Page width must be above zero.'),
    pageHeightMm: mm('Page height').positive('Page height must be above zero.'),
    columns: z.number().int().min(1).max(100),
    rows: z.number().int().min(1).max(100),
    marginLeftMm: mm('Left margin'),
    marginTopMm: mm('Top margin'),
    columnGapMm: mm('Gap between columns').default(0),
    rowGapMm: mm('Gap between rows').default(0),
  })
  .superRefine((template, context) => {
    const usedWidth =
      template.marginLeftMm + template.columns * template.labelWidthMm + (template.columns - 1) * template.columnGapMm;
    const usedHeight = template.marginTopMm + template.rows * template.labelHeightMm + (template.rows - 1) * template.rowGapMm;
    if (usedWidth > template.pageWidthMm + 0.01) {
      context.addIssue({
        code: 'custom',
        path: ['columns'],
        message: `${template.columns} labels across need ${usedWidth.toFixed(1)} mm but the page is ${template.pageWidthMm} mm wide. Use fewer columns or smaller gaps.`,
      });
    }
    if (usedHeight > template.pageHeightMm + 0.01) {
      context.addIssue({
        code: 'custom',
        path: ['rows'],
        message: `${template.rows} rows need ${usedHeight.toFixed(1)} mm but the page is ${template.pageHeightMm} mm high. Use fewer rows or smaller gaps.`,
      });
    }
  })
  .meta({ id: 'LabelTemplateCreateInput' });
export type LabelTemplateCreateInput = z.input<typeof LabelTemplateCreateInput>;

const codeList = z
  .string()
  .transform((value) =>
    value
      .split(',')
      .map((code) => code.trim())
      .filter(Boolean),
  )
  .pipe(z.array(z.string()).min(1, 'Name at least one code.').max(500, 'At most 500 labels at once.'));

/** What to print: sample codes, the outputs of a step, or a box's own label; on which template. */
export const LabelSheetQuery = z
  .object({
    template: z.string().regex(/^\d+$/, 'Choose a label template.').transform(Number),
    samples: codeList.optional(),
    step: z.string().regex(/^\d+$/, 'A step is named by its number.').transform(Number).optional(),
    box: z.string().trim().min(1).optional(),
    /** Skip this many positions on the first sheet, to use up a part-used sheet. */
    skip: z.string().regex(/^\d+$/).transform(Number).default(0),
  })
  .refine((query) => [query.samples, query.step, query.box].filter((value) => value !== undefined).length === 1, {
    message: 'Say what to print: samples, a step or a box (one of them).',
  })
  .meta({ id: 'LabelSheetQuery' });
export type LabelSheetQuery = z.input<typeof LabelSheetQuery>;
