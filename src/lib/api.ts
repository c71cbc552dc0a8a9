import { CSRF_COOKIE, CSRF_HEADER } from '@shared/types';
import type { ApiErrorBody } from '@shared/schemas/errors';

/** A failed API call, in the one error shape the server sends. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;
  /** The whole error body: some errors carry more beside `error` (a 409's shortfalls, a 422's import report). */
  readonly body: unknown;

  constructor(status: number, code: string, message: string, fields: Record<string, string> = {}, body: unknown = null) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.body = body;
  }
}

export function isApiError(error: unknown, code?: string): error is ApiError {
  return error instanceof ApiError && (code === undefined || error.code === code);
}

/** A message a person can read for any thrown value. */
export function errorMessage(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  return 'Something went wrong. Try again in a moment.';
}

type Query = Record<string, string | number | boolean | undefined | null>;

interface RequestOptions {
  body?: unknown;
  query?: Query;
  signal?: AbortSignal;
}

/*
 * A 401 from these means "not signed in" or "wrong password", which the calling screen shows
 * itself; any other 401 means the session ended, so the app sends the user to sign in.
 */
const SIGN_IN_ENDPOINTS = [
  '/api/auth/me',
  '/api/auth/login',
  '/api/auth/signup',
  '/api/auth/logout',
  '/api/auth/password-reset/',
  '/api/auth/invites/',
];

let onUnauthenticated: (() => void) | null = null;

/** The app registers what to do when the session has ended (clear "me", go to sign in). */
export function setUnauthenticatedHandler(handler: (() => void) | null): void {
  onUnauthenticated = handler;
}

function readCookie(name: string): string | null {
  for (const part of document.cookie.split(';')) {
    const [key, ...rest] = part.trim().split('=');
    if (key === name) return decodeURIComponent(rest.join('='));
  }
  return null;
}

function buildUrl(path: string, query?: Query): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null) params.set(key, String(value));
  }
  const qs = params.toString();
  return qs ? `${path}?${qs}` : path;
}

function errorFromBody(status: number, body: Partial<ApiErrorBody> | null): ApiError {
  const error = body?.error;
  if (error && typeof error.message === 'string') {
    return new ApiError(status, error.code ?? 'error', error.message, error.fields ?? {}, body);
  }
  if (status === 429) return new ApiError(429, 'rate_limited', 'Too many attempts. Wait a minute and try again.');
  if (status === 413) return new ApiError(413, 'too_large', 'That file is too large.');
  if (status >= 500) return new ApiError(status, 'server', 'The server could not finish that. Try again in a moment.');
  return new ApiError(status, 'error', 'That did not work. Try again in a moment.');
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: Partial<ApiErrorBody> | null = null;
  try {
    body = (await response.json()) as Partial<ApiErrorBody>;
  } catch {
    body = null;
  }
  return errorFromBody(response.status, body);
}

async function request<T>(method: string, path: string, options: RequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET' && method !== 'HEAD') {
    const csrf = readCookie(CSRF_COOKIE);
    if (csrf) headers[CSRF_HEADER] = csrf;
  }

  let response: Response;
  try {
    response = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      credentials: 'same-origin',
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'Could not reach Guyline. Check your connection and try again.');
  }

  if (!response.ok) {
    const error = await toApiError(response);
    if (response.status === 401 && !SIGN_IN_ENDPOINTS.some((p) => path.startsWith(p))) onUnauthenticated?.();
    throw error;
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  if (!text) return undefined as T;
  try {
    return JSON.parse(text) as T;
  } catch {
    throw new ApiError(response.status, 'bad_response', 'The server sent an answer Guyline could not read. Try again in a moment.');
  }
}

/** The single fetch client: JSON in and out, same-origin cookies, the CSRF header on writes. */
export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'body'>) => request<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('POST', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PUT', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PATCH', path, { ...options, body }),
  delete: <T>(path: string, options?: RequestOptions) => request<T>('DELETE', path, options),
};

export interface UploadOptions {
  /** The multipart field name; `file` unless the endpoint says otherwise. */
  field?: string;
  query?: Query;
  /** Share sent so far, 0 to 1. */
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
}

/**
 * Sends one file as multipart/form-data with the same cookies, CSRF header and error handling as
 * `api`. It uses XMLHttpRequest because fetch cannot report upload progress.
 */
export function uploadFile<T>(method: 'POST' | 'PUT', path: string, file: File, options: UploadOptions = {}): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, buildUrl(path, options.query));
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    const csrf = readCookie(CSRF_COOKIE);
    if (csrf) xhr.setRequestHeader(CSRF_HEADER, csrf);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) options.onProgress?.(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'Could not reach Guyline. Check your connection and try again.'));
    xhr.onabort = () => reject(new DOMException('The upload was stopped.', 'AbortError'));
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        body = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        options.onProgress?.(1);
        resolve(body as T);
        return;
      }
      if (xhr.status === 401) onUnauthenticated?.();
      reject(errorFromBody(xhr.status, body as Partial<ApiErrorBody> | null));
    };
    options.signal?.addEventListener('abort', () => xhr.abort());
    const form = new FormData();
    form.append(options.field ?? 'file', file, file.name);
    xhr.send(form);
  });
}
