import { messageFor, type FieldIssue } from '@shared/errors';

/**
 * The one way the browser talks to the Starledger API. Every failure becomes
 * an ApiError with the server's stable `code`, so screens can branch on the
 * code and show the server's wording.
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /** Field-level problems (validation, conflicts), or an empty list. */
  get fieldIssues(): FieldIssue[] {
    return isFieldIssueList(this.details) ? this.details : [];
  }
}

function isFieldIssueList(value: unknown): value is FieldIssue[] {
  return (
    Array.isArray(value) &&
    value.every(
      (item) =>
        typeof item === 'object' &&
        item !== null &&
        typeof (item as FieldIssue).path === 'string' &&
        typeof (item as FieldIssue).message === 'string',
    )
  );
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

/*
 * The session's CSRF token. It changes at sign-in, so it is always taken from
 * the latest /auth/me or /auth/login response (see lib/auth.ts) rather than
 * read once at start-up.
 */
let csrfToken: string | null = null;

export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type QueryParams = Record<string, string | number | boolean | null | undefined>;

interface RequestOptions {
  body?: unknown;
  params?: QueryParams;
  signal?: AbortSignal;
}

function buildUrl(path: string, params?: QueryParams): string {
  const url = `/api${path}`;
  if (!params) return url;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === null || value === '') continue;
    search.set(key, String(value));
  }
  const query = search.toString();
  return query ? `${url}?${query}` : url;
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    // A proxy or a crashed server can answer without JSON; the status still tells the story.
  }
  const error = (body as { error?: { code?: unknown; message?: unknown; details?: unknown } } | null)?.error;
  const code = typeof error?.code === 'string' ? error.code : response.status === 404 ? 'not_found' : 'internal';
  const message = typeof error?.message === 'string' && error.message !== '' ? error.message : messageFor(code);
  return new ApiError(response.status, code, message, error?.details);
}

async function send(method: Method, path: string, options: RequestOptions): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET' && csrfToken) headers['X-CSRF-Token'] = csrfToken;
  try {
    return await fetch(buildUrl(path, options.params), {
      method,
      headers,
      credentials: 'same-origin',
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network_error', 'The Starledger server could not be reached. Check the connection and try again.');
  }
}

/*
 * A token goes stale when the session was renewed in another tab. Fetching
 * /auth/me hands out the current one, so one retry saves the person from
 * reloading the page and losing what they typed.
 */
async function refreshCsrfToken(): Promise<boolean> {
  const response = await send('GET', '/auth/me', {});
  if (!response.ok) return false;
  const body = (await response.json()) as { csrfToken?: unknown };
  if (typeof body.csrfToken !== 'string') return false;
  setCsrfToken(body.csrfToken);
  return true;
}

async function request<T>(method: Method, path: string, options: RequestOptions = {}): Promise<T> {
  let response = await send(method, path, options);
  if (!response.ok && method !== 'GET' && response.status === 403) {
    const error = await toApiError(response.clone());
    if (error.code === 'csrf_invalid' && (await refreshCsrfToken())) {
      response = await send(method, path, options);
    }
  }
  if (!response.ok) throw await toApiError(response);
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text === '' ? undefined : JSON.parse(text)) as T;
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'body'>) => request<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('POST', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('PUT', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('PATCH', path, { ...options, body }),
  delete: <T = void>(path: string, options?: Omit<RequestOptions, 'body'>) => request<T>('DELETE', path, options),
};
