import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useRef, useState } from 'react';
import { parseTwoColumn } from '@/shared/evidence/spectrum-parse';
import {
  CandidateFlakeResult,
  EvidenceEnvelope,
  EvidenceList,
  SPECTRUM_MAX_POINTS,
  type ContrastInput,
  type Evidence,
  type EvidenceKind,
  type EvidenceMetadata,
  type StoredFileRef,
} from '@/shared/schemas/evidence';
import { ApiError, apiFetch, readError } from './api-client';
import { evidenceKeys, sampleKeys, STALE_TIMES, stepKeys } from './query-keys';
import { uploadWithProgress, type UploadFile, type UploadProgress } from './upload-with-progress';

const sampleEvidencePath = (code: string) => `/api/samples/${encodeURIComponent(code)}/evidence`;
const evidencePath = (id: number) => `/api/evidence/${id}`;

/** A sample's evidence, newest first, with the one layer call it adds up to. */
export function useSampleEvidenceQuery(code: string) {
  return useQuery({
    queryKey: evidenceKeys.ofSample(code),
    queryFn: ({ signal }) => apiFetch(sampleEvidencePath(code), { schema: EvidenceList, signal }),
    enabled: code.length > 0,
    staleTime: STALE_TIMES.evidence,
  });
}

export function useEvidenceQuery(id: number | null) {
  return useQuery({
    queryKey: evidenceKeys.detail(id ?? 0),
    queryFn: async ({ signal }) => (await apiFetch(evidencePath(id ?? 0), { schema: EvidenceEnvelope, signal })).evidence,
    enabled: id !== null,
    staleTime: STALE_TIMES.evidence,
  });
}

/**
 * The points of a stored spectrum or profile, read with the same strict parser the server used.
 * A stored file never changes (it is named by its checksum), so it is read once.
 */
export function useEvidencePointsQuery(file: StoredFileRef | null) {
  return useQuery({
    queryKey: evidenceKeys.fileText(file?.sha256 ?? ''),
    queryFn: async ({ signal }) => {
      let response: Response;
      try {
        response = await fetch(file?.url ?? '', { credentials: 'same-origin', signal, headers: { Accept: 'text/plain' } });
      } catch (cause) {
        if (signal.aborted) throw cause;
        throw new ApiError(0, 'network_unreachable', '');
      }
      if (!response.ok) throw await readError(response);
      return parseTwoColumn(await response.text(), { maxPoints: SPECTRUM_MAX_POINTS });
    },
    enabled: file !== null,
    staleTime: Infinity,
  });
}

/** Everything evidence touches: the sample's layer call shows in lists, its history gains an event. */
function afterEvidenceChange(queryClient: ReturnType<typeof useQueryClient>, evidence: Evidence) {
  queryClient.setQueryData(evidenceKeys.detail(evidence.id), evidence);
  void queryClient.invalidateQueries({ queryKey: evidenceKeys.all });
  void queryClient.invalidateQueries({ queryKey: sampleKeys.all });
}

export interface EvidenceUpload {
  kind: EvidenceKind;
  metadata: EvidenceMetadata;
  file: UploadFile;
}

/**
 * Uploads one file as evidence of a sample, reporting bytes sent as it goes. `cancel()` stops
 * an upload in flight; the server stores nothing of an interrupted one.
 */
export function useUploadEvidenceMutation(code: string) {
  const queryClient = useQueryClient();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const controller = useRef<AbortController | null>(null);
  const mutation = useMutation({
    mutationFn: async ({ kind, metadata, file }: EvidenceUpload) => {
      controller.current = new AbortController();
      setProgress({ sentBytes: 0, totalBytes: file.blob?.size ?? null });
      const answer = await uploadWithProgress(sampleEvidencePath(code), {
        file,
        fields: { kind, metadata: JSON.stringify(metadata) },
        schema: EvidenceEnvelope,
        onProgress: setProgress,
        signal: controller.current.signal,
      });
      return answer.evidence;
    },
    onSuccess: (evidence) => afterEvidenceChange(queryClient, evidence),
    onSettled: () => {
      controller.current = null;
    },
  });
  const cancel = useCallback(() => controller.current?.abort(), []);
  return { mutation, progress, cancel };
}

/** Replaces what the researcher said about a file (a newer calibration, the right material) and re-runs the analysis. */
export function useUpdateEvidenceMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, version, metadata }: { id: number; version: number; metadata: EvidenceMetadata }) =>
      (await apiFetch(evidencePath(id), { method: 'PATCH', body: { version, metadata }, schema: EvidenceEnvelope })).evidence,
    onSuccess: (evidence) => afterEvidenceChange(queryClient, evidence),
  });
}

/** Measures the contrast between the marked flake and substrate regions and matches it to a layer count. */
export function useComputeContrastMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, input }: { id: number; input: ContrastInput }) =>
      (await apiFetch(`${evidencePath(id)}/contrast`, { method: 'POST', body: input, schema: EvidenceEnvelope })).evidence,
    onSuccess: (evidence) => afterEvidenceChange(queryClient, evidence),
  });
}

/** Runs the monolayer finder over the whole micrograph again (e.g. after a calibration was added). */
export function useFindCandidatesMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (id: number) =>
      (await apiFetch(`${evidencePath(id)}/candidates`, { method: 'POST', schema: EvidenceEnvelope })).evidence,
    onSuccess: (evidence) => afterEvidenceChange(queryClient, evidence),
  });
}

/** Turns a candidate into a flake record on the chip, logged as a flake-search step. */
export function useMakeFlakeMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, index }: { id: number; index: number }) =>
      apiFetch(`${evidencePath(id)}/candidates/${index}/flake`, { method: 'POST', schema: CandidateFlakeResult }),
    onSuccess: (result) => {
      queryClient.setQueryData(sampleKeys.detail(result.sample.code), result.sample);
      void queryClient.invalidateQueries({ queryKey: evidenceKeys.all });
      void queryClient.invalidateQueries({ queryKey: sampleKeys.all });
      void queryClient.invalidateQueries({ queryKey: stepKeys.all });
    },
  });
}
