module.exports = require('../../jest.base.js')('reference', 'test/reference');
