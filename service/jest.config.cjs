/** Jest runs in ESM mode (NestJS 12 is ESM-only): NODE_OPTIONS=--experimental-vm-modules. */
const common = {
  testEnvironment: 'node',
  extensionsToTreatAsEsm: ['.ts'],
  moduleNameMapper: { '^(\\.{1,2}/.*)\\.js$': '$1' },
  transform: { '^.+\\.ts$': ['ts-jest', { useESM: true, tsconfig: '<rootDir>/tsconfig.spec.json' }] },
};
module.exports = {
  projects: [
    { ...common, displayName: 'unit', rootDir: __dirname, testMatch: ['<rootDir>/src/**/*.spec.ts'] },
    {
      ...common,
      displayName: 'e2e',
      rootDir: __dirname,
      testMatch: ['<rootDir>/test/**/*.e2e-spec.ts'],
      testTimeout: 60000,
      // @nestjs/throttler is CommonJS and require()s the ESM-only @nestjs/common, which Jest allows only
      // on Node 24.9+; test/utils/esm-require-bridge.cjs hands it the app's own ES modules instead.
      transform: { ...common.transform, '/node_modules/@nestjs/throttler/.+\\.js$': '<rootDir>/test/utils/esm-require-bridge.cjs' },
      transformIgnorePatterns: ['/node_modules/(?!@nestjs/throttler/)'],
    },
  ],
};
