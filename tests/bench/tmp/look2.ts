import { startTestServer } from '../../support/server';
import { launchBrowser, newContext } from '../../support/browser';
import { signIn, DEMO } from '../../e2e/helpers';
void (async () => {
  const srv = await startTestServer({ auth: { loginLimitPerPair: 1e6, loginLimitPerAddress: 1e6 } });
  const browser = await launchBrowser();
  const ctx = await newContext(browser, 'phone', srv.url);
  const m = await ctx.newPage();
  m.on('console', (msg) => console.log('console', msg.type(), msg.text().slice(0, 200)));
  m.on('response', (r) => { if (r.url().includes('/api/')) console.log('resp', r.status(), r.url().replace(srv.url, '')); });
  m.on('requestfailed', (r) => console.log('failed', r.url(), r.failure()?.errorText));
  await signIn(m, srv.url, DEMO.mechanic);
  await m.goto(srv.url + '/workshop');
  await m.waitForTimeout(4000);
  console.log((await m.innerText('main')).slice(0, 400));
  await browser.close(); await srv.stop(); process.exit(0);
})().catch((e) => { console.error(e); process.exit(1); });
