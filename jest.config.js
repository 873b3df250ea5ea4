// One Jest run for the Angular client (jsdom) and the Express server and engine (node).
const { createCjsPreset } = require('jest-preset-angular/presets');

/** @type {import('jest').Config} */
module.exports = {
  // The client project sets a 30 s per-test timeout in src/test-setup.ts (jest.setTimeout).
  projects: [
    {
      ...createCjsPreset({ tsconfig: '<rootDir>/tsconfig.spec.json' }),
      displayName: 'client',
      roots: ['<rootDir>/src'],
      setupFilesAfterEnv: ['<rootDir>/src/test-setup.ts'],
      // tsconfig.json's path to the contract shared with the server.
      moduleNameMapper: { '^@contract$': '<rootDir>/contract/index.ts' },
    },
    {
      displayName: 'server',
      testEnvironment: 'node',
      roots: ['<rootDir>/server', '<rootDir>/db', '<rootDir>/tools', '<rootDir>/testing'],
      testMatch: ['**/*.spec.ts'],
      transform: {
        '^.+\\.[tj]s$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json' }],
      },
      transformIgnorePatterns: ['/node_modules/(?!(jose)/)'],
      setupFiles: ['reflect-metadata'],
      setupFilesAfterEnv: ['<rootDir>/testing/jest-setup.ts'],
    },
  ],
};
