// Browser journeys: playwright-core drives Debian's chromium against a private stack on port 4310.
module.exports = require('../../jest.base.js')('browser', 'test/browser', {
  globalSetup: '<rootDir>/support/global-setup.ts',
  globalTeardown: '<rootDir>/support/global-teardown.ts',
  setupFilesAfterEnv: ['<rootDir>/support/test-timeout.ts'],
});
