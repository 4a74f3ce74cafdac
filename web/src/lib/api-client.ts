/**
 * The one HTTP client of the web app. It sends cookies, attaches the CSRF token to every
 * state-changing request (fetched lazily, refetched once when the server says it is stale),
 * and turns every failure into an `ApiError` with a message a person can act on.
 */

import type { z } from 'zod';
import { issueFields } from '@contracts/common';

export interface ApiErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}

export class ApiError extends Error {
  constructor(
    /** HTTP status, or 0 when the server could not be reached. */
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly fields: Record<string, string> = {},
    /** The path that was requested, e.g. `/api/vehicles`. */
    public readonly path = '',
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export function isApiError(err: unknown): err is ApiError {
  return err instanceof ApiError;
}

/** Plain-words fallbacks when a response has no message of its own. */
const fallbackMessages: Record<number, string> = {
  400: 'Some values are not valid. Check the form and try again.',
  401: 'You are signed out. Sign in to continue.',
  403: 'Your role does not give access to this.',
  404: 'We could not find what you asked for. It may have been removed.',
  409: 'This clashes with a record that already exists.',
  429: 'Too many requests in a short time. Wait a minute and try again.',
  500: 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.',
};

type Query = Record<string, string | number | boolean | null | undefined>;

/** `?a=1&b=x`, leaving out empty values so URLs and cache keys stay short. */
export function toSearch(query?: Query): string {
  if (!query) return '';
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  const s = params.toString();
  return s ? `?${s}` : '';
}

let csrfToken: Promise<string> | null = null;

async function fetchCsrfToken(): Promise<string> {
  const body = await send<{ token: string }>('GET', '/api/auth/csrf', undefined, undefined, false);
  return body.token;
}

function csrf(): Promise<string> {
  if (!csrfToken) {
    csrfToken = fetchCsrfToken().catch((err: unknown) => {
      csrfToken = null;
      throw err;
    });
  }
  return csrfToken;
}

/** Forget the CSRF token; the server binds it to the session, so call this on sign-in and sign-out. */
export function resetCsrfToken() {
  csrfToken = null;
}

async function readError(res: Response, path: string): Promise<ApiError> {
  let body: Partial<ApiErrorBody> | undefined;
  try {
    body = (await res.json()) as Partial<ApiErrorBody>;
  } catch {
    body = undefined;
  }
  const e = body?.error;
  const status = res.status;
  const message = e?.message || fallbackMessages[status] || (status >= 500 ? fallbackMessages[500] : `The request failed (HTTP ${status}).`);
  return new ApiError(status, e?.code ?? `http_${status}`, message, e?.fields ?? {}, path);
}

async function send<T>(
  method: string,
  path: string,
  body: unknown,
  signal: AbortSignal | undefined,
  withCsrf: boolean,
  retried = false,
  networkMessage = 'Cannot reach the Reboundry server. Check your connection and try again.',
): Promise<T> {
  // a form (file uploads) goes as multipart/form-data, its boundary set by the browser
  const isForm = body instanceof FormData;
  const headers: Record<string, string> = { accept: 'application/json' };
  if (body !== undefined && !isForm) headers['content-type'] = 'application/json';
  if (withCsrf) headers['x-csrf-token'] = await csrf();

  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers,
      body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === 'AbortError') throw err;
    throw new ApiError(0, 'network', networkMessage, {}, path);
  }

  if (!res.ok) {
    const error = await readError(res, path);
    if (withCsrf && !retried && error.status === 403 && error.code === 'csrf_invalid') {
      resetCsrfToken();
      return send<T>(method, path, body, signal, withCsrf, true, networkMessage);
    }
    throw error;
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export const api = {
  get<T>(path: string, opts: { query?: Query; signal?: AbortSignal } = {}) {
    return send<T>('GET', path + toSearch(opts.query), undefined, opts.signal, false);
  },
  post<T>(path: string, body?: unknown) {
    return send<T>('POST', path, body ?? {}, undefined, true);
  },
  patch<T>(path: string, body: unknown) {
    return send<T>('PATCH', path, body, undefined, true);
  },
  put<T>(path: string, body: unknown) {
    return send<T>('PUT', path, body, undefined, true);
  },
  delete<T>(path: string) {
    return send<T>('DELETE', path, undefined, undefined, true);
  },
  /** A multipart/form-data POST (files and fields), with the same CSRF token and errors as the rest. */
  postForm<T>(path: string, form: FormData, opts: { networkMessage?: string } = {}) {
    return send<T>('POST', path, form, undefined, true, false, opts.networkMessage);
  },
};

/**
 * Sends one file (field `file`) and optional text fields, for the upload endpoints (surveys,
 * trip imports, inspection photos).
 */
export function uploadFile<T>(path: string, file: File, fields: Record<string, string | undefined> = {}): Promise<T> {
  const form = new FormData();
  form.set('file', file, file.name);
  for (const [k, v] of Object.entries(fields)) if (v !== undefined && v !== '') form.set(k, v);
  return api.postForm<T>(path, form);
}

/**
 * `body` parsed by the server's own rules for the request (a schema from @contracts), or an
 * `ApiError` 400 with the same field messages the server would answer, so a form shows them on
 * its fields without a round trip.
 */
export function checked<S extends z.ZodType>(schema: S, body: unknown, path: string): z.output<S> {
  const r = schema.safeParse(body);
  if (r.success) return r.data;
  throw new ApiError(400, 'validation', fallbackMessages[400], issueFields(r.error), path);
}

/** Shape of every list endpoint. */
export interface ListResponse<T> {
  items: T[];
  total: number;
}

/**
 * The address of a list's CSV export (`/api/<list>/export`) with the list's filters and sort but
 * not its paging: the file holds every matching row. A plain link downloads it (same origin, so
 * the session cookie goes with it).
 */
export function exportUrl(path: string, params: ListParams & Query): string {
  const { page: _page, pageSize: _pageSize, ...rest } = params;
  return path + toSearch(rest);
}

/** Shared list parameters: 1-based page, page size (≤ 200), `field` or `-field` sort. */
export interface ListParams {
  page: number;
  pageSize: number;
  sort?: string;
}
