/** Jest runs in ESM mode (NestJS 12 is ESM-only): NODE_OPTIONS=--experimental-vm-modules. */
const common = {
  testEnvironment: 'node',
  extensionsToTreatAsEsm: ['.ts'],
  moduleNameMapper: { '^(\\.{1,2}/.*)\\.js$': '$1' },
  transform: { '^.+\\.ts$': ['ts-jest', { useESM: true, tsconfig: '<rootDir>/tsconfig.spec.json' }] },
};
module.exports = {
  projects: [
    {
      ...common,
      displayName: 'unit',
      rootDir: __dirname,
      testMatch: ['<rootDir>/src/**/*.spec.ts'],
      // Image code (the card tracer, d3's blur and contours, the JPEG codec) with Math bound once per module:
      // test/utils/bind-math-transform.cjs says why.
      transform: {
        '^.+\\.ts$': ['<rootDir>/test/utils/bind-math-ts-transform.cjs', common.transform['^.+\\.ts$'][1]],
        '/shared-types/dist/autotrace/.+\\.js$': '<rootDir>/test/utils/bind-math-transform.cjs',
        '/node_modules/(d3-[a-z]+|jpeg-js)/.+\\.m?js$': '<rootDir>/test/utils/bind-math-transform.cjs',
      },
      transformIgnorePatterns: ['/node_modules/(?!(d3-[a-z]+|jpeg-js)/)'],
    },
    {
      ...common,
      displayName: 'e2e',
      rootDir: __dirname,
      testMatch: ['<rootDir>/test/**/*.e2e-spec.ts'],
      testTimeout: 60000,
      setupFiles: ['<rootDir>/test/utils/esm-bridge.setup.ts'],
      // @nestjs/throttler is CommonJS and require()s the ESM-only @nestjs/common, which Jest allows only
      // on Node 24.9+; test/utils/esm-require-bridge.cjs hands it the app's own ES modules instead.
      // The card tracer's route runs the tracer in the test process: Math bound once per module, as in the unit project.
      transform: {
        '^.+\\.ts$': ['<rootDir>/test/utils/bind-math-ts-transform.cjs', common.transform['^.+\\.ts$'][1]],
        '/shared-types/dist/autotrace/.+\\.js$': '<rootDir>/test/utils/bind-math-transform.cjs',
        '/node_modules/(d3-[a-z]+|jpeg-js)/.+\\.m?js$': '<rootDir>/test/utils/bind-math-transform.cjs',
        '/node_modules/@nestjs/throttler/.+\\.js$': '<rootDir>/test/utils/esm-require-bridge.cjs',
      },
      transformIgnorePatterns: ['/node_modules/(?!(@nestjs/throttler|d3-[a-z]+|jpeg-js)/)'],
    },
  ],
};
