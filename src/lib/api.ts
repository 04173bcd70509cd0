import type { ZodType } from 'zod';
import { apiErrorSchema, type ApiErrorBody } from '../contract/errors';

/**
 * The one HTTP client for the Holdfire API. Every request goes through here so that cookies, JSON,
 * CSRF and the error shape are handled the same way everywhere.
 */

export type FieldIssue = NonNullable<ApiErrorBody['details']>[number];

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: FieldIssue[];

  constructor(status: number, code: string, message: string, details: FieldIssue[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

/** Message to show a person for any thrown value. */
export function errorMessage(error: unknown): string {
  if (isApiError(error)) return error.message;
  return 'Something went wrong in the browser. Reload the page and try again.';
}

const CSRF_PATH = '/api/auth/csrf';
const CSRF_HEADER = 'X-CSRF-Token';

// One in-flight or settled token request shared by all callers, so a burst of writes fetches it once.
let csrfToken: Promise<string> | null = null;

/**
 * Forget the CSRF token. Needed after sign-in, sign-out, setup and accepting an invitation: the server
 * regenerates the session there, and the old token belongs to the old session.
 */
export function dropCsrfToken(): void {
  csrfToken = null;
}

function getCsrfToken(): Promise<string> {
  if (!csrfToken) {
    csrfToken = fetchCsrfToken().catch((error: unknown) => {
      csrfToken = null; // do not cache a failure
      throw error;
    });
  }
  return csrfToken;
}

async function fetchCsrfToken(): Promise<string> {
  const response = await send(CSRF_PATH, { method: 'GET', headers: { Accept: 'application/json' } });
  if (!response.ok) throw await toApiError(response);
  const body = (await response.json()) as { csrfToken?: unknown };
  if (typeof body.csrfToken !== 'string' || body.csrfToken === '') {
    throw new ApiError(response.status, 'bad_response', 'The server sent an unexpected answer. Reload the page.');
  }
  return body.csrfToken;
}

async function send(path: string, init: RequestInit): Promise<Response> {
  try {
    return await fetch(path, { ...init, credentials: 'same-origin' });
  } catch {
    // fetch only rejects when no answer came back at all (offline, server down, blocked).
    throw new ApiError(0, 'network', 'Could not reach the Holdfire server. Check the connection and try again.');
  }
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    return new ApiError(response.status, parsed.data.code, parsed.data.error, parsed.data.details ?? []);
  }
  return new ApiError(
    response.status,
    response.status >= 500 ? 'internal' : 'http_error',
    response.status >= 500
      ? 'The server had a problem. Nothing you sent was saved. Try again in a moment.'
      : `The server answered with status ${response.status}.`,
  );
}

export interface RequestOptions<T> {
  body?: unknown;
  /** Validates the answer against the shared contract, so drift shows up as a clear error, not as undefined. */
  schema?: ZodType<T>;
  /** The server regenerates the session on this call: drop the CSRF token afterwards. */
  rotatesSession?: boolean;
  signal?: AbortSignal;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export async function apiRequest<T = void>(method: Method, path: string, options: RequestOptions<T> = {}): Promise<T> {
  const isWrite = method !== 'GET';

  const attempt = async (): Promise<Response> => {
    const headers: Record<string, string> = { Accept: 'application/json' };
    if (options.body !== undefined) headers['Content-Type'] = 'application/json';
    if (isWrite) headers[CSRF_HEADER] = await getCsrfToken();
    return send(path, {
      method,
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  };

  let response = await attempt();

  // The token can go stale (session expired, server restarted). Fetch a fresh one and retry exactly once.
  if (isWrite && response.status === 403) {
    const error = await toApiError(response.clone());
    if (error.code === 'csrf_invalid') {
      dropCsrfToken();
      response = await attempt();
    }
  }

  if (options.rotatesSession) dropCsrfToken();

  if (!response.ok) throw await toApiError(response);
  if (response.status === 204 || response.headers.get('Content-Length') === '0') return undefined as T;

  let data: unknown;
  try {
    data = await response.json();
  } catch {
    throw new ApiError(response.status, 'bad_response', 'The server sent an answer the app could not read.');
  }
  if (!options.schema) return data as T;
  const parsed = options.schema.safeParse(data);
  if (!parsed.success) {
    throw new ApiError(response.status, 'bad_response', 'The server sent an answer in an unexpected shape. Reload the page.');
  }
  return parsed.data;
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions<T>, 'body'>) => apiRequest<T>('GET', path, options),
  post: <T = void>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'body'>) =>
    apiRequest<T>('POST', path, { ...options, body }),
  patch: <T = void>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'body'>) =>
    apiRequest<T>('PATCH', path, { ...options, body }),
  put: <T = void>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'body'>) =>
    apiRequest<T>('PUT', path, { ...options, body }),
  delete: <T = void>(path: string, options?: Omit<RequestOptions<T>, 'body'>) => apiRequest<T>('DELETE', path, options),
};
