import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { User, type Role } from '../db/models';
import { likeOp, sqlFor } from '../db/dialect';
import type { SessionUser } from '../http/access';

export interface UserRow extends SessionUser {
  depotId: number | null;
  createdAt: string;
}

const toRow = (u: User): UserRow => ({
  id: u.id,
  name: u.name,
  email: u.email,
  role: u.role,
  active: u.active,
  mustChangePassword: u.mustChangePassword,
  depotId: u.depotId ?? null,
  createdAt: u.createdAt.toISOString(),
});

export const userRepository = {
  async findByEmailWithHash(email: string) {
    const u = await User.findOne({ where: { email: email.toLowerCase() } });
    return u ? { ...toRow(u), passwordHash: u.passwordHash } : null;
  },
  async findById(id: number, transaction?: Transaction) {
    const u = await User.findByPk(id, { transaction });
    return u ? toRow(u) : null;
  },
  async findHash(id: number) {
    const u = await User.findByPk(id, { attributes: ['passwordHash'] });
    return u?.passwordHash ?? null;
  },
  async list(q: {
    offset: number;
    pageSize: number;
    sort: { field: string; dir: 'ASC' | 'DESC' };
    q?: string;
    role?: Role;
    active?: boolean;
  }) {
    const where: WhereOptions = {};
    const and: WhereOptions[] = [];
    if (q.q) {
      const like = likeOp(User.sequelize!);
      and.push({ [Op.or]: [{ name: { [like]: `%${q.q}%` } }, { email: { [like]: `%${q.q}%` } }] });
    }
    if (q.role) and.push({ role: q.role });
    if (q.active !== undefined) and.push({ active: q.active });
    if (and.length) Object.assign(where, { [Op.and]: and });
    const { rows, count } = await User.findAndCountAll({
      where,
      order: [[q.sort.field, q.sort.dir], ['id', 'ASC']],
      offset: q.offset,
      limit: q.pageSize,
    });
    return { items: rows.map(toRow), total: count };
  },
  async create(data: { name: string; email: string; role: Role; passwordHash: string; depotId?: number | null; mustChangePassword?: boolean }) {
    const u = await User.create({ ...data, email: data.email.toLowerCase(), depotId: data.depotId ?? null });
    return toRow(u);
  },
  async update(
    id: number,
    patch: Partial<{ name: string; role: Role; active: boolean; depotId: number | null; passwordHash: string; mustChangePassword: boolean }>,
    transaction?: Transaction,
  ) {
    const u = await User.findByPk(id, { transaction });
    if (!u) return null;
    await u.update(patch, { transaction });
    return toRow(u);
  },
  async countActiveManagers(transaction?: Transaction) {
    return User.count({ where: { role: 'manager', active: true }, transaction });
  },
  /** Runs `fn` in one IMMEDIATE transaction (server/db/index.ts): a second writer waits for it. */
  inTransaction<T>(fn: (t: Transaction) => Promise<T>) {
    return User.sequelize!.transaction(fn);
  },
  /**
   * Ends every stored session of user `id` except `keepSid` (the caller's own, when they changed
   * their own password). Sessions are rows of `sessions` whose JSON data names the user.
   */
  async endSessions(id: number, keepSid: string | null = null) {
    await User.sequelize!.query(
      `DELETE FROM sessions WHERE ${sqlFor(User.sequelize!).jsonFieldIs('data', ['passport', 'user'])} AND (? IS NULL OR sid != ?)`,
      { replacements: [id, keepSid, keepSid] },
    );
  },
};
