import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
};

// Three projects so `npm test` can run the fast ones first and the browser
// tests only after the production build they drive exists.
//
// Vitest's default is one worker fewer than the CPUs, so one on a 2-core
// machine; the API tests spend much of their time waiting (password hashes
// on libuv's threads, PostgreSQL in its own processes), so three run side by
// side (the unit tests too: `npm test` runs both projects at once, and Vitest
// wants them alike), and the browser test files two (each starts its own server on a free
// port with its own data directory: tests/e2e/support/harness.ts). The
// timeouts are guards against a hang, not measures of speed. The unit and API
// files share their worker's modules (isolate: false): each world is its own
// database and app, and re-importing the server for every file was two
// fifths of the run. The unit and API processes hash passwords at scrypt
// N = 2^10 rather than a server's 2^15 (server/lib/passwords.ts, honoured only
// when NODE_ENV is test): some 1 400 sign-ins and accounts, at 70 ms of CPU
// each (160 ms on a busy machine), were half the API run; at 2^10 one takes 2 ms. The browser tests' servers keep the full cost.
const testRunnerEnv = { STARLEDGER_TEST_SCRYPT_N: String(2 ** 10) };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      { resolve: { alias }, test: { name: 'unit', include: ['tests/unit/**/*.test.ts', 'tests/unit/**/*.test.tsx'], environment: 'node', maxWorkers: 3, isolate: false, env: testRunnerEnv } },
      { resolve: { alias }, test: { name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', globalSetup: ['tests/support/test-database.ts'], maxWorkers: 3, testTimeout: 30_000, isolate: false, env: testRunnerEnv } },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/test-database.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          maxWorkers: 2,
          // expect.poll waits for what a page shows after its own timers and requests: up to 15 s on a loaded machine, not the default 1 s.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
});
