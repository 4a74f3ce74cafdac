import { describe, expect, it, onTestFinished } from 'vitest';
import { queueDigests, registerDigestSection } from '../../server/mail/service';
import { serverForFile, TEST_NOW } from '../support/server';

const srv = serverForFile();

describe('two digests on one day', () => {
  it('when a second digest on the same day covers different items, then it is queued too (the key holds a hash of the items), and the same items again queue nothing', async () => {
    // a section that offers the items of `batch`, then nothing once they are marked told
    let batch: string[] = [];
    const remove = registerDigestSection({
      id: 'planted',
      heading: 'Planted items',
      pref: 'notifyInspectionDigest',
      async collect() {
        return batch.map((k) => ({ key: k, title: `Item ${k}`, lines: [], link: '/', depotId: null }));
      },
      async markNotified() {
        batch = [];
      },
    });
    onTestFinished(remove);
    const ctx = { sequelize: srv.db.sequelize, publicUrl: 'http://localhost', asOf: '2026-11-30', now: TEST_NOW, runId: null };
    const digests = async () => Number(((await srv.db.sequelize.query(`SELECT COUNT(*) AS n FROM mail_messages WHERE kind = 'digest'`, { plain: true })) as { n: number }).n);
    const before = await digests();
    const managers = Number(((await srv.db.sequelize.query(`SELECT COUNT(*) AS n FROM users WHERE role = 'manager' AND active = TRUE AND notify_inspection_digest = TRUE`, { plain: true })) as { n: number }).n);
    batch = ['a1', 'a2'];
    await queueDigests(ctx);
    const afterFirst = await digests();
    expect(afterFirst).toBe(before + managers);
    batch = ['b1'];
    await queueDigests(ctx);
    expect(await digests()).toBe(afterFirst + managers);
    // nothing new to tell: nothing queued
    await queueDigests(ctx);
    expect(await digests()).toBe(afterFirst + managers);
  });
});
