import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { Page, Request } from 'playwright-core';
import { type ViewportName } from '../support/browser';
import { axeViolations } from '../support/axe';
import { DEMO, goViaMenu, settled, signedInPage, serverAndBrowserForFile } from './helpers';
import { menuFor } from '../../web/src/app/navigation';
import type { Role } from '../../web/src/lib/roles';

const { server, browser } = serverAndBrowserForFile();

/**
 * Counts the page's requests in flight; `quiet(ms)` waits until none has been for `ms`. Unlike
 * playwright's `networkidle` (half a second after a load), it also works after a move within the
 * app, where the page does not load again but fetches a route's code and data.
 */
function requestsInFlight(page: Page) {
  // the requests themselves, not a count: one that started before (signing in) ends unseen
  const inFlight = new Set<Request>();
  let lastChange = Date.now();
  page.on('request', (r) => {
    inFlight.add(r);
    lastChange = Date.now();
  });
  const ended = (r: Request) => {
    inFlight.delete(r);
    lastChange = Date.now();
  };
  page.on('requestfinished', ended);
  page.on('requestfailed', ended);
  return {
    async quiet(ms: number) {
      await expect.poll(() => inFlight.size === 0 && Date.now() - lastChange >= ms, { interval: 25 }).toBe(true);
    },
  };
}

/**
 * Opens each page in turn and returns axe's findings, each prefixed with its address. The first
 * page loads by its address; the next ones open through the app's router as a menu link would
 * (history entry and popstate), and each is checked once its requests have ended, its heading
 * shows and its transitions have run.
 */
async function checkAll(page: Page, paths: string[]): Promise<string[]> {
  const requests = requestsInFlight(page);
  const found: string[] = [];
  for (const [i, path] of paths.entries()) {
    if (i === 0) await page.goto(`${server.url}${path}`);
    else
      await page.evaluate((to) => {
        history.pushState(null, '', to);
        dispatchEvent(new PopStateEvent('popstate'));
      }, path);
    await requests.quiet(150);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    await settled(page);
    found.push(...(await axeViolations(page)).map((v) => `${path}: ${v}`));
  }
  return found;
}

async function one<T extends object>(sql: string, replacements: unknown[] = []): Promise<T> {
  const rows = await server.db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
  return rows[0];
}

const ROLES: { role: Role; email: string; size: ViewportName }[] = [
  { role: 'manager', email: DEMO.manager, size: 'desktop' },
  { role: 'mechanic', email: DEMO.mechanic, size: 'tablet' },
  { role: 'driver', email: DEMO.driver, size: 'phone' },
];

describe('accessibility of every page, for each role (axe-core)', () => {
  for (const { role, email, size } of ROLES) {
    it(`when a ${role} opens each of their pages on a ${size}, then axe finds no violation`, async () => {
      const { context, page } = await signedInPage(browser, server.url, email, size);
      const paths = menuFor(role).map((p) => p.path);
      if (role !== 'driver') {
        const v = await one<{ id: number }>('SELECT id FROM vehicles ORDER BY id LIMIT 1');
        const r = await one<{ id: number }>('SELECT id FROM routes ORDER BY id LIMIT 1');
        const i = await one<{ id: number }>(
          `SELECT i.id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN users u ON u.email = ? WHERE i.status IN ('scheduled','due','overdue') AND (u.role = 'manager' OR u.depot_id = v.depot_id) ORDER BY i.id LIMIT 1`,
          [email],
        );
        paths.push(`/vehicles/${v.id}`, `/routes/${r.id}`, `/inspections/${i.id}`);
      } else {
        const r = await one<{ id: number }>('SELECT id FROM routes ORDER BY id LIMIT 1');
        paths.push(`/routes/${r.id}`, '/map');
      }
      if (role === 'manager') {
        const s = await one<{ id: number }>('SELECT id FROM suspension_specs ORDER BY id LIMIT 1');
        paths.push(`/specs/${s.id}/edit`, '/specs/new');
      }
      const found = await checkAll(page, [...new Set(paths)]);

      expect(found, found.join('\n')).toEqual([]);
      await context.close();
    }, 300_000);
  }

  it('when a page carries an unlabelled image, a nameless button, faint text and a field without a label, then the check names each (so a clean sweep means something)', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.getByRole('heading', { level: 1, name: 'Due inspections' }).waitFor();
    await page.evaluate(() => {
      const planted = document.createElement('section');
      planted.setAttribute('aria-label', 'planted faults');
      // image without alt text, icon button without a name, #aaa on white (2.3:1), input without label
      planted.innerHTML =
        '<img src="/favicon.svg" width="16" height="16"><button type="button"><svg width="10" height="10"></svg></button>' +
        '<p style="color:#aaa;background:#fff">Faint text</p><input type="text">';
      document.querySelector('main')!.append(planted);
    });
    const rules = (await axeViolations(page)).map((v) => v.split(' ')[0]);
    expect(rules).toEqual(expect.arrayContaining(['image-alt', 'button-name', 'color-contrast', 'label']));
    await context.close();
  });

  it('when a manager moves to another page through the menu, then focus lands on that page’s heading', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.getByRole('heading', { level: 1, name: 'Due inspections' }).waitFor();
    await goViaMenu(page, 'Vehicles');
    await page.getByRole('heading', { level: 1, name: 'Vehicles' }).waitFor();
    await expect.poll(() => page.evaluate(() => (document.activeElement?.tagName ?? '') + ' ' + (document.activeElement?.textContent ?? ''))).toBe('H1 Vehicles');
    await context.close();
  });
});

