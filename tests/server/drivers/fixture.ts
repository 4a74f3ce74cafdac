import { beforeAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { lateBound, serverForFile } from '../../support/server';
import { ApiClient, DEMO } from '../../support/client';

/**
 * The drivers' API tests' own server with three people signed in: the demo manager, the demo
 * driver and another driver (`ids` holds the two drivers' user ids once signed in), and `q`, a
 * plain SELECT on the server's database.
 */
export function driversFixture() {
  const srv = serverForFile();
  const ids = { driver: 0, other: 0 };
  let clients: { manager: ApiClient; driver: ApiClient; other: ApiClient } | undefined;
  beforeAll(async () => {
    const c = { manager: new ApiClient(srv.url), driver: new ApiClient(srv.url), other: new ApiClient(srv.url) };
    await c.manager.login(DEMO.manager);
    ids.driver = (await c.driver.login(DEMO.driver)).body.user.id;
    ids.other = (await c.other.login('priya.nandakumar@reboundry.test')).body.user.id;
    clients = c;
  });
  const q = <T extends object>(sql: string, replacements: unknown[] = []) => srv.db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
  return {
    srv,
    q,
    ids,
    manager: lateBound(() => clients?.manager, 'the manager'),
    driver: lateBound(() => clients?.driver, 'the driver'),
    other: lateBound(() => clients?.other, 'the other driver'),
  };
}
