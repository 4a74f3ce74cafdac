/**
 * One area's routes in a bare Express app, for tests that exercise a route file without booting
 * the whole app (no sessions, CSRF or sign-in): the signed-in user is whatever the request's
 * `x-test-user` header holds (JSON of a SessionUser), none without it. Errors end in the app's
 * own error handler, so the answers have the API's error form.
 */
import express, { Router } from 'express';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { errorHandler } from '../../server/errors';
import type { Logger } from '../../server/logger';
import type { SessionUser } from '../../server/http/access';

const quiet: Logger = { debug() {}, info() {}, warn() {}, error() {} } as unknown as Logger;

export interface MiniApp {
  url: string;
  /** fetch on the app with `user` signed in (none when omitted). */
  call(method: string, path: string, o?: { user?: SessionUser; json?: unknown; form?: FormData }): Promise<Response>;
  close(): Promise<void>;
}

export async function miniApp(register: (r: Router) => void): Promise<MiniApp> {
  const app = express();
  app.use(express.json());
  app.use((req, _res, next) => {
    const u = req.header('x-test-user');
    if (u) req.user = JSON.parse(u) as SessionUser;
    next();
  });
  const api = Router();
  register(api);
  app.use('/api', api);
  app.use(errorHandler(quiet, false));
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    call(method, path, o = {}) {
      const headers: Record<string, string> = {};
      if (o.user) headers['x-test-user'] = JSON.stringify(o.user);
      let body: string | FormData | undefined;
      if (o.json !== undefined) {
        headers['content-type'] = 'application/json';
        body = JSON.stringify(o.json);
      } else if (o.form) body = o.form;
      return fetch(url + path, { method, headers, body });
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections?.();
        server.close(() => resolve());
      }),
  };
}

/** A signed-in user of a role, as the session would hold them. */
export const asUser = (id: number, role: SessionUser['role']): SessionUser => ({ id, name: `User ${id}`, email: `user${id}@reboundry.test`, role, active: true, mustChangePassword: false });
