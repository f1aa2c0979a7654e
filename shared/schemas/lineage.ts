import { z } from 'zod';
import { SampleSummary } from './sample';

/** A relative of a sample, `generation` steps away (1 = parent or child), with the steps that link it. */
export const LineageEntry = SampleSummary.extend({
  generation: z.number().int().positive(),
  links: z.array(
    z.object({
      stepId: z.number(),
      stepType: z.string(),
      /** For ancestors: the child it led to; for descendants: the parent it came from. */
      via: z.string(),
    }),
  ),
}).meta({ id: 'LineageEntry' });
export type LineageEntry = z.infer<typeof LineageEntry>;

export const Lineage = z
  .object({ code: z.string(), direction: z.enum(['ancestors', 'descendants']), relatives: z.array(LineageEntry) })
  .meta({ id: 'Lineage' });
export type Lineage = z.infer<typeof Lineage>;
