import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { SampleEnvelope, SampleListPage } from '@/shared/schemas/sample';
import { Step } from '@/shared/schemas/step';
import { STEP_TYPES, type StepType } from '@/shared/steps';
import { apiFetch } from './api-client';
import { readDevicePreference, writeDevicePreference } from './device-preferences';
import { sampleKeys, STALE_TIMES, stepKeys } from './query-keys';

const StepList = z.object({ steps: z.array(Step) });

/** The person's own newest steps, newest first (the bench list, "Repeat my last run", recent tapes). */
export function useMyStepsQuery(type: StepType | null, limit: number) {
  return useQuery({
    queryKey: stepKeys.mine(type, limit),
    queryFn: async ({ signal }) => {
      const query = new URLSearchParams({ mine: 'true', limit: String(limit) });
      if (type) query.set('type', type);
      return (await apiFetch(`/api/steps?${query.toString()}`, { schema: StepList, signal })).steps;
    },
    staleTime: STALE_TIMES.samples,
  });
}

/** Chips made but not yet searched for flakes: what is waiting at the microscope. */
export function useAwaitingSearchChipsQuery() {
  return useQuery({
    queryKey: sampleKeys.awaitingSearch(),
    queryFn: async ({ signal }) =>
      (await apiFetch('/api/samples?kind=chip&awaitingSearch=true&pageSize=20', { schema: SampleListPage, signal })).samples,
    staleTime: STALE_TIMES.samples,
  });
}

/** A few best matches of one kind (crystals for exfoliation, precursor lots for growth). */
export function useKindSearchQuery(kind: string, text: string) {
  const q = text.trim();
  return useQuery({
    queryKey: sampleKeys.kindSearch(kind, q),
    queryFn: async ({ signal }) => {
      const query = new URLSearchParams({ kind, sort: 'updatedAt', order: 'desc', page: '1', pageSize: '8' });
      if (q) query.set('q', q);
      return (await apiFetch(`/api/samples?${query.toString()}`, { schema: SampleListPage, signal })).samples;
    },
    placeholderData: keepPreviousData,
    staleTime: STALE_TIMES.samples,
  });
}

/** Registers a precursor lot (kind `precursor`, codes PR-…) from the growth form. */
export function useRegisterPrecursorMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: { material: string; name?: string; supplier?: string; supplierLot?: string }) => {
      const properties = {
        ...(input.supplier ? { supplier: input.supplier } : {}),
        ...(input.supplierLot ? { supplierLot: input.supplierLot } : {}),
      };
      const body = {
        kind: 'precursor',
        material: input.material,
        ...(input.name ? { name: input.name } : {}),
        ...(Object.keys(properties).length ? { properties } : {}),
      };
      return (await apiFetch('/api/samples', { method: 'POST', body, schema: SampleEnvelope })).sample;
    },
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: sampleKeys.all }),
  });
}

export const StepTemplate = z.object({
  id: z.number(),
  name: z.string(),
  type: z.enum(STEP_TYPES),
  body: z.record(z.string(), z.unknown()),
});
export type StepTemplate = z.infer<typeof StepTemplate>;

export function useStepTemplatesQuery(type: StepType) {
  return useQuery({
    queryKey: stepKeys.templates(),
    queryFn: async ({ signal }) =>
      (await apiFetch('/api/step-templates', { schema: z.object({ templates: z.array(StepTemplate) }), signal })).templates,
    select: (templates) => templates.filter((template) => template.type === type),
    staleTime: STALE_TIMES.stepTemplates,
  });
}

export function useSaveStepTemplateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; type: StepType; body: Record<string, unknown> }) =>
      apiFetch('/api/step-templates', { method: 'POST', body: input }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: stepKeys.templates() }),
  });
}

export function useDeleteStepTemplateMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiFetch(`/api/step-templates/${id}`, { method: 'DELETE' }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: stepKeys.templates() }),
  });
}

/** The last values this person used for a quick form, kept on this device. */
export function readBenchDefaults(form: string, userId: number | undefined): Record<string, unknown> | null {
  const raw = readDevicePreference(`bench.${form}.${userId ?? 'anyone'}`);
  if (!raw) return null;
  try {
    const parsed: unknown = JSON.parse(raw);
    return z.record(z.string(), z.unknown()).safeParse(parsed).data ?? null;
  } catch {
    return null;
  }
}

export function writeBenchDefaults(form: string, userId: number | undefined, values: Record<string, unknown>): void {
  writeDevicePreference(`bench.${form}.${userId ?? 'anyone'}`, JSON.stringify(values));
}
