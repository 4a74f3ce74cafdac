import os from 'node:os';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { holderIsGone } from '../../server/jobs/repository';

describe('a lock holder that no longer exists', () => {
  it('when the holder was a process on this host that has ended, then it is gone; a live one, this one, another host or an odd form are not', () => {
    const ended = spawnSync(process.execPath, ['-e', '0']).pid;
    expect(holderIsGone(`${os.hostname()}:${ended}`)).toBe(true);
    expect(holderIsGone(`${os.hostname()}:${process.pid}`)).toBe(false);
    expect(holderIsGone(`${os.hostname()}:${process.ppid}`)).toBe(false);
    expect(holderIsGone(`another-host.example:${ended}`)).toBe(false);
    expect(holderIsGone('other')).toBe(false);
    expect(holderIsGone(null)).toBe(false);
  });
});
