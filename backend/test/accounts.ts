import type { DemoAccount } from '../src/seed/demo-accounts';

/** Accounts the test identity provider knows but the seed does not provision: first sign-ins. */
export const TEST_ONLY_ACCOUNTS: DemoAccount[] = [
  { id: 'test-newcomer', email: 'newcomer@test.example', name: 'Nell Newcomer', role: 'viewer', password: 'newcomer-test' },
  // A viewer on first sign-in; the condition tests then make this person a second conservator.
  { id: 'test-second-conservator', email: 'second-conservator@test.example', name: 'Ansel Threlkeld', role: 'viewer', password: 'second-conservator-test' },
  // Deactivated and reactivated by the users tests (users-deactivate.test.ts).
  { id: 'test-leaver', email: 'leaver@test.example', name: 'Wenna Pascoe', role: 'viewer', password: 'leaver-test' },
];
