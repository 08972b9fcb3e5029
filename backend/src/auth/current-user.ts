import type { Role } from '@toneledger/common/domain/roles';

/** The signed-in user as the server sees it for one request. */
export interface CurrentUser {
  id: string;
  name: string;
  email: string | null;
  role: Role;
}

/** What the server reads of the signed-in user on each request (with the session, in one query). */
export interface SignedInUser extends CurrentUser {
  createdAt: Date;
  lastSignInAt: Date | null;
}
