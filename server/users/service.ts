import bcrypt from 'bcryptjs';
import { AppError } from '../errors';
import type { Role } from '../db/models';
import { userRepository } from './repository';

/** bcrypt cost: 10 keeps sign-in near 60 ms on a small server (common practice: 10–12). */
export const BCRYPT_COST = 10;

export const hashPassword = (plain: string) => bcrypt.hash(plain, BCRYPT_COST);

export const userService = {
  list: userRepository.list,

  /** A new account. The manager chose its password and knows it, so it is temporary: the user picks their own at first sign-in. */
  async create(input: { name: string; email: string; role: Role; password: string; depotId?: number | null }) {
    const { password, ...fields } = input;
    const passwordHash = await hashPassword(password);
    return userRepository.create({ ...fields, passwordHash, mustChangePassword: true });
  },

  /**
   * A manager's change to an account. The last-active-manager check and the change run in one
   * IMMEDIATE transaction, so two concurrent changes cannot both pass the check and leave the
   * fleet without an active manager. A new `password` (a manager's reset) ends the user's sessions
   * and, for someone else's account, is temporary: that user must choose their own at next sign-in.
   */
  async update(actorId: number, id: number, patch: { name?: string; role?: Role; active?: boolean; depotId?: number | null; password?: string }) {
    const { password, ...fields } = patch;
    const passwordHash = password === undefined ? undefined : await hashPassword(password);
    const updated = await userRepository.inTransaction(async (t) => {
      const current = await userRepository.findById(id, t);
      if (!current) throw AppError.notFound('User');
      const losesManager =
        current.role === 'manager' && current.active && (fields.active === false || (fields.role && fields.role !== 'manager'));
      if (losesManager && (await userRepository.countActiveManagers(t)) <= 1) {
        throw AppError.conflict('This is the last active manager; make someone else a manager first.', {
          [fields.active === false ? 'active' : 'role']: 'would leave no active manager',
        });
      }
      if (id === actorId && fields.active === false) {
        throw AppError.conflict('You cannot deactivate your own account.', { active: 'is your own account' });
      }
      const row = await userRepository.update(
        id,
        passwordHash === undefined ? fields : { ...fields, passwordHash, mustChangePassword: id !== actorId },
        t,
      );
      if (!row) throw AppError.notFound('User');
      return row;
    });
    if (passwordHash !== undefined || fields.active === false) await userRepository.endSessions(id);
    return updated;
  },

  async verify(email: string, password: string) {
    const u = await userRepository.findByEmailWithHash(email);
    // Compare against a dummy hash when the account is unknown so timing does not reveal it.
    const ok = await bcrypt.compare(password, u?.passwordHash ?? (await dummyHash()));
    if (!u || !ok || !u.active) return null;
    const { passwordHash: _omit, ...user } = u;
    return user;
  },

  /**
   * Changes one's own password and ends one's other sessions (the one asking, `keepSid`, stays).
   * The password is then one's own, so a temporary one set by a manager is done with. The new one
   * must differ from the current one (compared with the stored hash, as sign-in would), or a
   * temporary password could simply be kept.
   */
  async changePassword(id: number, currentPassword: string, newPassword: string, keepSid: string) {
    const hash = await userRepository.findHash(id);
    if (!hash) throw AppError.notFound('User');
    if (!(await bcrypt.compare(currentPassword, hash))) {
      throw AppError.badRequest('The current password is not right.', { currentPassword: 'does not match' });
    }
    if (await bcrypt.compare(newPassword, hash)) {
      throw AppError.badRequest('The new password is the same as the current one; choose another.', { newPassword: 'must differ from the current password' });
    }
    await userRepository.update(id, { passwordHash: await hashPassword(newPassword), mustChangePassword: false });
    await userRepository.endSessions(id, keepSid);
  },
};

let dummy: Promise<string> | undefined;
const dummyHash = () => (dummy ??= hashPassword('no-such-account'));
