/**
 * The one way the browser talks to the Wirewalk API: JSON in and out, the
 * session cookie sent (same origin), and every failure thrown as an ApiError
 * carrying the server's `{ error: { code, message, details } }`.
 */
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';

export interface ApiErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    /** HTTP status; 0 when the server could not be reached. */
    readonly status: number,
    /** The server's error code, e.g. `invalid_credentials`, or `network`. */
    readonly code: string,
    message: string,
    readonly details: ApiErrorDetail[] = [],
  ) {
    super(message);
  }
}

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface RequestOptions {
  method?: Method;
  /** Sent as JSON; a FormData body is sent as multipart instead. */
  body?: unknown;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

const NETWORK_MESSAGE = 'Wirewalk could not reach the server. Check the connection and try again.';

/** Calls the API at `path` (starting with `/api/`) and answers the parsed JSON body (undefined for 204). */
export async function apiRequest<T = unknown>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = options.body === undefined ? 'GET' : 'POST', body, signal } = options;
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  let payload: BodyInit | undefined;
  if (body instanceof FormData) payload = body;
  else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }

  let response: Response;
  try {
    response = await fetch(path, { method, headers, body: payload, signal, credentials: 'same-origin' });
  } catch (error) {
    if (signal?.aborted) throw error;
    throw new ApiError(0, 'network', NETWORK_MESSAGE);
  }

  if (response.status === 204 || response.status === 205) return undefined as T;
  const text = await response.text();
  let data: unknown = undefined;
  if (text) {
    try {
      data = JSON.parse(text);
    } catch {
      data = undefined;
    }
  }
  if (!response.ok) throw toApiError(response.status, data);
  return data as T;
}

function toApiError(status: number, data: unknown): ApiError {
  const error = (data as { error?: { code?: unknown; message?: unknown; details?: unknown } } | undefined)?.error;
  const code = typeof error?.code === 'string' ? error.code : `http_${status}`;
  const message =
    typeof error?.message === 'string' && error.message
      ? error.message
      : status >= 500
        ? 'The server ran into a problem. Try again in a moment; if it keeps happening, tell the shop owner.'
        : `The server answered ${status}.`;
  const details = Array.isArray(error?.details)
    ? error.details
        .filter((d): d is ApiErrorDetail => typeof d?.path === 'string' && typeof d?.message === 'string')
        .map((d) => ({ path: d.path, message: d.message }))
    : [];
  return new ApiError(status, code, message, details);
}

/** Short forms of apiRequest. */
export const api = {
  get: <T>(path: string, signal?: AbortSignal) => apiRequest<T>(path, { method: 'GET', signal }),
  post: <T = void>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'POST', body: body ?? {} }),
  put: <T = void>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PUT', body: body ?? {} }),
  patch: <T = void>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PATCH', body: body ?? {} }),
  delete: <T = void>(path: string) => apiRequest<T>(path, { method: 'DELETE' }),
};

/** A message fit to show a person for any thrown value. */
export function errorMessage(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again.';
}

/**
 * Puts the server's field `details` onto react-hook-form fields.
 * A detail whose path names a field of the form (the server writes JSON paths,
 * `$.email`, `$.items[0].name`; plain `email` or `items.0.name` work too) goes on that field; the rest stay in the answer as text, so the
 * caller can show them with FormError. Answers the messages that did not land
 * on a field (empty when every detail found its field or there were none).
 */
/** `$.items[0].name` → `items.0.name` (react-hook-form's field path). */
export function fieldPath(path: string): string {
  return path
    .replace(/^\$\.?/, '')
    .replace(/^body\./, '')
    .replace(/\[(\d+)\]/g, '.$1')
    .replace(/^\./, '');
}

export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly string[],
): string[] {
  if (!(error instanceof ApiError)) return [errorMessage(error)];
  const unplaced: string[] = [];
  let placed = 0;
  for (const detail of error.details) {
    const path = fieldPath(detail.path);
    const field = fields.find((f) => path === f || path.startsWith(`${f}.`));
    if (field) {
      setError(path as Path<T>, { type: 'server', message: detail.message }, { shouldFocus: placed === 0 });
      placed += 1;
    } else unplaced.push(path ? `${path}: ${detail.message}` : detail.message);
  }
  if (placed === 0 && unplaced.length === 0) return [error.message];
  return unplaced;
}
