import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';

/** A built client of our own making: a page, one hashed script and an unhashed public file. */
const webDir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-web-'));
const script = Array.from({ length: 400 }, (_, i) => `export const value${i} = ${i} * 2;`).join('\n');
const page = '<!doctype html><html><head><script type="module" src="/assets/index-Ab12Cd34.js"></script></head><body><div id="root"></div></body></html>';

/** What the build leaves beside a script: its brotli copy at the highest quality. */
const precompressed = zlib.brotliCompressSync(script, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11 } });

let srv: TestServer;
beforeAll(async () => {
  fs.mkdirSync(path.join(webDir, 'assets'));
  fs.writeFileSync(path.join(webDir, 'index.html'), page);
  fs.writeFileSync(path.join(webDir, 'assets/index-Ab12Cd34.js'), script);
  fs.writeFileSync(path.join(webDir, 'assets/chart-Ef56Gh78.js'), script);
  fs.writeFileSync(path.join(webDir, 'assets/chart-Ef56Gh78.js.br'), precompressed);
  fs.writeFileSync(path.join(webDir, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  srv = await startTestServer({ seed: false, webDir });
});
afterAll(async () => {
  await srv?.stop();
  fs.rmSync(webDir, { recursive: true, force: true });
});

/** A raw GET (node's fetch would undo the compression before we could see it). */
function get(url: string, headers: Record<string, string> = {}): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}

describe('serving the built client', () => {
  it('when a browser accepts brotli, then a script is sent brotli-compressed, smaller, and decodes to the file', async () => {
    const r = await get(`${srv.url}/assets/index-Ab12Cd34.js`, { 'accept-encoding': 'gzip, deflate, br' });
    expect(r.status).toBe(200);
    expect(r.headers['content-encoding']).toBe('br');
    expect(r.body.length).toBeLessThan(script.length / 3);
    expect(zlib.brotliDecompressSync(r.body).toString()).toBe(script);
  });

  it('when the build left a brotli copy beside a script, then that copy is sent as it is', async () => {
    const r = await get(`${srv.url}/assets/chart-Ef56Gh78.js`, { 'accept-encoding': 'gzip, br' });
    expect(r.headers['content-encoding']).toBe('br');
    expect(r.headers['content-type']).toMatch(/javascript/);
    expect(r.body.equals(precompressed)).toBe(true);
    expect(r.headers['cache-control']).toMatch(/immutable/);
  });

  it('when a browser accepts only gzip, then the script comes gzip-compressed', async () => {
    const r = await get(`${srv.url}/assets/index-Ab12Cd34.js`, { 'accept-encoding': 'gzip' });
    expect(r.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(r.body).toString()).toBe(script);
  });

  it('when a hashed asset is served, then it may be kept for a year without asking again', async () => {
    const r = await get(`${srv.url}/assets/index-Ab12Cd34.js`);
    expect(r.headers['cache-control']).toMatch(/max-age=31536000/);
    expect(r.headers['cache-control']).toMatch(/immutable/);
  });

  it('when a page address is opened, then index.html comes marked to be revalidated, and an unchanged page answers 304', async () => {
    const r = await get(`${srv.url}/vehicles/12`);
    expect(r.status).toBe(200);
    expect(r.body.toString()).toBe(page);
    expect(r.headers['cache-control']).toBe('no-cache');
    expect(r.headers.etag).toBeTruthy();
    const again = await get(`${srv.url}/vehicles/12`, { 'if-none-match': String(r.headers.etag) });
    expect(again.status).toBe(304);
  });

  it('when a public file without a hash is served, then it is not marked immutable', async () => {
    const r = await get(`${srv.url}/favicon.svg`);
    expect(r.status).toBe(200);
    expect(r.headers['cache-control']).not.toMatch(/immutable/);
  });

  it('when a chunk of an older build is asked for, then 404, not the page', async () => {
    const r = await get(`${srv.url}/assets/index-Old00000.js`);
    expect(r.status).toBe(404);
    expect(r.headers['content-type']).toMatch(/json/);
  });
});
