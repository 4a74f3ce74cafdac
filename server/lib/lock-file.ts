/**
 * A lock file for work that one process of this machine at a time may do (the SQLite file's
 * migrations): created exclusively, holding the holder's process id, removed when the work ends.
 * One whose process has died is taken over, so a crash never leaves the work locked.
 */
import fs from 'node:fs';

/** Whether a process of this machine is running (signal 0 only checks). */
export function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Seconds after which a lock file that names no process yet (its writer died between creating and writing it) counts as left behind. */
const UNNAMED_LOCK_STALE_S = 10;

/** Runs `fn` holding the lock file `lock`, waiting (polling every 100 ms) while a live process holds it. */
export async function withLockFile<T>(lock: string, fn: () => Promise<T>): Promise<T> {
  for (;;) {
    try {
      fs.writeFileSync(lock, String(process.pid), { flag: 'wx' });
      break;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    }
    let holder = NaN;
    let ageS = 0;
    try {
      holder = Number(fs.readFileSync(lock, 'utf8'));
      ageS = (Date.now() - fs.statSync(lock).mtimeMs) / 1000;
    } catch {
      continue; // released meanwhile
    }
    const leftBehind = Number.isInteger(holder) && holder > 0 ? !processAlive(holder) : ageS > UNNAMED_LOCK_STALE_S;
    if (leftBehind) fs.rmSync(lock, { force: true });
    else await new Promise((r) => setTimeout(r, 100));
  }
  try {
    return await fn();
  } finally {
    fs.rmSync(lock, { force: true });
  }
}
