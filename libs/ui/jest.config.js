module.exports = require('./jest-angular-project')('ui', 'libs/ui');
