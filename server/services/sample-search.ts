import type { Knex } from 'knex';
import type { SampleListFilters } from '../../shared/schemas/sample';

const SORT_COLUMNS: Record<SampleListFilters['sort'], string> = {
  code: 's.code',
  createdAt: 's.created_at',
  updatedAt: 's.updated_at',
  material: 's.material',
  kind: 's.kind',
  status: 's.status',
};

/** Escapes LIKE wildcards so a search for "50%" means the text 50%. */
const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (char) => `\\${char}`)}%`;

/** The filtered, sorted sample query shared by the list page and the CSV export. */
export function filteredSamples(knex: Knex, filters: SampleListFilters) {
  const query = knex('samples as s').join('users as u', 'u.id', 's.owner_id');
  if (filters.kind?.length) query.whereIn('s.kind', filters.kind);
  if (filters.status?.length) query.whereIn('s.status', filters.status);
  if (filters.material) query.whereRaw('lower(s.material) = lower(?)', [filters.material]);
  if (filters.ownerId) query.where('s.owner_id', filters.ownerId);
  if (filters.layersMin !== undefined) query.where('s.layer_estimate', '>=', filters.layersMin);
  if (filters.layersMax !== undefined) query.where('s.layer_estimate', '<=', filters.layersMax);
  if (filters.layers !== undefined) query.where('s.layer_estimate', filters.layers);
  if (filters.createdFrom) query.where('s.created_at', '>=', filters.createdFrom);
  if (filters.createdTo) query.where('s.created_at', '<=', filters.createdTo);
  if (filters.awaitingSearch) {
    // A chip with a child has been searched (a flake or film was recorded from it).
    query
      .where('s.kind', 'chip')
      .where('s.status', 'ready')
      .whereNotExists((children) => children.select(knex.raw('1')).from('lineage_links as l').whereRaw('l.parent_id = s.id'));
  }
  if (filters.q) {
    // Matches the trigram index expression in the samples migration.
    query.whereRaw("(s.code || ' ' || coalesce(s.name, '') || ' ' || coalesce(s.note, '')) ilike ?", [likePattern(filters.q)]);
  }
  return query;
}

export function sortedSamples(query: Knex.QueryBuilder, filters: SampleListFilters) {
  // The code breaks ties so pages never overlap or skip rows.
  return query.orderBy(SORT_COLUMNS[filters.sort], filters.order).orderBy('s.code', filters.order);
}

export const LIST_COLUMNS = [
  's.id',
  's.code',
  's.kind',
  's.material',
  's.name',
  's.status',
  's.layer_estimate',
  's.owner_id',
  'u.display_name as owner_name',
  's.note',
  's.properties',
  's.created_at',
  's.updated_at',
];
