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
    { ...common, displayName: 'e2e', rootDir: __dirname, testMatch: ['<rootDir>/test/**/*.e2e-spec.ts'], testTimeout: 60000 },
  ],
};
