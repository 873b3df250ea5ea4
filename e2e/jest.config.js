// End-to-end tests: the built app served by the real server on a fresh, seeded database, driven in
// Debian's chromium through playwright-core. Run by tools/test after the production build.
/** @type {import('jest').Config} */
module.exports = {
  rootDir: '..',
  displayName: 'e2e',
  testEnvironment: 'node',
  roots: ['<rootDir>/e2e'],
  testMatch: ['**/*.e2e.ts'],
  transform: { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json' }] },
  setupFiles: ['reflect-metadata'],
  setupFilesAfterEnv: ['<rootDir>/e2e/support/retry.ts'],
  globalSetup: '<rootDir>/e2e/support/global-setup.ts',
  globalTeardown: '<rootDir>/e2e/support/global-teardown.ts',
  maxWorkers: 1,
  testTimeout: 60_000,
};
