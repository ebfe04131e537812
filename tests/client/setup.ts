import { cleanup } from '@testing-library/react';
import { afterEach, vi } from 'vitest';
import { api } from '../../client/src/lib/api-client';

// vitest runs without globals here, so Testing Library's automatic cleanup is not registered.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  api.forgetCsrfToken();
});
