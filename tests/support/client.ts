/**
 * A small API client for tests: keeps cookies like a browser, fetches the CSRF token and sends
 * it on every state-changing request, and signs in as a demo user.
 */
export class ApiClient {
  private cookies = new Map<string, string>();
  private csrf: string | null = null;

  constructor(private readonly base: string) {}

  private cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keep(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const eq = pair.indexOf('=');
      this.cookies.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
  }

  async raw(method: string, path: string, init: { body?: unknown; headers?: Record<string, string>; csrf?: boolean; form?: FormData } = {}) {
    const headers: Record<string, string> = { ...init.headers };
    if (this.cookies.size) headers.cookie = this.cookieHeader();
    const changing = !['GET', 'HEAD', 'OPTIONS'].includes(method);
    if (changing && init.csrf !== false) {
      if (!this.csrf) await this.refreshCsrf();
      headers['x-csrf-token'] = this.csrf!;
      headers.cookie = this.cookieHeader();
    }
    let body: BodyInit | undefined;
    if (init.form) body = init.form;
    else if (init.body !== undefined) {
      headers['content-type'] = 'application/json';
      body = typeof init.body === 'string' ? init.body : JSON.stringify(init.body);
    }
    const res = await fetch(this.base + path, { method, headers, body, redirect: 'manual' });
    this.keep(res);
    return res;
  }

  /**
   * The same browser (its cookies, shared from now on, and its form token) sending to another
   * address: another app instance, as a proxy in front of several may route the next request.
   */
  at(base: string): ApiClient {
    const other = new ApiClient(base);
    other.cookies = this.cookies;
    other.csrf = this.csrf;
    return other;
  }

  async refreshCsrf() {
    const res = await this.raw('GET', '/api/auth/csrf');
    this.csrf = ((await res.json()) as { token: string }).token;
  }

  async json<T = unknown>(method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
    const res = await this.raw(method, path, { body });
    const text = await res.text();
    return { status: res.status, body: (text ? JSON.parse(text) : null) as T };
  }

  get<T = unknown>(path: string) {
    return this.json<T>('GET', path);
  }

  async login(email: string, password = 'reboundry-demo') {
    const r = await this.json<{ user: { id: number; role: string } }>('POST', '/api/auth/login', { email, password });
    // the session id changes on sign-in, and the CSRF token is bound to it
    this.csrf = null;
    return r;
  }
}

export const DEMO = {
  manager: 'manager@reboundry.test',
  mechanic: 'mechanic@reboundry.test',
  driver: 'driver@reboundry.test',
} as const;
