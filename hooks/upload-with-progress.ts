import type { z } from 'zod';
import { ApiError, forgetCsrfToken, isApiError, loadCsrfToken, readError } from './api-client';

/**
 * A file on its way to the server. On the web the picker hands over the file itself (`blob`);
 * on a phone only its local address (`uri`), which React Native's FormData reads from disk.
 */
export interface UploadFile {
  name: string;
  mediaType: string;
  blob?: Blob;
  uri?: string;
}

export interface UploadProgress {
  sentBytes: number;
  /** Null until the platform knows how big the request body is. */
  totalBytes: number | null;
}

export interface UploadRequest<S extends z.ZodType> {
  file: UploadFile;
  /** Plain form fields sent beside the file (JSON goes in as a string). */
  fields: Readonly<Record<string, string>>;
  schema: S;
  onProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
}

/** An upload the person (or a screen that went away) cancelled. */
export class UploadCancelledError extends Error {
  override readonly name = 'UploadCancelledError';
  constructor() {
    super('The upload was cancelled.');
  }
}

function formFor(file: UploadFile, fields: Readonly<Record<string, string>>): FormData {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) form.append(key, value);
  if (file.blob) {
    form.append('file', file.blob, file.name);
  } else if (file.uri) {
    // React Native's FormData takes {uri, name, type} for a file on disk; the DOM typings do not know that shape.
    form.append('file', { uri: file.uri, name: file.name, type: file.mediaType } as unknown as Blob);
  } else {
    throw new RangeError('An upload needs the file itself or its local address.');
  }
  return form;
}

interface Answer {
  status: number;
  text: string;
}

function send(path: string, form: FormData, token: string, request: UploadRequest<z.ZodType>): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    const { signal, onProgress } = request;
    const cancel = () => xhr.abort();
    if (signal?.aborted) {
      reject(new UploadCancelledError());
      return;
    }
    signal?.addEventListener('abort', cancel);
    const settle = () => signal?.removeEventListener('abort', cancel);

    xhr.open('POST', path);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader('x-csrf-token', token);
    xhr.upload.onprogress = (event) => {
      onProgress?.({ sentBytes: event.loaded, totalBytes: event.lengthComputable ? event.total : null });
    };
    xhr.onload = () => {
      settle();
      resolve({ status: xhr.status, text: xhr.responseText });
    };
    // A dropped connection or a server that went away mid-upload: nothing was stored.
    xhr.onerror = () => {
      settle();
      reject(new ApiError(0, 'network_unreachable', ''));
    };
    xhr.ontimeout = xhr.onerror;
    xhr.onabort = () => {
      settle();
      reject(new UploadCancelledError());
    };
    xhr.send(form);
  });
}

async function readAnswer<S extends z.ZodType>(answer: Answer, schema: S): Promise<z.output<S>> {
  if (answer.status < 200 || answer.status >= 300) {
    throw await readError(new Response(answer.text, { status: answer.status }));
  }
  let body: unknown;
  try {
    body = JSON.parse(answer.text);
  } catch {
    body = undefined;
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw new ApiError(answer.status, 'unexpected_response', '');
  return parsed.data;
}

/**
 * A multipart POST whose progress can be shown: `fetch` cannot report bytes sent, so this uses
 * XMLHttpRequest, with the same cookie, CSRF header (refreshed and retried once when the server
 * rejects it) and error vocabulary as `apiFetch`. Only hooks use it.
 */
export async function uploadWithProgress<S extends z.ZodType>(path: string, request: UploadRequest<S>): Promise<z.output<S>> {
  const form = formFor(request.file, request.fields);
  let answer: Answer;
  try {
    answer = await send(path, form, await loadCsrfToken(), request);
    if (answer.status === 403) {
      // Peek at the code without consuming the answer: a stale token is retried once with a fresh one.
      const error = await readError(new Response(answer.text, { status: answer.status }));
      if (isApiError(error, 'csrf_invalid')) {
        forgetCsrfToken();
        request.onProgress?.({ sentBytes: 0, totalBytes: null });
        answer = await send(path, form, await loadCsrfToken(), request);
      }
    }
  } catch (error) {
    if (error instanceof ApiError || error instanceof UploadCancelledError) throw error;
    throw new ApiError(0, 'network_unreachable', '');
  }
  return readAnswer(answer, request.schema);
}
