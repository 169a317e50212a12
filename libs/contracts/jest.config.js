module.exports = require('../../jest.base.js')('contracts', 'libs/contracts');
