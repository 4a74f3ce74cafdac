/**
 * Photos and test-lane printouts: the type is read from the content's first bytes (the file
 * name and the browser's stated type are not trusted), names with path tricks are refused, and
 * files are stored under DATA_DIR/attachments with random names.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { AppError } from '../errors';
import { contentLength, type FileKind } from '../http/file-end';

export const ATTACHMENT_KINDS = ['photo', 'printout'] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

const TYPES = [
  { mime: 'image/jpeg', ext: 'jpg', image: true, test: (b: Buffer) => b.length > 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff },
  { mime: 'image/png', ext: 'png', image: true, test: (b: Buffer) => b.length > 8 && b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) },
  { mime: 'image/webp', ext: 'webp', image: true, test: (b: Buffer) => b.length > 12 && b.toString('latin1', 0, 4) === 'RIFF' && b.toString('latin1', 8, 12) === 'WEBP' },
  { mime: 'application/pdf', ext: 'pdf', image: false, test: (b: Buffer) => b.length > 5 && b.toString('latin1', 0, 5) === '%PDF-' },
];

/** The content type from the first bytes, or null when it is none of JPEG, PNG, WebP, PDF. */
export function sniffType(buf: Buffer) {
  return TYPES.find((t) => t.test(buf)) ?? null;
}

/** Refuses names that try to reach outside a folder or hide control characters. */
export function checkOriginalName(name: string): string {
  // eslint-disable-next-line no-control-regex
  if (!name || name.length > 200 || /[/\\]|\.\.|[\x00-\x1f]/.test(name)) {
    throw AppError.badRequest('The file name is not allowed: use a plain name without folders or "..".', { file: 'name must be a plain file name (no /, \\ or ..)' });
  }
  return name;
}

export const attachmentDir = (dataDir: string) => path.join(dataDir, 'attachments');

/** Absolute path of a stored attachment, refusing anything that is not a plain stored name. */
export function attachmentPath(dataDir: string, storedName: string): string {
  if (!/^[a-f0-9]{32}\.(jpg|png|webp|pdf)$/.test(storedName)) throw AppError.notFound('The attachment file');
  const dir = attachmentDir(dataDir);
  const abs = path.resolve(dir, storedName);
  if (path.dirname(abs) !== path.resolve(dir)) throw AppError.notFound('The attachment file');
  return abs;
}

/** Checks the upload and writes it under a random name; returns what to store. */
export function storeAttachment(dataDir: string, kind: AttachmentKind, file: { buffer: Buffer; originalname: string }) {
  const originalName = checkOriginalName(file.originalname);
  const t = sniffType(file.buffer);
  if (!t) throw AppError.badRequest('Only photos (JPEG, PNG, WebP) and PDF printouts can be attached; this file is neither.', { file: 'must be a JPEG, PNG or WebP image, or a PDF' });
  if (kind === 'photo' && !t.image) throw AppError.badRequest('A photo must be an image (JPEG, PNG or WebP).', { file: 'a photo must be a JPEG, PNG or WebP image' });
  // only the image or document itself: anything appended after its end is dropped (server/http/file-end.ts)
  const end = contentLength(t.mime as FileKind, file.buffer);
  if (end === null) throw AppError.badRequest('The file is damaged: it does not reach its end.', { file: `is a damaged or cut-off ${t.image ? 'image' : 'PDF'}` });
  const own = file.buffer.subarray(0, end);
  const storedName = `${crypto.randomBytes(16).toString('hex')}.${t.ext}`;
  fs.mkdirSync(attachmentDir(dataDir), { recursive: true });
  fs.writeFileSync(attachmentPath(dataDir, storedName), own, { flag: 'wx' });
  return { storedName, mimeType: t.mime, sizeBytes: own.length, originalName };
}
