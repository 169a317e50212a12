// API tests run against real PostgreSQL; each file clones its own database from a migrated template.
module.exports = require('../../jest.base.js')('api', 'apps/api', {
  testTimeout: 30000,
});
