import { useQuery } from '@tanstack/react-query';
import { Linking } from 'react-native';
import { LabelTemplateList } from '@/shared/schemas/labels';
import { SAMPLE_PAGE_SIZE_MAX, SampleListPage } from '@/shared/schemas/sample';
import { apiFetch } from './api-client';
import { labelKeys, STALE_TIMES } from './query-keys';
import type { SampleListFilters } from './use-samples';

/** The server prints at most this many labels in one PDF (`LabelSheetQuery`). */
export const LABEL_BATCH_MAX = 500;

/** What a sheet of labels is for: chosen samples, everything a step made, or a box's own label. */
export type LabelTarget =
  { kind: 'samples'; codes: readonly string[] } | { kind: 'step'; stepId: number } | { kind: 'box'; code: string };

export function useLabelTemplatesQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: labelKeys.templates(),
    queryFn: async ({ signal }) => (await apiFetch('/api/label-templates', { schema: LabelTemplateList, signal })).templates,
    enabled: options.enabled ?? true,
    staleTime: STALE_TIMES.labelTemplates,
  });
}

/** The address of the PDF: a plain GET that the browser opens with the session cookie. */
export function labelSheetPath(target: LabelTarget, templateId: number, skip = 0): string {
  const query = new URLSearchParams({ template: String(templateId) });
  if (target.kind === 'samples') query.set('samples', target.codes.join(','));
  else if (target.kind === 'step') query.set('step', String(target.stepId));
  else query.set('box', target.code);
  if (skip > 0) query.set('skip', String(skip));
  return `/api/labels.pdf?${query.toString()}`;
}

/** Opens the PDF beside the app (a new tab on the web) so the list or record stays where it was. */
export function openLabelSheet(path: string): Promise<void> {
  return Linking.openURL(path);
}

function resultsPath(filters: SampleListFilters, page: number): string {
  const query = new URLSearchParams();
  if (filters.kind.length) query.set('kind', filters.kind.join(','));
  if (filters.status.length) query.set('status', filters.status.join(','));
  if (filters.material.trim()) query.set('material', filters.material.trim());
  if (filters.ownerId !== null) query.set('ownerId', String(filters.ownerId));
  if (filters.layersMin !== null) query.set('layersMin', String(filters.layersMin));
  if (filters.layersMax !== null) query.set('layersMax', String(filters.layersMax));
  if (filters.q.trim()) query.set('q', filters.q.trim());
  query.set('sort', filters.sort);
  query.set('order', filters.order);
  query.set('page', String(page));
  query.set('pageSize', String(SAMPLE_PAGE_SIZE_MAX));
  return `/api/samples?${query.toString()}`;
}

export interface ResultCodes {
  /** The first `LABEL_BATCH_MAX` codes, in the list's order. */
  codes: string[];
  /** How many samples match in all. */
  total: number;
}

/**
 * The codes of everything a filtered list shows (up to the batch limit), gathered before the
 * print button is offered: the PDF then opens straight from the tap, which browsers require
 * of a new tab.
 */
export function useResultCodesQuery(filters: SampleListFilters, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: labelKeys.resultCodes(filters, LABEL_BATCH_MAX),
    queryFn: async ({ signal }): Promise<ResultCodes> => {
      const codes: string[] = [];
      let total = 0;
      for (let page = 1; codes.length < LABEL_BATCH_MAX; page += 1) {
        const answer = await apiFetch(resultsPath(filters, page), { schema: SampleListPage, signal });
        total = answer.total;
        codes.push(...answer.samples.map((sample) => sample.code));
        if (answer.samples.length < answer.pageSize || codes.length >= total) break;
      }
      return { codes: codes.slice(0, LABEL_BATCH_MAX), total };
    },
    enabled: options.enabled ?? true,
    staleTime: STALE_TIMES.samples,
  });
}
