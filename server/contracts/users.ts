/** Request bodies of the people endpoints (`/api/users`, the password change), shared with the client's forms. */
import { z } from 'zod';
import { noHiddenChars, utf8Bytes } from './common';

export const ROLES = ['manager', 'mechanic', 'driver'] as const;
export type Role = (typeof ROLES)[number];

/** The roles in the app's words. */
export const ROLE_WORDS: Record<Role, string> = { manager: 'Fleet manager', mechanic: 'Mechanic', driver: 'Driver' };

/** The signed-in person, as the session holds them and `GET /api/auth/me` answers. */
export interface SessionUser {
  id: number;
  name: string;
  email: string;
  role: Role;
  active: boolean;
  /** A fleet manager set the password: until the user chooses their own, the API refuses the rest. */
  mustChangePassword: boolean;
}

/** A person in `GET /api/users`. */
export interface UserListItem extends SessionUser {
  createdAt: string;
}

/**
 * Password rules: at least 10 characters and at most 72 bytes in UTF-8 (bcrypt reads only the first
 * 72 bytes; a longer password would be cut silently, so it is refused). 72 bytes are 72 ASCII
 * characters, fewer with accented letters or other scripts.
 */
export const PASSWORD_MIN_CHARS = 10;
export const PASSWORD_MAX_BYTES = 72;
export const passwordSchema = z
  .string({ message: 'is required' })
  .min(PASSWORD_MIN_CHARS, `must be at least ${PASSWORD_MIN_CHARS} characters`)
  .refine((p) => utf8Bytes(p) <= PASSWORD_MAX_BYTES, {
    message: `must be at most ${PASSWORD_MAX_BYTES} bytes (72 plain letters or digits; accented letters and other scripts take 2–4 bytes each)`,
  });

const personName = z.string({ message: 'is required' }).trim().min(1, 'is required').max(120, 'must be at most 120 characters').refine(...noHiddenChars);
const role = z.enum(ROLES, { message: `must be one of ${ROLES.join(', ')}` });

export const createUserBody = z
  .object({
    name: personName,
    email: z.string({ message: 'is required' }).trim().min(1, 'is required').max(254, 'must be at most 254 characters').pipe(z.email({ message: 'must be an e-mail address' })),
    role,
    password: passwordSchema,
    depotId: z.number().int().positive().nullable().optional(),
  })
  .strict();
export type CreateUserBody = z.infer<typeof createUserBody>;

export const updateUserBody = z
  .object({
    name: personName.optional(),
    role: role.optional(),
    active: z.boolean({ message: 'must be true or false' }).optional(),
    depotId: z.number().int().positive().nullable().optional(),
    /** A manager's password reset; it is temporary and ends the user's sessions. */
    password: passwordSchema.optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, { message: 'give at least one of name, role, active, depotId, password' });
export type UpdateUserBody = z.infer<typeof updateUserBody>;
