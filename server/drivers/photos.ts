/** Ride-report photos: type detected from the bytes, stored under DATA_DIR with random names. */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { AppError } from '../errors';
import { contentLength, type FileKind } from '../http/file-end';

/** Largest photo accepted [bytes]. */
export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;
const DIR = 'ride-photos';

const TYPES: { type: string; ext: string; test: (b: Buffer) => boolean }[] = [
  { type: 'image/jpeg', ext: 'jpg', test: (b) => b.length > 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff },
  { type: 'image/png', ext: 'png', test: (b) => b.length > 8 && b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) },
  { type: 'image/webp', ext: 'webp', test: (b) => b.length > 12 && b.toString('ascii', 0, 4) === 'RIFF' && b.toString('ascii', 8, 12) === 'WEBP' },
];

/** The image type of the bytes (JPEG, PNG or WebP), or a 400 naming the `photo` field. */
export function photoType(buf: Buffer): { type: string; ext: string } {
  const t = TYPES.find((x) => x.test(buf));
  if (!t) throw AppError.badRequest('The photo is not a JPEG, PNG or WebP image.', { photo: 'must be a JPEG, PNG or WebP image (checked from the file itself, not its name)' });
  if (contentLength(t.type as FileKind, buf) === null) throw AppError.badRequest('The photo is damaged: the image does not reach its end.', { photo: 'is a damaged or cut-off image' });
  return { type: t.type, ext: t.ext };
}

/** Stores the photo; returns its path relative to `dataDir`. */
export function storePhoto(dataDir: string, buf: Buffer, ext: string): string {
  const rel = path.join(DIR, `${crypto.randomBytes(16).toString('hex')}.${ext}`);
  fs.mkdirSync(path.join(dataDir, DIR), { recursive: true });
  // only the image itself: anything appended after its end is dropped (server/http/file-end.ts)
  const kind = TYPES.find((t) => t.ext === ext)!.type as FileKind;
  fs.writeFileSync(path.join(dataDir, rel), buf.subarray(0, contentLength(kind, buf) ?? buf.length), { flag: 'wx' });
  return rel;
}

export function removePhoto(dataDir: string, rel: string | null) {
  if (!rel) return;
  try {
    fs.rmSync(path.join(dataDir, rel), { force: true });
  } catch {
    /* already gone */
  }
}

/** Absolute path of a stored photo, refusing anything outside the photo folder. */
export function photoFile(dataDir: string, rel: string): string {
  const root = path.resolve(dataDir, DIR);
  const abs = path.resolve(dataDir, rel);
  if (!abs.startsWith(root + path.sep)) throw AppError.notFound('The photo');
  return abs;
}
