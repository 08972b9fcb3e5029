import type { DemoAccount } from '../src/seed/demo-accounts';

/** Accounts the test identity provider knows but the seed does not provision: first sign-ins. */
export const TEST_ONLY_ACCOUNTS: DemoAccount[] = [
  { id: 'test-newcomer', email: 'newcomer@test.example', name: 'Nell Newcomer', role: 'viewer', password: 'newcomer-test' },
];
