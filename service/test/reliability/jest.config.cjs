/**
 * The reliability suite (ops/test.sh runs it as its own suite): loss and doubles across crashes, the bad
 * input corpus, the roles matrix, CSV exports and backup/restore. Same ESM set-up as the API e2e project
 * of ../../jest.config.cjs; its files end in .rel-spec.ts so the e2e project does not run them too.
 *
 *   cd service && NODE_OPTIONS=--experimental-vm-modules npx jest --config test/reliability/jest.config.cjs --runInBand
 */
const base = require('../../jest.config.cjs');

const e2e = base.projects.find((p) => p.displayName === 'e2e');
module.exports = {
  ...e2e,
  displayName: 'reliability',
  testMatch: ['<rootDir>/test/reliability/**/*.rel-spec.ts'],
  testTimeout: 180000,
};
