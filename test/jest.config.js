// One jest run, three projects: pure shared/ computations, Angular component specs, and API tests
// against the real app and a real PostgreSQL (DATABASE_URL is set by test/run.ts).
const path = require('node:path');
const { createCjsPreset } = require('jest-preset-angular/presets');

const rootDir = path.resolve(__dirname, '..');
const serverTransform = {
  '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json', isolatedModules: true }],
};

module.exports = {
  rootDir,
  // Jest reads testTimeout only from the top level (a project's own value is ignored): the default
  // for every test; drills and browser tests raise it in their files with jest.setTimeout.
  testTimeout: 30000,
  projects: [
    {
      displayName: 'unit',
      rootDir,
      testEnvironment: 'node',
      testMatch: ['<rootDir>/test/unit/**/*.test.ts'],
      transform: serverTransform,
    },
    {
      displayName: 'client',
      rootDir,
      ...createCjsPreset({
        tsconfig: '<rootDir>/tsconfig.spec.json',
        testEnvironment: 'jest-preset-angular/environments/jest-jsdom-env',
      }),
      setupFilesAfterEnv: ['<rootDir>/test/setup-client.ts'],
      testMatch: ['<rootDir>/src/**/*.spec.ts'],
    },
    {
      displayName: 'api',
      rootDir,
      testEnvironment: 'node',
      testMatch: ['<rootDir>/test/api/**/*.test.ts'],
      transform: serverTransform,
      testTimeout: 30000,
    },
    {
      displayName: 'drills',
      rootDir,
      testEnvironment: 'node',
      testMatch: ['<rootDir>/test/drills/**/*.test.ts'],
      transform: serverTransform,
      testTimeout: 120000,
    },
    {
      displayName: 'e2e',
      rootDir,
      testEnvironment: 'node',
      testMatch: ['<rootDir>/test/e2e/**/*.e2e.ts'],
      transform: serverTransform,
      testTimeout: 180000,
    },
  ],
};
