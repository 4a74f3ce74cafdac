import { afterAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';

const started: TestServer[] = [];
afterAll(async () => {
  for (const s of started) await s.stop();
});
const boot = async (env?: Record<string, string>) => {
  const s = await startTestServer({ seed: false, env });
  started.push(s);
  return s;
};

describe('security headers', () => {
  it('when any page or API answer is sent, then it carries a Content-Security-Policy that allows scripts from this origin only, and API answers are not stored', async () => {
    const srv = await boot({ MAP_TILE_URL: 'https://{s}.tiles.example.test/{z}/{x}/{y}.png' });
    const res = await fetch(`${srv.url}/api/health`);
    const csp = res.headers.get('content-security-policy') ?? '';
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain('img-src \'self\' data: blob: https://*.tiles.example.test');
    expect(csp).not.toContain('upgrade-insecure-requests');
    expect(res.headers.get('cache-control')).toMatch(/no-store/);
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('x-frame-options')).toBe('DENY');
    // HSTS only in production: a development server over plain HTTP must stay reachable
    expect(res.headers.get('strict-transport-security')).toBeNull();
    // the map's tiles are not API answers and may be cached
    expect((await fetch(`${srv.url}/tiles/3/4/2.png`)).headers.get('cache-control') ?? '').not.toMatch(/no-store/);
  });

  it('when the app runs in production, then HSTS is sent and insecure requests are upgraded', async () => {
    const srv = await boot({ NODE_ENV: 'production', SESSION_SECRET: 'a-production-secret-of-enough-length', SEED_DEMO: 'false' });
    const res = await fetch(`${srv.url}/api/health`);
    expect(res.headers.get('strict-transport-security')).toMatch(/max-age=15552000; includeSubDomains/);
    expect(res.headers.get('content-security-policy')).toContain('upgrade-insecure-requests');
  });
});
