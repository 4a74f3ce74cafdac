import { startTestServer } from '../../support/server';
import { ApiClient, DEMO } from '../../support/client';
void (async () => {
  const srv = await startTestServer();
  const m = new ApiClient(srv.url); await m.login(DEMO.mechanic);
  for (const p of ['/api/auth/me', '/api/inspections?assignee=me&pageSize=50', '/api/vehicles?status=workshop&pageSize=50', '/api/workshop/options']) {
    const t = performance.now(); const r = await m.get<unknown>(p); console.log(p, r.status, (performance.now() - t).toFixed(0), 'ms', JSON.stringify(r.body).slice(0, 120));
  }
  await srv.stop(); process.exit(0);
})();
