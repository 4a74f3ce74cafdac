import { describe, expect, it } from 'vitest';
import { contentLength } from '../../server/http/file-end';
import { hasHiddenChars } from '../../server/http/validate';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { formatProfileCsv, parseProfileCsv } from '../../server/roads/profile-store';
import { managerForFile } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

/** A 1×1 PNG (the smallest valid image). */
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a0e7d6a90000000049454e44ae426082', 'hex');
/** A minimal baseline JPEG structure: SOI, a DQT-like segment, SOS with entropy data holding a stuffed FF 00 and a restart, EOI. */
const JPEG = Buffer.from([0xff, 0xd8, 0xff, 0xdb, 0x00, 0x04, 0x01, 0x02, 0xff, 0xda, 0x00, 0x04, 0x01, 0x00, 0x12, 0xff, 0x00, 0x34, 0xff, 0xd0, 0x56, 0xff, 0xd9]);
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << >> endobj\n%%EOF\n');
const HTML = Buffer.from('<html><script>alert(document.cookie)</script></html>');

describe('where a file ends', () => {
  it('when HTML is appended to a PNG, JPEG or PDF, then the content length stops at IEND, EOI or the last %%EOF', () => {
    expect(contentLength('image/png', Buffer.concat([PNG, HTML]))).toBe(PNG.length);
    expect(contentLength('image/jpeg', Buffer.concat([JPEG, HTML]))).toBe(JPEG.length);
    expect(contentLength('application/pdf', Buffer.concat([PDF, HTML]))).toBe(PDF.length);
    // an incremental update (a second %%EOF) belongs to the document
    const updated = Buffer.concat([PDF, Buffer.from('2 0 obj << >> endobj\n%%EOF\n')]);
    expect(contentLength('application/pdf', updated)).toBe(updated.length);
  });

  it('when an image is cut off before its end, then it is damaged (null)', () => {
    expect(contentLength('image/png', PNG.subarray(0, PNG.length - 12))).toBeNull();
    expect(contentLength('image/jpeg', JPEG.subarray(0, JPEG.length - 2))).toBeNull();
    expect(contentLength('application/pdf', Buffer.from('%PDF-1.4\nno end'))).toBeNull();
  });
});

describe('hidden characters in names', () => {
  it('when a name holds NUL, a control character or a direction override, then it is caught; accents and other scripts are not', () => {
    for (const s of ['Tom\u0000as', 'Line\nbreak', 'CV-\u202e101', 'x\u2066y', 'del\u007f']) expect(hasHiddenChars(s), JSON.stringify(s)).toBe(true);
    for (const s of ['Zoë Ørsted', 'Łukasz Żuk', 'محمد', '李小龍', "O'Neil-Smith"]) expect(hasHiddenChars(s), s).toBe(false);
  });
});

describe('input at the API', () => {
  const { srv, manager } = managerForFile();
  type Err = { error: { code: string; fields?: Record<string, string> } };

  it('when an address has a malformed %-escape, then 400 (not 500)', async () => {
    const r = await manager.json<Err>('GET', '/api/vehicles/%E0%A4%A');
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty('address');
  });

  it('when a body comes with a Content-Encoding it is not in, then a 4xx naming the problem (not 500)', async () => {
    const c = new ApiClient(srv.url);
    await c.login(DEMO.manager);
    for (const enc of ['gzip', 'x-made-up']) {
      const res = await c.raw('POST', '/api/depots', { body: JSON.stringify({ name: 'Encoded' }), headers: { 'content-encoding': enc } });
      expect(res.status, enc).toBeGreaterThanOrEqual(400);
      expect(res.status, enc).toBeLessThan(500);
    }
  });

  it('when a name holds NUL or a direction override, then 400 naming the field and nothing is stored', async () => {
    const r = await manager.json<Err>('POST', '/api/users', { name: 'Ada\u0000Null', email: 'ada.null@reboundry.test', role: 'driver', password: 'long-enough-pw' });
    expect(r.status).toBe(400);
    expect(r.body.error.fields?.name).toMatch(/control characters/);
    const d = await manager.json<Err>('POST', '/api/depots', { name: 'North \u202eDRAY', lat: 52.1, lon: -1.2 });
    expect(d.status).toBe(400);
    expect(d.body.error.fields?.name).toMatch(/direction marks/);
    expect((await manager.get<{ total: number }>('/api/users?q=ada.null')).body.total).toBe(0);
  });

  describe('profile surveys', () => {
    const profile = synthesizeProfile({ gdN0: 256e-6, lengthM: 400, dxM: 0.25, seed: 5 });
    const inMetres = formatProfileCsv({ dxM: 0.25, startM: 0, elevationsM: profile });
    const inMillimetres = ['distance_m,elevation_mm', ...inMetres.split('\n').filter((l) => /^\d/.test(l)).map((l) => {
      const [d, z] = l.split(',');
      return `${d},${(Number(z) * 1000).toFixed(3)}`;
    })].join('\n');
    const upload = (csv: string) => {
      const form = new FormData();
      form.set('file', new Blob([csv], { type: 'text/csv' }), 'survey.csv');
      return manager.raw('POST', '/api/routes/1/surveys?preview=true', { form });
    };

    it('when the elevation column is elevation_mm, then the same IRI comes out as for elevation_m (the command line reads both too)', async () => {
      expect(parseProfileCsv(inMillimetres).elevationsM[10]).toBeCloseTo(parseProfileCsv(inMetres).elevationsM[10], 12);
      const m = (await (await upload(inMetres)).json()) as { segments: { iri: number }[] };
      const res = await upload(inMillimetres);
      expect(res.status).toBe(200);
      const mm = (await res.json()) as { segments: { iri: number }[] };
      expect(mm.segments.length).toBeGreaterThan(0);
      mm.segments.forEach((s, k) => expect(s.iri).toBeCloseTo(m.segments[k].iri, 6));
    });

    it('when every elevation is 0, then 400 saying the profile is flat (not a physics 500)', async () => {
      const flat = ['distance_m,elevation_m', ...Array.from({ length: 1601 }, (_, i) => `${(i * 0.25).toFixed(2)},0`)].join('\n');
      const res = await upload(flat);
      expect(res.status).toBe(400);
      expect(((await res.json()) as Err & { error: { message: string } }).error.message).toMatch(/flat/);
    });
  });

  it('when a PNG photo or a PDF printout carries HTML after its end, then only the image or document is stored and served', async () => {
    const mech = new ApiClient(srv.url);
    await mech.login(DEMO.mechanic);
    const insp = (await mech.get<{ items: { id: number }[] }>('/api/inspections?assignee=none')).body.items[0];
    const send = (kind: string, buf: Buffer, name: string) => {
      const f = new FormData();
      f.append('kind', kind);
      f.append('file', new Blob([new Uint8Array(buf)]), name);
      return mech.raw('POST', `/api/inspections/${insp.id}/attachments`, { form: f });
    };
    for (const [kind, buf, name] of [['photo', PNG, 'lane.png'], ['printout', PDF, 'lane.pdf']] as const) {
      const res = await send(kind, Buffer.concat([buf, HTML]), name);
      expect(res.status, name).toBe(201);
      const body = (await res.json()) as { url: string; sizeBytes: number };
      expect(body.sizeBytes).toBe(buf.length);
      const served = Buffer.from(await (await mech.raw('GET', body.url)).arrayBuffer());
      expect(served.equals(buf), name).toBe(true);
    }
    const cut = await send('photo', PNG.subarray(0, 30), 'cut.png');
    expect(cut.status).toBe(400);
  });
});
