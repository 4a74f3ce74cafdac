// The offline base tiles as PNG files, checked against the PNG specification (W3C PNG, 2nd ed.,
// §5): the signature, the IHDR layout, chunk CRCs, and the fixed 12-byte IEND chunk whose CRC
// is 0xAE426082 (a constant of the format, the same in every PNG file).
import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { encodePng, renderTile } from '../../../server/tiles/tiles';

/** Independent CRC-32 (ISO 3309 / ITU-T V.42 polynomial, bit by bit, as PNG §5.5 defines it). */
function crcBitwise(buf: Buffer): number {
  let c = 0xffffffff;
  for (const byte of buf) {
    c ^= byte;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

function chunks(png: Buffer) {
  const out: { type: string; data: Buffer; crc: number; crcInput: Buffer }[] = [];
  let at = 8;
  while (at < png.length) {
    const len = png.readUInt32BE(at);
    const type = png.toString('ascii', at + 4, at + 8);
    out.push({ type, data: png.subarray(at + 8, at + 8 + len), crc: png.readUInt32BE(at + 8 + len), crcInput: png.subarray(at + 4, at + 8 + len) });
    at += 12 + len;
  }
  return out;
}

describe('base tiles are well-formed PNG files', () => {
  it('a 2×1 image: signature, IHDR, pixels that inflate back, every chunk CRC right, IEND as the format fixes it', () => {
    const png = encodePng(2, 1, Uint8Array.from([255, 0, 0, 0, 0, 255]));
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const cs = chunks(png);
    expect(cs.map((c) => c.type)).toEqual(['IHDR', 'IDAT', 'IEND']);
    for (const c of cs) expect(c.crc).toBe(crcBitwise(c.crcInput));
    const ihdr = cs[0].data;
    expect([ihdr.readUInt32BE(0), ihdr.readUInt32BE(4), ihdr[8], ihdr[9]]).toEqual([2, 1, 8, 2]); // 8-bit truecolour
    expect([...zlib.inflateSync(cs[1].data)]).toEqual([0, 255, 0, 0, 0, 0, 255]);
    expect([...png.subarray(png.length - 12)]).toEqual([0, 0, 0, 0, 0x49, 0x45, 0x4e, 0x44, 0xae, 0x42, 0x60, 0x82]);
  });

  it('a rendered 256 px tile inflates to 256 rows of 769 bytes', () => {
    const cs = chunks(renderTile(10, 507, 337));
    for (const c of cs) expect(c.crc).toBe(crcBitwise(c.crcInput));
    expect(zlib.inflateSync(cs.find((c) => c.type === 'IDAT')!.data).length).toBe(256 * (256 * 3 + 1));
  });
});
