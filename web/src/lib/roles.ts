/** The three roles of Reboundry and how we name them on screen. */
import type { Role, SessionUser } from '@contracts/users';

export { ROLES, type Role } from '@contracts/users';

export const roleLabels: Record<Role, string> = {
  manager: 'Fleet manager',
  mechanic: 'Mechanic',
  driver: 'Driver',
};

/** The signed-in person as the server answers them (server/contracts/users.ts). */
export type SignedInUser = SessionUser;
