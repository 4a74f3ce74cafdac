/** The three roles of Reboundry and how we name them on screen. */
import { ROLE_WORDS, type SessionUser } from '@contracts/users';

export { ROLES, type Role } from '@contracts/users';

/** The roles in the app's words (server/contracts/users.ts). */
export const roleLabels = ROLE_WORDS;

/** The signed-in person as the server answers them (server/contracts/users.ts). */
export type SignedInUser = SessionUser;
