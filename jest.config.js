// Four suites, one run: `npm test` sets up PostgreSQL and the fakes first (scripts/test.sh).
const alias = { '^@/(.*)$': '<rootDir>/$1' };
// Server code is plain TypeScript for Node: strip the types and turn modules into CommonJS.
// (babel-preset-expo is for the app bundle; its Flow pass rejects `declare` model fields.)
const nodeTransform = {
  '\\.[jt]s$': [
    'babel-jest',
    {
      configFile: false,
      babelrc: false,
      presets: [['@babel/preset-typescript', { allowDeclareFields: true }]],
      plugins: ['@babel/plugin-transform-modules-commonjs'],
    },
  ],
};
const node = {
  testEnvironment: 'node',
  transform: nodeTransform,
  moduleNameMapper: alias,
  setupFiles: ['<rootDir>/tests/support/env.ts'],
};
// The projects that talk to PostgreSQL get a fresh database for the run (made once even when both
// run: Jest runs a global set-up module once); unit and component tests need none.
const withDatabase = {
  globalSetup: '<rootDir>/tests/support/global-setup.js',
  globalTeardown: '<rootDir>/tests/support/global-teardown.js',
};

module.exports = {
  // A cold first router render and a browser start take several seconds on two cores.
  testTimeout: 60_000,
  transform: nodeTransform,
  projects: [
    {
      ...node,
      displayName: 'unit',
      testMatch: ['<rootDir>/tests/server/**/*.test.ts'],
      testPathIgnorePatterns: ['/node_modules/', '<rootDir>/tests/server/api/'],
    },
    {
      ...node,
      ...withDatabase,
      displayName: 'api',
      testMatch: ['<rootDir>/tests/server/api/**/*.test.ts', '<rootDir>/tests/scripts/**/*.test.ts'],
    },
    {
      displayName: 'app',
      preset: 'jest-expo',
      testMatch: ['<rootDir>/tests/app/**/*.test.tsx'],
      moduleNameMapper: alias,
    },
    {
      ...node,
      ...withDatabase,
      displayName: 'e2e',
      testMatch: ['<rootDir>/tests/e2e/**/*.test.ts'],
    },
  ],
};
