import type { z } from 'zod';
import { apiErrorSchema } from '@shared/schemas/api-error';

/** The header the server's CSRF guard expects on every state-changing request. */
const CSRF_HEADER = 'X-Syconium-Request';

/** An API error with the server's code, message and per-field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string[]> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/**
 * Fetch JSON from the API and parse it with a shared zod schema. Throws ApiError on a non-2xx
 * answer, so TanStack Query sees failures as errors. A 204 resolves to undefined.
 */
export async function apiFetch<T extends z.ZodType>(path: string, schema: T, init: RequestInit & { json?: unknown } = {}): Promise<z.output<T>> {
  const { json, headers, ...rest } = init;
  const response = await fetch(path, {
    credentials: 'same-origin',
    ...rest,
    headers: {
      Accept: 'application/json',
      [CSRF_HEADER]: '1',
      ...(json !== undefined ? { 'Content-Type': 'application/json' } : {}),
      ...headers,
    },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  if (!response.ok) throw await toApiError(response);
  if (response.status === 204) return schema.parse(undefined);
  return schema.parse(await response.json());
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  return errorFromBody(response.status, body);
}

/** The server's error answer as ApiError, or a plain one naming the status when it is not ours. */
export function errorFromBody(status: number, body: unknown): ApiError {
  const parsed = apiErrorSchema.safeParse(body);
  return parsed.success ? new ApiError(status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.fields) : new ApiError(status, 'http_error', `The server answered ${status}`);
}

/**
 * POST a multipart form with upload progress (fetch cannot report it; XMLHttpRequest can), then
 * parse the JSON answer like apiFetch. `onProgress` gets the sent fraction; `onSent` fires once the
 * whole body is on the server and it is working on it.
 */
export function uploadWithProgress<T extends z.ZodType>(path: string, form: FormData, schema: T, { onProgress, onSent }: { onProgress: (fraction: number) => void; onSent?: () => void }): Promise<z.output<T>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.setRequestHeader(CSRF_HEADER, '1');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded / event.total);
    };
    if (onSent) xhr.upload.onload = () => onSent();
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload did not reach the server. Check the connection and try again.'));
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(schema.parse(body));
      else reject(errorFromBody(xhr.status, body));
    };
    xhr.send(form);
  });
}
