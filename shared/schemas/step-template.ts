import { z } from 'zod';
import { STEP_TYPES } from '../steps';
import { STEP_NOTES_MAX_LENGTH, STEP_PARAMETER_SCHEMAS, StepOutputInput } from './step';

export const STEP_TEMPLATE_NAME_MAX_LENGTH = 80;

/**
 * What a template keeps: the parts of a step that repeat from run to run: parameters (any of
 * them; a field left out is filled in at the bench), instrument, notes and the kinds of new
 * samples it makes. Per-run fields (operator, start and end, the codes of inputs, treated
 * samples and existing outputs) are dropped when a template is saved, so a template never
 * points at a sample that has since been used up.
 */
const templateBody = <P extends z.ZodObject>(parameters: P) =>
  z.object({
    parameters: parameters.partial(),
    instrument: z.string().trim().max(120).optional(),
    notes: z.string().trim().max(STEP_NOTES_MAX_LENGTH).optional(),
    outputs: z.array(StepOutputInput).max(20).optional(),
  });

const TemplateName = z
  .string()
  .trim()
  .min(1, 'Name the template.')
  .max(STEP_TEMPLATE_NAME_MAX_LENGTH, `A template name has at most ${STEP_TEMPLATE_NAME_MAX_LENGTH} characters.`);

const forType = <T extends (typeof STEP_TYPES)[number]>(type: T) =>
  z.object({ name: TemplateName, type: z.literal(type), body: templateBody(STEP_PARAMETER_SCHEMAS[type]) });

export const StepTemplateCreateInput = z
  .discriminatedUnion(
    'type',
    [
      forType('exfoliation'),
      forType('cvd_growth'),
      forType('transfer'),
      forType('stacking'),
      forType('lithography'),
      forType('etching'),
      forType('annealing'),
      forType('encapsulation'),
      forType('metal_deposition'),
      forType('cleaving'),
      forType('flake_search'),
    ],
    { error: 'Choose a step type.' },
  )
  .meta({ id: 'StepTemplateCreateInput' });
export type StepTemplateCreateInput = z.input<typeof StepTemplateCreateInput>;
export type StepTemplateCreate = z.output<typeof StepTemplateCreateInput>;

export const StepTemplate = z
  .object({
    id: z.number(),
    name: z.string(),
    type: z.enum(STEP_TYPES),
    body: z.object({
      parameters: z.record(z.string(), z.unknown()),
      instrument: z.string().optional(),
      notes: z.string().optional(),
      outputs: z.array(z.record(z.string(), z.unknown())).optional(),
    }),
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'StepTemplate' });
export type StepTemplate = z.infer<typeof StepTemplate>;

export const StepTemplateEnvelope = z.object({ template: StepTemplate }).meta({ id: 'StepTemplateEnvelope' });
export const StepTemplateList = z.object({ templates: z.array(StepTemplate) }).meta({ id: 'StepTemplateList' });
