import bcrypt from 'bcryptjs';
import { AppError } from '../errors';
import type { Role } from '../db/models';
import { userRepository } from './repository';

/** bcrypt cost: 10 keeps sign-in near 60 ms on a small server (common practice: 10–12). */
export const BCRYPT_COST = 10;

export const hashPassword = (plain: string) => bcrypt.hash(plain, BCRYPT_COST);

export const userService = {
  list: userRepository.list,

  async create(input: { name: string; email: string; role: Role; password: string; depotId?: number | null }) {
    const passwordHash = await hashPassword(input.password);
    return userRepository.create({ ...input, passwordHash });
  },

  async update(actorId: number, id: number, patch: { name?: string; role?: Role; active?: boolean; depotId?: number | null }) {
    const current = await userRepository.findById(id);
    if (!current) throw AppError.notFound('User');
    const losesManager =
      current.role === 'manager' && current.active && (patch.active === false || (patch.role && patch.role !== 'manager'));
    if (losesManager && (await userRepository.countActiveManagers()) <= 1) {
      throw AppError.conflict('This is the last active manager; make someone else a manager first.', {
        [patch.active === false ? 'active' : 'role']: 'would leave no active manager',
      });
    }
    if (id === actorId && patch.active === false) {
      throw AppError.conflict('You cannot deactivate your own account.', { active: 'is your own account' });
    }
    const updated = await userRepository.update(id, patch);
    if (!updated) throw AppError.notFound('User');
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

  async changePassword(id: number, currentPassword: string, newPassword: string) {
    const hash = await userRepository.findHash(id);
    if (!hash) throw AppError.notFound('User');
    if (!(await bcrypt.compare(currentPassword, hash))) {
      throw AppError.badRequest('The current password is not right.', { currentPassword: 'does not match' });
    }
    await userRepository.update(id, { passwordHash: await hashPassword(newPassword) });
  },
};

let dummy: Promise<string> | undefined;
const dummyHash = () => (dummy ??= hashPassword('no-such-account'));
