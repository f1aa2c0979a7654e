import { z } from 'zod';
import { SampleSummary } from './sample';

/**
 * One record in the lineage picture. `generation` is its distance from the record asked about:
 * negative for ancestors (−1 = parent), 0 for the record itself, positive for descendants; a
 * relative reachable along several paths sits at its nearest generation.
 */
export const LineageGraphNode = SampleSummary.extend({ generation: z.number().int() }).meta({ id: 'LineageGraphNode' });
export type LineageGraphNode = z.infer<typeof LineageGraphNode>;

/** A parent → child link and the step that made it. */
export const LineageGraphEdge = z
  .object({
    parentCode: z.string(),
    childCode: z.string(),
    step: z.object({ id: z.number(), type: z.string(), startedAt: z.iso.datetime().nullable() }),
  })
  .meta({ id: 'LineageGraphEdge' });
export type LineageGraphEdge = z.infer<typeof LineageGraphEdge>;

/** Each record once; every link between two records in the picture once per step. */
export const LineageGraph = z
  .object({ code: z.string(), nodes: z.array(LineageGraphNode), edges: z.array(LineageGraphEdge) })
  .meta({ id: 'LineageGraph' });
export type LineageGraph = z.infer<typeof LineageGraph>;
