import type { UserRole } from './roles';

/**
 * The signed-in person as every page sees it (`locals.user`, layout data `user`).
 * Re-read from the database on each request, so a disabled account loses access at once.
 */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: UserRole;
}
