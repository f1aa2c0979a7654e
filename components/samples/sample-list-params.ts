import type { Href } from 'expo-router';
import { SAMPLE_KINDS, SAMPLE_STATUSES, type SampleKind, type SampleStatus } from '@/shared/samples';
import { SAMPLE_SORTS } from '@/shared/schemas/sample';
import { DEFAULT_SAMPLE_FILTERS, type SampleListFilters, type SampleSort, type SortOrder } from '@/hooks/use-samples';

/**
 * What the sample list shows, as it is written in the address (`/samples?kind=chip,flake&mine=1`),
 * so a filtered list can be bookmarked or shared. Changes replace the address rather than add
 * to the browser history, so the back button is not filled with every filter tap.
 */
export interface SampleListView {
  kind: SampleKind[];
  status: SampleStatus[];
  material: string;
  /** Only the signed-in person's samples. */
  mine: boolean;
  /** A band of the combined layer call (`LAYER_BANDS`), '' for any. */
  layers: LayerBand | '';
  q: string;
  sort: SampleSort;
  order: SortOrder;
}

export type RouteParams = Record<string, string | string[] | undefined>;

/** Layer-call bands the list can be narrowed to: what people hunt for, then "few" and "thick". */
export const LAYER_BANDS = {
  '1': { label: 'Monolayer', min: 1, max: 1 },
  '2': { label: 'Bilayer', min: 2, max: 2 },
  '3-5': { label: '3–5 layers', min: 3, max: 5 },
  '6-': { label: '6 or more', min: 6, max: null },
} as const satisfies Record<string, { label: string; min: number; max: number | null }>;
export type LayerBand = keyof typeof LAYER_BANDS;
const LAYER_BAND_KEYS = Object.keys(LAYER_BANDS) as LayerBand[];

function first(value: string | string[] | undefined): string {
  return (Array.isArray(value) ? value[0] : value) ?? '';
}

function listOf<T extends string>(value: string | string[] | undefined, allowed: readonly T[]): T[] {
  return first(value)
    .split(',')
    .map((item) => item.trim())
    .filter((item): item is T => allowed.some((candidate) => candidate === item));
}

function oneOf<T extends string>(value: string | string[] | undefined, allowed: readonly T[], fallback: T): T {
  const text = first(value);
  return allowed.find((candidate) => candidate === text) ?? fallback;
}

export function parseSampleListView(params: RouteParams): SampleListView {
  return {
    kind: listOf(params.kind, SAMPLE_KINDS),
    status: listOf(params.status, SAMPLE_STATUSES),
    material: first(params.material).trim(),
    mine: first(params.mine) === '1',
    layers: oneOf(params.layers, LAYER_BAND_KEYS, '' as const),
    q: first(params.q),
    sort: oneOf(params.sort, SAMPLE_SORTS, DEFAULT_SAMPLE_FILTERS.sort),
    order: oneOf(params.order, ['asc', 'desc'] as const, DEFAULT_SAMPLE_FILTERS.order),
  };
}

/** The address form of a view: defaults are left out so plain `/samples` stays plain. */
export function viewParams(view: SampleListView): Record<string, string | undefined> {
  return {
    kind: view.kind.length ? view.kind.join(',') : undefined,
    status: view.status.length ? view.status.join(',') : undefined,
    material: view.material || undefined,
    mine: view.mine ? '1' : undefined,
    layers: view.layers || undefined,
    q: view.q.trim() || undefined,
    sort: view.sort === DEFAULT_SAMPLE_FILTERS.sort ? undefined : view.sort,
    order: view.order === DEFAULT_SAMPLE_FILTERS.order ? undefined : view.order,
  };
}

export function filtersFor(view: SampleListView, userId: number | undefined): SampleListFilters {
  return {
    kind: view.kind,
    status: view.status,
    material: view.material,
    ownerId: view.mine && userId !== undefined ? userId : null,
    layersMin: view.layers ? LAYER_BANDS[view.layers].min : null,
    layersMax: view.layers ? LAYER_BANDS[view.layers].max : null,
    q: view.q,
    sort: view.sort,
    order: view.order,
  };
}

/** How many filters narrow the list (search text and sorting not counted). */
export function activeFilterCount(view: SampleListView): number {
  return view.kind.length + view.status.length + (view.material ? 1 : 0) + (view.mine ? 1 : 0) + (view.layers ? 1 : 0);
}

function definedOnly(params: Record<string, string | undefined>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of Object.entries(params)) if (value !== undefined) out[key] = value;
  return out;
}

/**
 * Where a sample opens. Wide screens show it beside the list, keeping the list's filters;
 * narrower ones give it the whole screen, and the back button returns to the list.
 */
export function sampleHref(code: string, options: { wide: boolean; view?: SampleListView }): Href {
  if (!options.wide) return { pathname: '/samples/[code]', params: { code } };
  return { pathname: '/samples', params: { ...definedOnly(options.view ? viewParams(options.view) : {}), code } };
}
