// API tests run against real PostgreSQL; each file clones its own database from a migrated template
// built once per run by the globalSetup (see apps/api/src/testing/). The demo seed's tests run here too.
module.exports = require('../../jest.base.js')('api', 'apps/api', {
  roots: ['<rootDir>', '<rootDir>/../../docker-free-scripts/seed'],
  globalSetup: '<rootDir>/src/testing/global-setup.ts',
  globalTeardown: '<rootDir>/src/testing/global-teardown.ts',
  setupFiles: ['<rootDir>/src/testing/setup-env.ts'],
});
