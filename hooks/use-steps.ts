import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { StepEnvelope, type StepCreate } from '@/shared/schemas/step';
import { apiFetch } from './api-client';
import { sampleKeys, STALE_TIMES, stepKeys } from './query-keys';

export function useStepQuery(id: number) {
  return useQuery({
    queryKey: stepKeys.detail(id),
    queryFn: async ({ signal }) => (await apiFetch(`/api/steps/${id}`, { schema: StepEnvelope, signal })).step,
    enabled: Number.isInteger(id) && id > 0,
    staleTime: STALE_TIMES.step,
  });
}

/** One request logs the step, its new samples, links and history, or nothing at all. */
export function useLogStepMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: StepCreate) =>
      (await apiFetch('/api/steps', { method: 'POST', body: input, schema: StepEnvelope })).step,
    onSuccess: (step) => {
      queryClient.setQueryData(stepKeys.detail(step.id), step);
      // Inputs may now be used up, and every sample involved has new children and history.
      void queryClient.invalidateQueries({ queryKey: sampleKeys.all });
    },
  });
}
