import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import {
  DeviceMeasurementEnvelope,
  DeviceMeasurementList,
  LensDesignEnvelope,
  type MeasurementCreateInput,
} from '@/shared/schemas/device';
import type { ZonePlateDesignInput } from '@/shared/schemas/zone-plate';
import { apiFetch } from './api-client';
import { auditKeys, deviceKeys, sampleKeys, STALE_TIMES } from './query-keys';

const devicePath = (code: string) => `/api/samples/${encodeURIComponent(code)}`;

/** The device's current lens design (null before the first is saved) and the earlier ones. */
export function useLensDesignQuery(code: string, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: deviceKeys.lensDesign(code),
    queryFn: ({ signal }) => apiFetch(`${devicePath(code)}/lens-design`, { schema: LensDesignEnvelope, signal }),
    enabled: code.length > 0 && (options.enabled ?? true),
    staleTime: STALE_TIMES.devices,
  });
}

/** The address of the saved design's radii table; a plain GET the browser downloads with the session cookie. */
export function radiiCsvPath(code: string): string {
  return `${devicePath(code)}/lens-design/radii.csv`;
}

/** A file name for the radii table that says which device it belongs to. */
export function radiiCsvFileName(code: string): string {
  return `${code.replace(/[^A-Za-z0-9-]/g, '_')}-zone-radii.csv`;
}

/**
 * Saves a new current design (older ones stay on record). Measurements' predictions and the
 * device's audit and history follow the design, so they are refreshed too.
 */
export function useSaveLensDesignMutation(code: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof ZonePlateDesignInput>) =>
      apiFetch(`${devicePath(code)}/lens-design`, { method: 'PUT', body: input, schema: LensDesignEnvelope }),
    onSuccess: (saved) => {
      queryClient.setQueryData(deviceKeys.lensDesign(code), saved);
      void queryClient.invalidateQueries({ queryKey: deviceKeys.measurements(code) });
      void queryClient.invalidateQueries({ queryKey: sampleKeys.history(code) });
      void queryClient.invalidateQueries({ queryKey: auditKeys.all });
    },
  });
}

export function useMeasurementsQuery(code: string, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: deviceKeys.measurements(code),
    queryFn: async ({ signal }) =>
      (await apiFetch(`${devicePath(code)}/measurements`, { schema: DeviceMeasurementList, signal })).measurements,
    enabled: code.length > 0 && (options.enabled ?? true),
    staleTime: STALE_TIMES.devices,
  });
}

function useAfterMeasurementChange(code: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: deviceKeys.measurements(code) });
    void queryClient.invalidateQueries({ queryKey: sampleKeys.history(code) });
  };
}

export function useAddMeasurementMutation(code: string) {
  const refresh = useAfterMeasurementChange(code);
  return useMutation({
    mutationFn: async (input: z.output<typeof MeasurementCreateInput>) =>
      (await apiFetch(`${devicePath(code)}/measurements`, { method: 'POST', body: input, schema: DeviceMeasurementEnvelope }))
        .measurement,
    onSuccess: refresh,
  });
}

export function useDeleteMeasurementMutation(code: string) {
  const refresh = useAfterMeasurementChange(code);
  return useMutation({
    mutationFn: (id: number) => apiFetch(`${devicePath(code)}/measurements/${id}`, { method: 'DELETE' }),
    onSuccess: refresh,
  });
}
