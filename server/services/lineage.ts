import type { Knex } from 'knex';
import type { LineageEntry } from '../../shared/schemas/lineage';

/** Far beyond any real process chain; stops a runaway walk if the graph were ever corrupted. */
export const MAX_GENERATIONS = 1_000;

export type LineageDirection = 'ancestors' | 'descendants';

/**
 * All ancestors (or descendants) of a sample in one recursive query: each relative once, at its
 * nearest generation, with the steps that link it towards the sample. UNION (not UNION ALL)
 * keeps each (relative, generation) pair once, so diamonds do not multiply rows.
 */
export async function lineageOf(
  knex: Knex | Knex.Transaction,
  sampleId: number,
  direction: LineageDirection,
): Promise<LineageEntry[]> {
  const [from, to] = direction === 'ancestors' ? ['child_id', 'parent_id'] : ['parent_id', 'child_id'];
  const { rows } = await knex.raw(
    `
    with recursive walk(id, generation) as (
      select ${to}, 1 from lineage_links where ${from} = :sampleId
      union
      select l.${to}, walk.generation + 1
        from lineage_links l join walk on l.${from} = walk.id
       where walk.generation < :maxGenerations
    ),
    relatives as (select id, min(generation) as generation from walk group by id)
    select s.code, s.kind, s.material, s.name, s.status, s.layer_estimate as "layerEstimate", r.generation,
           coalesce((
             select json_agg(json_build_object('stepId', l.step_id, 'stepType', st.type, 'via', other.code) order by l.step_id, other.code)
               from lineage_links l
               join samples other on other.id = l.${from}
               join steps st on st.id = l.step_id
              where l.${to} = s.id and (l.${from} = :sampleId or l.${from} in (select id from relatives))
           ), '[]'::json) as links
      from relatives r join samples s on s.id = r.id
     order by r.generation, s.code
    `,
    { sampleId, maxGenerations: MAX_GENERATIONS },
  );
  return (rows as (LineageEntry & { generation: number | string })[]).map((row) => ({
    ...row,
    generation: Number(row.generation),
  }));
}

/**
 * If making `outputIds` children of `inputIds` would close a loop, the loop as a list of codes
 * (an output, down through its descendants, to the input that would become its parent);
 * otherwise null. One recursive query collects the inputs' ancestry; the path is found in it.
 */
export async function cycleThrough(trx: Knex.Transaction, inputIds: number[], outputIds: number[]): Promise<string[] | null> {
  const direct = outputIds.find((id) => inputIds.includes(id));
  const { rows: edges } = await trx.raw(
    `
    with recursive up(id) as (
      select unnest(:inputIds::bigint[])
      union
      select l.parent_id from lineage_links l join up on l.child_id = up.id
    )
    select l.parent_id as "parentId", l.child_id as "childId"
      from lineage_links l where l.child_id in (select id from up)
    `,
    { inputIds },
  );
  const children = new Map<number, number[]>();
  const inAncestry = new Set<number>(inputIds);
  for (const edge of edges as { parentId: number; childId: number }[]) {
    const list = children.get(edge.parentId) ?? [];
    list.push(edge.childId);
    children.set(edge.parentId, list);
    inAncestry.add(edge.parentId);
  }
  const start = direct ?? outputIds.find((id) => inAncestry.has(id));
  if (start === undefined) return null;
  // Breadth-first from the output down to an input gives the shortest loop to show.
  const previous = new Map<number, number | null>([[start, null]]);
  const queue = [start];
  let reached: number | undefined = inputIds.includes(start) ? start : undefined;
  for (let next = 0; next < queue.length && reached === undefined; next += 1) {
    const current = queue[next];
    for (const child of children.get(current) ?? []) {
      if (previous.has(child)) continue;
      previous.set(child, current);
      if (inputIds.includes(child)) {
        reached = child;
        break;
      }
      queue.push(child);
    }
  }
  if (reached === undefined) return null;
  const ids: number[] = [];
  for (let at: number | null | undefined = reached; at != null; at = previous.get(at)) ids.unshift(at);
  const codes = await trx('samples').whereIn('id', ids).select('id', 'code');
  const codeOf = new Map(codes.map((row: { id: number; code: string }) => [Number(row.id), row.code]));
  return [...ids.map((id) => codeOf.get(id) ?? String(id)), codeOf.get(start) ?? String(start)];
}
