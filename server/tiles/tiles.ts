/**
 * The offline base layer: plain paper-coloured 256 px tiles with a faint graticule (lines of
 * latitude and longitude), drawn in code and encoded as PNG with node:zlib. No network, no
 * map data: routes and depots drawn on top carry the meaning.
 */
import type { Express } from 'express';
import zlib from 'node:zlib';

const SIZE = 256;
/** The paper colour of the base tiles (the client draws roads to stand out on it: web/src/lib/roughness.ts). */
export const PAPER = [0xf3, 0xf0, 0xe8];
const MINOR = [0xe4, 0xdf, 0xd3];
const MAJOR = [0xd6, 0xcf, 0xbf];

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(td));
  return Buffer.concat([len, td, crc]);
}

/** Encodes 8-bit RGB pixels (row-major, 3 bytes each) as a PNG. */
export function encodePng(width: number, height: number, rgb: Uint8Array): Buffer {
  const raw = Buffer.alloc((width * 3 + 1) * height);
  for (let y = 0; y < height; y++) {
    raw[y * (width * 3 + 1)] = 0; // filter: none
    Buffer.from(rgb.buffer, rgb.byteOffset + y * width * 3, width * 3).copy(raw, y * (width * 3 + 1) + 1);
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type RGB
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', zlib.deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

const NICE = [90, 45, 30, 15, 10, 5, 2, 1, 0.5, 0.25, 0.1, 0.05, 0.02, 0.01, 0.005, 0.002, 0.001, 0.0005, 0.0002, 0.0001];

/** Graticule spacing [degrees] giving a line roughly every `px` pixels at zoom z. */
function step(z: number, px: number): number {
  const degPerPx = 360 / (SIZE * 2 ** z);
  const want = degPerPx * px;
  return NICE.find((s) => s <= want) ?? NICE[NICE.length - 1];
}

const lonOf = (z: number, xPx: number) => (xPx / (SIZE * 2 ** z)) * 360 - 180;
const latOf = (z: number, yPx: number) => {
  const n = Math.PI - (2 * Math.PI * yPx) / (SIZE * 2 ** z);
  return (180 / Math.PI) * Math.atan(Math.sinh(n));
};

/** One base-layer tile as PNG. */
export function renderTile(z: number, x: number, y: number): Buffer {
  const rgb = new Uint8Array(SIZE * SIZE * 3);
  const minor = step(z, 64);
  const major = step(z, 256);
  const colLine = new Uint8Array(SIZE);
  const rowLine = new Uint8Array(SIZE);
  const crosses = (a: number, b: number, s: number) => Math.floor(a / s) !== Math.floor(b / s);
  for (let i = 0; i < SIZE; i++) {
    const l0 = lonOf(z, x * SIZE + i);
    const l1 = lonOf(z, x * SIZE + i + 1);
    colLine[i] = crosses(l0, l1, major) ? 2 : crosses(l0, l1, minor) ? 1 : 0;
    const a0 = latOf(z, y * SIZE + i);
    const a1 = latOf(z, y * SIZE + i + 1);
    rowLine[i] = crosses(a1, a0, major) ? 2 : crosses(a1, a0, minor) ? 1 : 0;
  }
  for (let py = 0; py < SIZE; py++) {
    for (let px = 0; px < SIZE; px++) {
      const k = Math.max(colLine[px], rowLine[py]);
      const c = k === 2 ? MAJOR : k === 1 ? MINOR : PAPER;
      const o = (py * SIZE + px) * 3;
      rgb[o] = c[0];
      rgb[o + 1] = c[1];
      rgb[o + 2] = c[2];
    }
  }
  return encodePng(SIZE, SIZE, rgb);
}

const cache = new Map<string, Buffer>();

/** Serves `/tiles/{z}/{x}/{y}.png` (public: the tiles hold no data). */
export function registerTiles(app: Express) {
  app.get('/tiles/:z/:x/:file', (req, res) => {
    const z = Number(req.params.z);
    const x = Number(req.params.x);
    const m = /^(\d+)\.png$/.exec(req.params.file);
    const y = m ? Number(m[1]) : NaN;
    if (!Number.isInteger(z) || z < 0 || z > 22 || !Number.isInteger(x) || !Number.isInteger(y) || x < 0 || y < 0 || x >= 2 ** z || y >= 2 ** z) {
      res.status(404).json({ error: { code: 'not_found', message: 'No such tile.' } });
      return;
    }
    const key = `${z}/${x}/${y}`;
    let png = cache.get(key);
    if (!png) {
      png = renderTile(z, x, y);
      cache.set(key, png);
      if (cache.size > 2000) cache.delete(cache.keys().next().value!);
    }
    res.setHeader('content-type', 'image/png');
    res.setHeader('cache-control', 'public, max-age=86400');
    res.send(png);
  });
}
