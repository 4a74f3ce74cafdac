import { startTestServer } from '../../support/server';
import { ApiClient, DEMO } from '../../support/client';
void (async () => {
const srv = await startTestServer({ auth: { loginLimitPerPair: 1e6, loginLimitPerAddress: 1e6 } });
const m = new ApiClient(srv.url); await m.login(DEMO.manager);
const vehicles = (await m.get<{ items: { id: number }[] }>('/api/vehicles?pageSize=10')).body.items.map((v) => v.id);
const paths = ['/api/health', '/api/auth/me', '/api/vehicles?pageSize=25', `/api/vehicles/${vehicles[0]}`, `/api/vehicles/${vehicles[1]}/wear`, '/api/inspections/due', '/api/map/segments', '/api/routes/1', '/api/trips?pageSize=25', `/api/vehicles/${vehicles[0]}/workshop`];
for (const p of paths) {
  for (let i = 0; i < 3; i++) await m.get(p);
  const t = performance.now(); const n = 20;
  let bytes = 0;
  for (let i = 0; i < n; i++) { const r = await m.get<unknown>(p); bytes = JSON.stringify(r.body).length; }
  console.log(p.padEnd(40), ((performance.now() - t) / n).toFixed(1), 'ms', bytes, 'B');
}
await srv.stop(); process.exit(0);

})();
