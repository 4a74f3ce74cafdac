import { ApiError, type ApiErrorBody } from './api-client';

/**
 * Sends one file as multipart/form-data (field `file`) with the CSRF token, for the upload
 * endpoints (surveys, trip imports). Errors become `ApiError`s like every other request.
 */
export async function uploadFile<T>(path: string, file: File, fields: Record<string, string | undefined> = {}): Promise<T> {
  const tokenRes = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  const { token } = (await tokenRes.json()) as { token: string };
  const form = new FormData();
  form.set('file', file, file.name);
  for (const [k, v] of Object.entries(fields)) if (v !== undefined && v !== '') form.set(k, v);
  let res: Response;
  try {
    res = await fetch(path, { method: 'POST', body: form, headers: { 'x-csrf-token': token, accept: 'application/json' }, credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network', 'Cannot reach the Reboundry server. Check your connection and try again.', {}, path);
  }
  const text = await res.text();
  const body = text ? (JSON.parse(text) as unknown) : undefined;
  if (!res.ok) {
    const e = (body as Partial<ApiErrorBody> | undefined)?.error;
    throw new ApiError(res.status, e?.code ?? `http_${res.status}`, e?.message ?? `The upload failed (HTTP ${res.status}).`, e?.fields ?? {}, path);
  }
  return body as T;
}
