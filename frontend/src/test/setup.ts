import { afterEach, vi } from 'vitest';
import { cleanup, configure } from '@testing-library/react';

// findBy… waits up to 4 s (under the 5 s test timeout) instead of 1 s: on a busy 2-core machine the lazy route modules of a
// screen can take longer than a second to load in jsdom. A wait, not an assertion: what is found is
// checked exactly as before.
configure({ asyncUtilTimeout: 4000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});
