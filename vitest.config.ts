import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const alias = { '@shared': fileURLToPath(new URL('./shared', import.meta.url)) };

export default defineConfig({
  resolve: { alias },
  test: {
    // This machine has two cores: two workers (vitest's own default would be one, cores − 1). The
    // projects of the first group share them; the fault project runs alone afterwards.
    maxWorkers: 2,
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          environment: 'node',
          maxWorkers: 2,
          include: ['tests/{shared,devices,simulators,architecture}/**/*.test.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          environment: 'node',
          // Files run in parallel: each has its own database (cloned from the run's template), its own
          // ports, simulator folder and mail catcher, and its own process (so the process-wide mailer too).
          include: ['tests/{server,integration}/**/*.test.ts'],
          exclude: ['tests/integration/fault-*.test.ts'],
          globalSetup: ['tests/support/global-mariadb.ts'],
          maxWorkers: 2,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'faults',
          environment: 'node',
          // Killed servers, a stopped database (its own instance), a vanished port: after everything else,
          // so the bounds they measure (an alarm within 2 s) are not measured beside browsers and whole
          // runs; two at a time, since the database outage is mostly a 60 s wait.
          include: ['tests/integration/fault-*.test.ts'],
          globalSetup: ['tests/support/global-mariadb.ts'],
          maxWorkers: 2,
          sequence: { groupOrder: 1 },
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        plugins: [react()],
        resolve: { alias },
        test: {
          name: 'client',
          environment: 'jsdom',
          maxWorkers: 2,
          include: ['tests/client/**/*.test.{ts,tsx}'],
          setupFiles: ['tests/client/setup.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/support/global-mariadb.ts'],
          maxWorkers: 2,
          testTimeout: 180_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
