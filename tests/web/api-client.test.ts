import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, resetCsrfToken, uploadFile } from '../../web/src/lib/api-client';

/**
 * The client's one HTTP module against a scripted server: every state-changing request carries
 * the CSRF token, a token the server calls stale is fetched again and the request sent once more,
 * and file uploads (multipart forms) take the same path as JSON requests.
 */
interface Seen {
  method: string;
  path: string;
  token: string | null;
  body: unknown;
}

function scriptedServer(opts: { staleFirst: boolean }) {
  const seen: Seen[] = [];
  let tokens = 0;
  let staleSent = false;
  const fetchMock = vi.fn(async (path: string, init: RequestInit = {}) => {
    const headers = (init.headers ?? {}) as Record<string, string>;
    seen.push({ method: init.method ?? 'GET', path, token: headers['x-csrf-token'] ?? null, body: init.body });
    if (path === '/api/auth/csrf') return new Response(JSON.stringify({ token: `t${++tokens}` }), { status: 200 });
    if (opts.staleFirst && !staleSent) {
      staleSent = true;
      return new Response(JSON.stringify({ error: { code: 'csrf_invalid', message: 'stale' } }), { status: 403 });
    }
    if (path === '/api/fail') return new Response(JSON.stringify({ error: { code: 'validation', message: 'Bad file.', fields: { file: 'is empty' } } }), { status: 400 });
    return new Response(JSON.stringify({ ok: true, path }), { status: 201 });
  });
  return { seen, fetchMock };
}

describe('the client HTTP module', () => {
  beforeEach(() => resetCsrfToken());
  afterEach(() => vi.unstubAllGlobals());

  it('when the server says a form token is stale on an upload, then the client fetches a new token and sends the upload once more', async () => {
    const { seen, fetchMock } = scriptedServer({ staleFirst: true });
    vi.stubGlobal('fetch', fetchMock);
    const file = new File(['distance_m,elevation_m\n0,0\n'], 'survey.csv', { type: 'text/csv' });
    const out = await uploadFile<{ ok: boolean }>('/api/routes/1/surveys', file, { note: 'north lane' });
    expect(out.ok).toBe(true);
    const posts = seen.filter((s) => s.method === 'POST');
    expect(posts).toHaveLength(2);
    expect(posts.map((p) => p.token)).toEqual(['t1', 't2']);
    const form = posts[1].body as FormData;
    expect(form).toBeInstanceOf(FormData);
    expect((form.get('file') as File).name).toBe('survey.csv');
    expect(form.get('note')).toBe('north lane');
  });

  it('when a form is posted, then no JSON content type is set (the browser sets the multipart boundary) and errors carry the server field messages', async () => {
    const { seen, fetchMock } = scriptedServer({ staleFirst: false });
    vi.stubGlobal('fetch', fetchMock);
    const err = await api.postForm('/api/fail', new FormData()).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).fields).toEqual({ file: 'is empty' });
    expect((err as ApiError).message).toBe('Bad file.');
    const post = seen.find((s) => s.method === 'POST')!;
    expect(post.token).toBe('t1');
    const call = fetchMock.mock.calls.find(([p]) => p === '/api/fail')!;
    expect((call[1]!.headers as Record<string, string>)['content-type']).toBeUndefined();
  });

  it('when the server cannot be reached, then the error says so in the words the caller chose', async () => {
    vi.stubGlobal('fetch', vi.fn(async (path: string) => {
      if (path === '/api/auth/csrf') return new Response(JSON.stringify({ token: 't' }), { status: 200 });
      throw new TypeError('Failed to fetch');
    }));
    const err = (await api.postForm('/api/ride-reports', new FormData(), { networkMessage: 'Kept on this phone.' }).catch((e: unknown) => e)) as ApiError;
    expect(err.status).toBe(0);
    expect(err.message).toBe('Kept on this phone.');
  });
});
