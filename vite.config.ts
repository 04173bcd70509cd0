import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiTarget = `http://localhost:${process.env.PORT ?? 3000}`;

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    port: 5173,
    proxy: {
      '/api': apiTarget,
      '/socket.io': { target: apiTarget, ws: true },
    },
  },
  build: { outDir: 'dist', sourcemap: true },
  test: {
    // Vitest leaves one core free by default, which on a 2-core machine runs every file one after another; many
    // of ours wait on sockets and timers, so two at a time takes about two thirds of the time.
    maxWorkers: 2,
    projects: [
      {
        extends: true,
        test: {
          name: 'node',
          include: ['tests/**/*.test.ts'],
          // The proving suites run by their own scripts (test:security, test:faults, test:scale).
          exclude: ['tests/security/**', 'tests/faults/**', 'tests/scale/**', '**/node_modules/**'],
          environment: 'node',
          // Files share their worker's module cache instead of importing everything again (147 s to 68 s here):
          // a test file must leave no global behind (fake timers, stubbed globals, a replaced socket factory).
          isolate: false,
          globals: true,
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          include: ['tests/**/*.test.tsx'],
          environment: 'jsdom',
          isolate: false,
          globals: true,
          setupFiles: ['tests/setup-dom.ts'],
          // userEvent typing in jsdom can pass 5 s on a loaded 2-core machine; this is not a speed test.
          testTimeout: 20_000,
        },
      },
      // npm run test:security: fuzzing every route and socket event, the role matrix, attacks (tests/security).
      {
        extends: true,
        test: {
          name: 'security',
          include: ['tests/security/**/*.test.ts'],
          environment: 'node',
          globals: true,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      // npm run test:faults: killed servers, offline stations, busy and full disks (tests/faults).
      {
        extends: true,
        test: {
          name: 'faults',
          include: ['tests/faults/**/*.test.ts'],
          environment: 'node',
          globals: true,
          testTimeout: 120_000,
          hookTimeout: 60_000,
        },
      },
      // npm run test:scale: PostgreSQL and Redis, several processes (tests/scale; needs DATABASE_URL and REDIS_URL).
      {
        extends: true,
        test: {
          name: 'scale',
          include: ['tests/scale/**/*.test.ts'],
          environment: 'node',
          globals: true,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
