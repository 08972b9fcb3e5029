import type { Role } from '@toneledger/common/domain/roles';

/** The signed-in user as the server sees it for one request. */
export interface CurrentUser {
  id: string;
  name: string;
  email: string | null;
  role: Role;
}
