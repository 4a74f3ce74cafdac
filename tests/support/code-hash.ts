import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/**
 * A short hash of every source file (.ts, .mjs, .json) below these folders, walked in name order,
 * and of `salt`: a file seeded or computed by other code, or for another day, is never reused.
 */
export function sourceHash(dirs: string[], salt: string): string {
  const h = crypto.createHash('sha256');
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (/\.(ts|mjs|json)$/.test(e.name)) h.update(p).update(fs.readFileSync(p));
    }
  };
  for (const dir of dirs) walk(path.resolve(dir));
  h.update(salt);
  return h.digest('hex').slice(0, 16);
}
