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
  try {
    const body = apiErrorSchema.parse(await response.json());
    return new ApiError(response.status, body.error.code, body.error.message, body.error.fields);
  } catch {
    return new ApiError(response.status, 'http_error', `The server answered ${response.status}`);
  }
}
