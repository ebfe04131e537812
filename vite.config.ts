import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const ROOT = fileURLToPath(new URL('.', import.meta.url));
const alias = { '@shared': fileURLToPath(new URL('./shared', import.meta.url)) };

/** The Express server the dev server forwards API and socket traffic to (`PORT`, default 8080). */
const API_ORIGIN = `http://127.0.0.1:${process.env.PORT ?? 8080}`;

export default defineConfig({
  root: fileURLToPath(new URL('./client', import.meta.url)),
  plugins: [react(), tailwindcss()],
  resolve: { alias },
  build: {
    outDir: '../dist/client',
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        // Libraries change far less often than the app: separate chunks stay cached across releases.
        codeSplitting: {
          groups: [
            { name: 'react', test: /node_modules[\\/](react|react-dom|react-router|scheduler)[\\/]/ },
            { name: 'vendor', test: /node_modules[\\/]/ },
          ],
        },
      },
    },
  },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.SSCOPE_DEV_PORT ?? 5173),
    strictPort: true,
    proxy: {
      '/api': API_ORIGIN,
      '/socket.io': { target: API_ORIGIN, ws: true },
    },
  },
  // The test suites (`npm test`, `npx vitest run --project unit`): vitest projects, each rooted at the
  // repository (the client build above is rooted at client/) and without the build's plugins.
  test: {
    // This machine has two cores: two workers (vitest's own default would be one, cores − 1). The
    // projects of the first group share them; the fault project runs alone afterwards.
    maxWorkers: 2,
    projects: [
      {
        root: ROOT,
        resolve: { alias },
        test: {
          name: 'unit',
          environment: 'node',
          maxWorkers: 2,
          include: ['tests/{shared,devices,simulators,architecture}/**/*.test.ts'],
        },
      },
      {
        root: ROOT,
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
        root: ROOT,
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
        root: ROOT,
        resolve: { alias },
        test: {
          name: 'client',
          environment: 'jsdom',
          maxWorkers: 2,
          // A rendered form typed into by user-event takes seconds while the other worker runs a browser or a whole run.
          testTimeout: 20_000,
          include: ['tests/client/**/*.test.{ts,tsx}'],
          setupFiles: ['tests/client/setup.ts'],
        },
      },
      {
        root: ROOT,
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
