import type { Role } from '@toneledger/common/domain/roles';

/**
 * One invented account per role for the local identity provider. The people and the trust are
 * fictional; the addresses use the reserved .example domain. Development and tests only.
 */
export interface DemoAccount {
  id: string;
  email: string;
  name: string;
  role: Role;
  password: string;
}

export const DEMO_INSTITUTION = 'Calder Reach Photographic Trust';

export const DEMO_ACCOUNTS: DemoAccount[] = [
  { id: 'demo-admin', email: 'admin@calder-reach.example', name: 'Idris Penhallow', role: 'admin', password: 'admin-demo' },
  { id: 'demo-registrar', email: 'registrar@calder-reach.example', name: 'Maren Oakshott', role: 'registrar', password: 'registrar-demo' },
  { id: 'demo-conservator', email: 'conservator@calder-reach.example', name: 'Tamsin Wrey', role: 'conservator', password: 'conservator-demo' },
  { id: 'demo-researcher', email: 'researcher@calder-reach.example', name: 'Osric Halvorsen', role: 'researcher', password: 'researcher-demo' },
  { id: 'demo-viewer', email: 'viewer@calder-reach.example', name: 'Juno Pellow', role: 'viewer', password: 'viewer-demo' },
];
