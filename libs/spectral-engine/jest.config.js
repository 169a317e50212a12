module.exports = require('../../jest.base.js')('spectral-engine', 'libs/spectral-engine');
