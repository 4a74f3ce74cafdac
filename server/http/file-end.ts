/**
 * Where an uploaded image or PDF ends. Bytes after the end (HTML or a script appended to a valid
 * image, a "polyglot") are cut off before the file is stored, so what is served back is only
 * the image or document; a file whose structure does not reach an end is refused as damaged.
 *
 * - PNG: chunks (length, type, data, CRC) from byte 8 up to and including IEND;
 * - JPEG: marker segments up to start-of-scan, then entropy-coded data (0xFF is followed by 0x00
 *   or a restart marker inside it) up to end-of-image, FF D9, with further scans in between
 *   (progressive JPEG);
 * - WebP: the RIFF header's size (+ 8 bytes, padded to even);
 * - PDF: the last `%%EOF` marker and the line end after it (incremental updates add more).
 */
export type FileKind = 'image/png' | 'image/jpeg' | 'image/webp' | 'application/pdf';

/** The length of the file's own content, or null when it is damaged (no end found). */
export function contentLength(kind: FileKind, b: Buffer): number | null {
  switch (kind) {
    case 'image/png':
      return pngEnd(b);
    case 'image/jpeg':
      return jpegEnd(b);
    case 'image/webp': {
      if (b.length < 12) return null;
      const size = b.readUInt32LE(4) + 8;
      const end = size + (size % 2);
      return size <= b.length ? Math.min(end, b.length) : null;
    }
    case 'application/pdf': {
      const at = b.lastIndexOf('%%EOF', undefined, 'latin1');
      if (at < 0) return null;
      let end = at + 5;
      if (b[end] === 0x0d) end++;
      if (b[end] === 0x0a) end++;
      return end;
    }
  }
}

function pngEnd(b: Buffer): number | null {
  let i = 8;
  while (i + 12 <= b.length) {
    const len = b.readUInt32BE(i);
    const type = b.toString('latin1', i + 4, i + 8);
    const next = i + 12 + len;
    if (next > b.length) return null;
    if (type === 'IEND') return next;
    i = next;
  }
  return null;
}

function jpegEnd(b: Buffer): number | null {
  let i = 2; // after SOI
  while (i + 4 <= b.length) {
    if (b[i] !== 0xff) return null;
    const marker = b[i + 1];
    if (marker === 0xff) {
      i++; // fill byte
      continue;
    }
    if (marker === 0xd9) return i + 2;
    if (marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
      i += 2;
      continue;
    }
    const len = b.readUInt16BE(i + 2);
    if (len < 2) return null;
    i += 2 + len;
    if (marker === 0xda) {
      // entropy-coded data: runs to the next marker that is not a stuffed 0x00 or a restart
      while (i + 1 < b.length) {
        if (b[i] === 0xff && b[i + 1] !== 0x00 && !(b[i + 1] >= 0xd0 && b[i + 1] <= 0xd7) && b[i + 1] !== 0xff) break;
        i++;
      }
      if (i + 1 >= b.length) return null;
    }
  }
  return null;
}
