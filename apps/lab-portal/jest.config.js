module.exports = require('../../libs/ui/jest-angular-project')('lab-portal', 'apps/lab-portal');
