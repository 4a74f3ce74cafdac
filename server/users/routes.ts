import type { Router } from 'express';
import { z } from 'zod';
import { ROLES, ROLE_WORDS, createUserBody, updateUserBody } from '../contracts/users';
import { allow, currentUser } from '../http/access';
import { NO_PAGING, idParam, listQuery, paging, parse, queryBool, sortOf } from '../http/validate';
import { sendCsv, type CsvColumn } from '../http/csv-export';
import { localDay } from '../lib/days';
import { userService } from './service';

const listSchema = listQuery(['name', 'email', 'role', 'createdAt'], 'name', {
  q: z.string().trim().max(100).optional(),
  role: z.enum(ROLES, { message: `must be one of ${ROLES.join(', ')}` }).optional(),
  active: queryBool.optional(),
});

type UserSort = 'name' | 'email' | 'role' | 'createdAt';
type UserItem = Awaited<ReturnType<typeof userService.list>>['items'][number];

/** The people table's columns, in its order and words; `Added` is the fleet's local day. */
const userCsv = (timeZone: string): CsvColumn<UserItem>[] => [
  { header: 'Name', value: (u) => u.name },
  { header: 'E-mail', value: (u) => u.email },
  { header: 'Role', value: (u) => ROLE_WORDS[u.role] ?? u.role },
  { header: 'Sign-in', value: (u) => (u.active ? (u.mustChangePassword ? 'Active, temporary password' : 'Active') : 'Deactivated') },
  { header: 'Added', value: (u) => localDay(new Date(u.createdAt), timeZone) },
];

export { PASSWORD_MAX_BYTES, PASSWORD_MIN_CHARS, passwordSchema } from '../contracts/users';

/** `now` and `timeZone` date the CSV export (its file name and the days people were added; default UTC). */
export function registerUserRoutes(r: Router, deps: { now?: () => Date; timeZone?: string } = {}) {
  const timeZone = deps.timeZone ?? 'UTC';
  r.get('/users', allow('manager'), async (req, res) => {
    const q = parse(listSchema, req.query, 'query');
    res.json(await userService.list({ ...q, ...paging<UserSort>(q) }));
  });

  r.get('/users/export', allow('manager'), async (req, res) => {
    const q = parse(listSchema.omit(NO_PAGING), req.query, 'query');
    const sort = sortOf<UserSort>(q);
    await sendCsv(res, {
      name: 'people',
      day: localDay((deps.now ?? (() => new Date()))(), timeZone),
      columns: userCsv(timeZone),
      fetch: async (offset, pageSize) => (await userService.list({ ...q, sort, offset, pageSize })).items,
    });
  });

  r.post('/users', allow('manager'), async (req, res) => {
    const body = parse(createUserBody, req.body, 'body');
    res.status(201).json({ user: await userService.create(body) });
  });

  r.patch('/users/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(updateUserBody, req.body, 'body');
    res.json({ user: await userService.update(currentUser(req).id, id, body) });
  });
}
