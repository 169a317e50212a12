// One runner for the whole repository: each folder with a jest.config.js is a project.
const { existsSync } = require('node:fs');
const { join } = require('node:path');

const candidates = [
  'libs/spectral-engine',
  'libs/contracts',
  'libs/ui',
  'apps/api',
  'apps/client-portal',
  'apps/lab-portal',
  'test/reference',
  'test/browser',
];

module.exports = {
  projects: candidates
    .map((dir) => join(__dirname, dir, 'jest.config.js'))
    .filter((file) => existsSync(file)),
};
