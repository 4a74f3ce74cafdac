/** The three roles of Reboundry and how we name them on screen. */
import type { Role } from '@contracts/users';

export { ROLES, type Role } from '@contracts/users';

export const roleLabels: Record<Role, string> = {
  manager: 'Fleet manager',
  mechanic: 'Mechanic',
  driver: 'Driver',
};

export interface SignedInUser {
  id: number;
  name: string;
  email: string;
  role: Role;
  active: boolean;
  /** A fleet manager set this person's password: they choose their own before using the app. */
  mustChangePassword: boolean;
}
