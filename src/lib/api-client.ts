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

function errorFromText(status: number, text: string): ApiError {
  let body: unknown = null;
  try {
    body = JSON.parse(text);
  } catch {
    // A proxy answering 413 or 502 sends HTML; the status still tells the story.
  }
  const error = (body as { error?: { code?: unknown; message?: unknown; details?: unknown } } | null)?.error;
  const fallback = status === 404 ? 'not_found' : status === 413 ? 'payload_too_large' : 'internal';
  const code = typeof error?.code === 'string' ? error.code : fallback;
  const message = typeof error?.message === 'string' && error.message !== '' ? error.message : messageFor(code);
  return new ApiError(status, code, message, error?.details);
}

async function toApiError(response: Response): Promise<ApiError> {
  let text = '';
  try {
    text = await response.text();
  } catch {
    // A dropped connection mid-body still leaves the status to go by.
  }
  return errorFromText(response.status, text);
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

/** Bytes sent so far of a multipart upload, and the total when the browser knows it. */
export interface UploadProgress {
  loaded: number;
  total: number | null;
}

interface MultipartOptions {
  params?: QueryParams;
  signal?: AbortSignal;
  onProgress?: (progress: UploadProgress) => void;
  /** Called once the last byte has left the browser, while the server is still reading the file. */
  onSent?: () => void;
}

/*
 * fetch() cannot report upload progress, so a file goes up through
 * XMLHttpRequest; everything else about the request (CSRF header, error
 * shape, one retry on a stale token) matches `request` above.
 */
function sendMultipart(path: string, form: FormData, options: MultipartOptions): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', buildUrl(path, options.params));
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    if (csrfToken) xhr.setRequestHeader('X-CSRF-Token', csrfToken);
    xhr.upload.onprogress = (event) => options.onProgress?.({ loaded: event.loaded, total: event.lengthComputable ? event.total : null });
    xhr.upload.onload = () => options.onSent?.();
    xhr.onload = () => resolve({ status: xhr.status, text: xhr.responseText });
    xhr.onerror = () =>
      reject(new ApiError(0, 'network_error', 'The Starledger server could not be reached. Check the connection and try again.'));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    if (options.signal) {
      if (options.signal.aborted) {
        reject(new DOMException('The upload was cancelled.', 'AbortError'));
        return;
      }
      options.signal.addEventListener('abort', () => xhr.abort(), { once: true });
    }
    xhr.send(form);
  });
}

async function postMultipart<T>(path: string, form: FormData, options: MultipartOptions = {}): Promise<T> {
  let response = await sendMultipart(path, form, options);
  if (response.status === 403 && errorFromText(403, response.text).code === 'csrf_invalid' && (await refreshCsrfToken())) {
    response = await sendMultipart(path, form, options);
  }
  if (response.status < 200 || response.status >= 300) throw errorFromText(response.status, response.text);
  return (response.text === '' ? undefined : JSON.parse(response.text)) as T;
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'body'>) => request<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('POST', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('PUT', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('PATCH', path, { ...options, body }),
  delete: <T = void>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>) => request<T>('DELETE', path, { ...options, body }),
  /** A multipart form with a file, reporting the bytes sent as they go. */
  postMultipart,
};
