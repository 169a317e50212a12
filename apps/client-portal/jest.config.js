module.exports = require('../../libs/ui/jest-angular-project')('client-portal', 'apps/client-portal');
