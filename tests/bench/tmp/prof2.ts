import { startChild, stopChild, managerCookie, drive } from '../server/load';
void (async () => {
  const { url, child } = await startChild();
  const cookie = await managerCookie(url);
  for (const p of (process.env.PATHS ?? '/api/health').split(',')) {
    await drive(url, cookie, [p], 4, 1);
    const r = await drive(url, cookie, [p], 8, 3);
    const anon = await drive(url, '', [p], 8, 2);
    console.log(p.padEnd(36), 'signed in', r.rps.toFixed(0), 'req/s p50', r.p50.toFixed(1), '| anonymous', anon.rps.toFixed(0), 'req/s');
  }
  stopChild(child);
  process.exit(0);
})();
