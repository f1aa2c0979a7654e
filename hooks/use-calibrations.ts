import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { CalibrationEnvelope, CalibrationList, type CalibrationCreateInput } from '@/shared/schemas/evidence';
import { apiFetch } from './api-client';
import { calibrationKeys, STALE_TIMES } from './query-keys';

const CALIBRATIONS_PATH = '/api/microscope-calibrations';

/** Microscope + objective calibrations (µm per pixel); retired ones only when asked for. */
export function useCalibrationsQuery(options: { includeRetired?: boolean } = {}) {
  const includeRetired = options.includeRetired ?? false;
  return useQuery({
    queryKey: calibrationKeys.list(includeRetired),
    queryFn: async ({ signal }) =>
      (
        await apiFetch(`${CALIBRATIONS_PATH}${includeRetired ? '?includeRetired=true' : ''}`, {
          schema: CalibrationList,
          signal,
        })
      ).calibrations,
    staleTime: STALE_TIMES.calibrations,
  });
}

/** A new calibration of the same microscope and objective replaces the current one. */
export function useCreateCalibrationMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: z.output<typeof CalibrationCreateInput>) =>
      (await apiFetch(CALIBRATIONS_PATH, { method: 'POST', body: input, schema: CalibrationEnvelope })).calibration,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: calibrationKeys.all }),
  });
}

export function useRetireCalibrationMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (id: number) =>
      (await apiFetch(`${CALIBRATIONS_PATH}/${id}/retire`, { method: 'POST', schema: CalibrationEnvelope })).calibration,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: calibrationKeys.all }),
  });
}
