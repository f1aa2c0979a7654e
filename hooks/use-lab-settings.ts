import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { LabSettingsEnvelope, type LabSettingsUpdateInput } from '@/shared/schemas/device';
import { apiFetch } from './api-client';
import { deviceKeys, labSettingsKeys, STALE_TIMES } from './query-keys';

/** The lab's own process limits (the smallest line its lithography writes). */
export function useLabSettingsQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: labSettingsKeys.current(),
    queryFn: async ({ signal }) => (await apiFetch('/api/lab-settings', { schema: LabSettingsEnvelope, signal })).settings,
    enabled: options.enabled ?? true,
    staleTime: STALE_TIMES.labSettings,
  });
}

/** Managers only (the server decides). Lens designs are warned against the new value, so they are re-read. */
export function useUpdateLabSettingsMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: z.output<typeof LabSettingsUpdateInput>) =>
      (await apiFetch('/api/lab-settings', { method: 'PATCH', body: input, schema: LabSettingsEnvelope })).settings,
    onSuccess: (settings) => {
      queryClient.setQueryData(labSettingsKeys.current(), settings);
      void queryClient.invalidateQueries({ queryKey: deviceKeys.all });
    },
  });
}
