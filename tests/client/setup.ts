import { cleanup, configure } from '@testing-library/react';
import { afterEach, vi } from 'vitest';
import { api } from '../../client/src/lib/api-client';

// findBy…/waitFor wait for what the page does, not for a clock: on a busy 2-core machine a form
// with typed input can take seconds to settle, so the bound is generous and a real miss still fails.
configure({ asyncUtilTimeout: 10_000 });

// vitest runs without globals here, so Testing Library's automatic cleanup is not registered.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  api.forgetCsrfToken();
});
